// The piece camber report for the shipping file, as a PDF (pdfkit). DejaVu Sans is embedded so that
// fractions and symbols (⅜ ″ ± −) print as they are; pdfkit's built-in fonts are WinAnsi only.
import { createRequire } from 'node:module';
import PDFDocument from 'pdfkit';
import { DECISION_LABELS } from '#shared/api/review';
import { READING_METHOD_LABELS, SKY_LABELS, SUPPORT_LABELS } from '#shared/api/readings';
import { CAUTION } from '#shared/camber/schema';
import { prettyLength, prettySigned, prettyTolerance } from '#shared/camber/pretty';
import { FLAG_LABELS } from '#shared/projection/project';
import { dateFormat } from '#shared/time/formatters';
import type { PieceReportData } from './report.data';

const require = createRequire(import.meta.url);
const FONT = require.resolve('dejavu-fonts-ttf/ttf/DejaVuSans.ttf');
const FONT_BOLD = require.resolve('dejavu-fonts-ttf/ttf/DejaVuSans-Bold.ttf');

const INK = '#15191d';
const GREY = '#6b6962';
const ACCENT = '#8a2e08';
const BAD = '#a3171b';

const DATE_TIME: Intl.DateTimeFormatOptions = { dateStyle: 'medium', timeStyle: 'short' };
const when = (iso: string, tz: string): string => dateFormat('en-US', DATE_TIME, tz).format(new Date(iso));

export function newReportDocument(): PDFKit.PDFDocument {
  const doc = new PDFDocument({ size: 'LETTER', margin: 48, info: { Title: 'Piece camber report', Creator: 'Crownwatch' } });
  doc.registerFont('body', FONT);
  doc.registerFont('bold', FONT_BOLD);
  doc.font('body').fontSize(10).fillColor(INK);
  return doc;
}

function heading(doc: PDFKit.PDFDocument, text: string): void {
  doc.moveDown(0.6).font('bold').fontSize(12).fillColor(INK).text(text).font('body').fontSize(10).moveDown(0.2);
}

function pairs(doc: PDFKit.PDFDocument, rows: Array<[string, string]>): void {
  const x = doc.page.margins.left;
  for (const [k, v] of rows) {
    const y = doc.y;
    doc.fillColor(GREY).text(k, x, y, { width: 150 });
    doc.fillColor(INK).text(v, x + 155, y, { width: doc.page.width - x - 155 - doc.page.margins.right });
    doc.moveDown(0.15);
  }
  doc.x = x;
}

/** Camber against age, drawn as vectors: band, predicted, projection, tolerance limits, readings. */
function chart(doc: PDFKit.PDFDocument, r: PieceReportData): void {
  const p = r.projection.projection;
  if (!p || p.curve.length < 2) {
    doc.fillColor(GREY).text('No projection has been computed for this piece yet.').fillColor(INK);
    return;
  }
  const k = r.unit === 'in' ? 1 / 25.4 : 1;
  const x0 = doc.page.margins.left + 40;
  const w = doc.page.width - doc.page.margins.right - x0;
  const h = 170;
  if (doc.y + h + 40 > doc.page.height - doc.page.margins.bottom) doc.addPage();
  const y0 = doc.y + 5;
  const cast = Date.parse(`${r.detail.piece.castDate}T00:00:00Z`);
  const readings = r.detail.readings.filter((x) => !x.supersededBy).map((x) => ({ age: (Date.parse(x.takenAt) - cast) / 86_400_000, v: x.valueMm * k, sun: x.likelyDistorted }));
  const ages = p.curve.map((c) => c.ageDays).concat(readings.map((x) => x.age));
  const vals = p.curve.flatMap((c) => [c.toleranceLowMm * k, c.toleranceHighMm * k]).concat(readings.map((x) => x.v));
  const [amin, amax] = [Math.min(...ages), Math.max(...ages)];
  const [vmin, vmax] = [Math.min(...vals), Math.max(...vals)];
  const X = (a: number): number => x0 + ((a - amin) / (amax - amin || 1)) * w;
  const Y = (v: number): number => y0 + h - ((v - vmin) / (vmax - vmin || 1)) * h;
  doc.save().lineWidth(0.5).strokeColor(GREY).rect(x0, y0, w, h).stroke();
  doc.fontSize(7).fillColor(GREY);
  for (let i = 0; i <= 4; i++) {
    const v = vmin + ((vmax - vmin) * i) / 4;
    doc.text(prettyLength(v / k, r.unit), x0 - 40, Y(v) - 3, { width: 36, align: 'right' });
    const a = amin + ((amax - amin) * i) / 4;
    doc.text(`${Math.round(a)} d`, X(a) - 15, y0 + h + 3, { width: 30, align: 'center' });
  }
  const band = [...p.curve.map((c) => [X(c.ageDays), Y(c.highMm * k)] as const), ...[...p.curve].reverse().map((c) => [X(c.ageDays), Y(c.lowMm * k)] as const)];
  doc.polygon(...band.map(([a, b]) => [a, b] as [number, number])).fillOpacity(0.25).fill('#b4b1a9').fillOpacity(1);
  const curve = p.curve;
  const line = (f: (c: (typeof curve)[number]) => number, color: string, dash?: number): void => {
    doc.moveTo(X(curve[0]!.ageDays), Y(f(curve[0]!) * k));
    for (const c of curve.slice(1)) doc.lineTo(X(c.ageDays), Y(f(c) * k));
    if (dash) doc.dash(dash, { space: dash });
    doc.lineWidth(1.2).strokeColor(color).stroke().undash();
  };
  line((c) => c.toleranceHighMm, BAD, 2);
  line((c) => c.toleranceLowMm, BAD, 2);
  line((c) => c.camberMm, INK);
  line((c) => c.calibratedMm, ACCENT, 4);
  for (const rd of readings) {
    if (rd.sun) doc.polygon([X(rd.age), Y(rd.v) - 3.5], [X(rd.age) - 3, Y(rd.v) + 2.5], [X(rd.age) + 3, Y(rd.v) + 2.5]).lineWidth(0.8).strokeColor(INK).stroke();
    else doc.circle(X(rd.age), Y(rd.v), 2.5).fill(INK);
  }
  doc.restore();
  doc.y = y0 + h + 16;
  doc.x = doc.page.margins.left;
  doc.fontSize(8).fillColor(GREY).text('Grey band: expected band. Solid line: predicted. Dashed brown: projected from the readings. Dotted red: tolerance limits. Dots: readings; triangles: taken in afternoon sun (left out of the projection).').fontSize(10).fillColor(INK);
}

function table(doc: PDFKit.PDFDocument, head: string[], rows: string[][], widths: number[]): void {
  const x0 = doc.page.margins.left;
  const draw = (cells: string[], bold: boolean): void => {
    const heights = cells.map((c, i) => doc.font(bold ? 'bold' : 'body').fontSize(8).heightOfString(c, { width: widths[i]! - 4 }));
    const hgt = Math.max(...heights) + 4;
    if (doc.y + hgt > doc.page.height - doc.page.margins.bottom) doc.addPage();
    const y = doc.y;
    let x = x0;
    cells.forEach((c, i) => {
      doc.text(c, x + 2, y + 2, { width: widths[i]! - 4 });
      x += widths[i]!;
    });
    doc.moveTo(x0, y + hgt).lineTo(x, y + hgt).lineWidth(0.3).strokeColor('#d4d2cc').stroke();
    doc.y = y + hgt;
  };
  draw(head, true);
  for (const r of rows) draw(r, false);
  doc.font('body').fontSize(10);
  doc.x = x0;
}

/** Writes the report of one piece into `doc` (a new page is added by the caller for further pieces). */
export function writePieceReport(doc: PDFKit.PDFDocument, r: PieceReportData): void {
  const { piece, design, readings, decisions } = r.detail;
  const u = r.unit;
  const p = r.projection.projection;
  doc.font('bold').fontSize(16).text(`Piece camber report — ${piece.mark}`).font('body').fontSize(10);
  doc.fillColor(GREY).text(`${r.plantName} · job ${piece.jobNumber} · printed ${when(new Date().toISOString(), r.timeZone)}`).fillColor(INK);
  heading(doc, 'Design');
  const spec = design.spec as { length?: number; units?: string; method?: string };
  pairs(doc, [
    ['Design', `${design.code} (version ${design.version}) — ${design.name}`],
    ['Product', design.productType.replace('-', ' ')],
    ['Length', `${spec.length ?? '—'} ${spec.units === 'si' ? 'm' : 'ft'}`],
    ['Bed · cast · released', `${piece.bed ?? '—'} · ${piece.castDate} · ${piece.releaseDate}`],
    ['Ship · erection', `${piece.shipDate ?? '—'} · ${piece.erectionDate ?? '—'}${piece.bay ? ` · ${piece.bay}, position ${piece.bayPosition}` : ''}`],
  ]);
  heading(doc, 'Projection');
  if (p) {
    pairs(doc, [
      ['At erection', p.atErection ? `${prettyLength(p.atErection.mm, u)} (${prettyLength(p.atErection.lowMm, u)} to ${prettyLength(p.atErection.highMm, u)})` : '—'],
      ['At ship date', p.atShip ? `${prettyLength(p.atShip.mm, u)} (${prettyLength(p.atShip.lowMm, u)} to ${prettyLength(p.atShip.highMm, u)})` : '—'],
      ['Tolerance on design camber', prettyTolerance(p.toleranceMm, u)],
      ['Calibration', `growth factor ${p.growthFactor.toFixed(2)} ± ${p.growthFactorSd.toFixed(2)} (${p.note})`],
    ]);
  }
  chart(doc, r);
  heading(doc, 'Flags');
  if (r.projection.flags.length === 0) doc.text('None.');
  for (const f of r.projection.flags) doc.text(`• ${FLAG_LABELS[f.kind]}: ${f.reason}`);
  heading(doc, 'Readings');
  const curve = p?.curve ?? [];
  const cast = Date.parse(`${piece.castDate}T00:00:00Z`);
  const expectedAt = (iso: string): number | null => {
    if (curve.length === 0) return null;
    const age = (Date.parse(iso) - cast) / 86_400_000;
    const c = curve.reduce((a, b) => (Math.abs(b.ageDays - age) < Math.abs(a.ageDays - age) ? b : a));
    return c.camberMm;
  };
  table(
    doc,
    ['Taken', 'Camber', 'As entered', 'vs predicted', 'Method', 'Supports', 'Sky', 'By', 'Note'],
    readings.map((x) => {
      const e = expectedAt(x.takenAt);
      return [
        when(x.takenAt, r.timeZone),
        `${prettyLength(x.valueMm, u)}${x.supersededBy ? ' (corrected)' : ''}`,
        x.enteredText,
        e === null ? '—' : prettySigned(x.valueMm - e, u),
        READING_METHOD_LABELS[x.method as keyof typeof READING_METHOD_LABELS] ?? x.method,
        SUPPORT_LABELS[x.support as keyof typeof SUPPORT_LABELS] ?? x.support,
        `${x.sky ? (SKY_LABELS[x.sky as keyof typeof SKY_LABELS] ?? x.sky) : '—'}${x.airTempC === null ? '' : `, ${x.airTempC.toFixed(0)} °C`}`,
        x.takenBy,
        [x.correctionReason ? `Correction: ${x.correctionReason}` : '', x.note ?? ''].filter(Boolean).join(' '),
      ];
    }),
    [78, 52, 48, 50, 56, 50, 58, 60, 64],
  );
  heading(doc, 'Decisions');
  if (decisions.length === 0) doc.text('None.');
  for (const x of decisions) doc.text(`• ${DECISION_LABELS[x.kind as keyof typeof DECISION_LABELS] ?? x.kind} — ${x.decidedBy}, ${when(x.decidedAt, r.timeZone)}${x.comment ? `: ${x.comment}` : ''}`);
  heading(doc, 'Method and sources');
  for (const s of r.sources) doc.text(`• ${s}`);
  doc.moveDown(0.8).fillColor(BAD).font('bold').text(CAUTION).font('body').fillColor(INK);
}

/** The whole PDF into a buffer. */
export function renderPdf(write: (doc: PDFKit.PDFDocument) => void): Promise<Buffer> {
  const doc = newReportDocument();
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  write(doc);
  doc.end();
  return done;
}
