import { bayQuerySchema } from '#shared/api/bays';
import { idParamSchema } from '#shared/api/common';
import { ROLES } from '#shared/api/roles';
import { prettyLength } from '#shared/camber/pretty';
import { bayDetail } from '../bays/bays.service';
import type { Deps } from '../deps';
import { defineRoute, type RouteDef } from '../http/route';
import { renderPdf, writePieceReport } from './piece-report.pdf';
import { pieceReportData } from './report.data';

const safeName = (s: string): string => s.replace(/[^A-Za-z0-9._-]+/g, '_');

export function reportRoutes(d: Deps): RouteDef[] {
  return [
    defineRoute({
      method: 'get', path: '/reports/pieces/:id', summary: 'Piece camber report (PDF)', roles: ROLES, resource: 'piece', params: idParamSchema, raw: true,
      handler: async ({ res, user, params }) => {
        const data = await pieceReportData(d, user, params.id);
        const pdf = await renderPdf((doc) => writePieceReport(doc, data));
        res.set('Content-Type', 'application/pdf').set('Content-Disposition', `inline; filename="camber-${safeName(data.detail.piece.mark)}.pdf"`).send(pdf);
      },
    }),
    defineRoute({
      method: 'get', path: '/reports/bay', summary: 'Camber report of a whole bay (PDF)', roles: ROLES, query: bayQuerySchema, raw: true,
      handler: async ({ res, user, query }) => {
        const bay = await bayDetail(d, user, query.jobId, query.bay);
        const pieces = await Promise.all(bay.current.map((p) => pieceReportData(d, user, p.id)));
        const unit = user.unitSystem === 'si' ? 'mm' : 'in';
        const pdf = await renderPdf((doc) => {
          doc.font('bold').fontSize(16).text(`Bay camber report — job ${bay.jobNumber}, ${bay.bay}`).font('body').fontSize(10);
          doc.text(`Differential tolerance between neighbours: ${prettyLength(bay.toleranceMm, unit)}`).moveDown(0.5);
          bay.current.forEach((p, i) => {
            const diff = i > 0 ? ` · difference to the previous ${prettyLength(bay.currentDifferencesMm[i - 1]!, unit)}` : '';
            doc.text(`Position ${p.position ?? i + 1}: ${p.mark} — projected at erection ${prettyLength(p.camberMm, unit)}${diff}`);
          });
          for (const data of pieces) {
            doc.addPage();
            writePieceReport(doc, data);
          }
        });
        res.set('Content-Type', 'application/pdf').set('Content-Disposition', `inline; filename="bay-${safeName(bay.jobNumber)}-${safeName(bay.bay)}.pdf"`).send(pdf);
      },
    }),
  ];
}
