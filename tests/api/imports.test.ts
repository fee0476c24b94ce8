import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parse } from 'csv-parse/sync';
import { signIn, testApp, type TestApp, type Session } from '../helpers/app';
import { buildDesign, buildJob, buildPiece, buildPlantWithUsers, PASSWORD } from '../helpers/factories';

// The bad inputs of the team's reliability notes (C.4), each through the real upload endpoint.
let t: TestApp;
let plant: Awaited<ReturnType<typeof buildPlantWithUsers>>;
let eng: Session;
let jobNumber: string;
let designCode: string;
let pieceIds: string[];
beforeAll(async () => {
  t = await testApp();
  plant = await buildPlantWithUsers(t.ds);
  eng = await signIn(t.app, plant.users.engineer.email, PASSWORD);
  const job = await buildJob(t.ds, plant.plantId);
  jobNumber = job.number;
  const design = await buildDesign(t.ds, plant.plantId, 'DT28-60');
  designCode = (await t.ds.query(`SELECT code FROM member_design WHERE id = $1`, [design.id]))[0].code;
  pieceIds = [];
  for (const m of ['IM-1', 'IM-2', 'IM-3']) pieceIds.push((await buildPiece(t.ds, plant.plantId, { mark: m, jobId: job.id, designId: design.id })).id);
});
afterAll(() => t.close());

let n = 0;
/** Each test's file differs (a trailing comment column value), so the same-file check does not mix tests. */
const upload = (body: Buffer | string, kind = 'readings', delimiter?: string) => {
  const req = eng.agent.post('/api/imports').set('X-CSRF-Token', eng.csrf).field('kind', kind);
  if (delimiter) req.field('delimiter', delimiter);
  return req.attach('file', Buffer.isBuffer(body) ? body : Buffer.from(body, 'utf8'), `file-${n++}.csv`);
};
const readingsCount = async (): Promise<number> => Number((await t.ds.query(`SELECT count(*) FROM reading WHERE piece_id = ANY($1::uuid[])`, [pieceIds]))[0].count);
const commit = (id: string, mapping: Record<string, string | null>, allOrNothing = false) => eng.agent.post(`/api/imports/${id}/commit`).set('X-CSRF-Token', eng.csrf).send({ mapping, allOrNothing });
const uniq = (): string => `${Date.now()}-${Math.random().toString(36).slice(2)}`;

describe('POST /api/imports — refused files add nothing and say why', () => {
  it.each([
    ['Windows-1252 bytes (é, °, ½)', Buffer.from([...Buffer.from('mark,date,camber,note\nIM-1,2026-11-02 07:00,1 1/2,'), 0xbd, 0xb0, 0xe9, 0x0a]), /not UTF-8/],
    ['a semicolon file read with commas', 'mark;date;camber\nIM-1;2026-11-02 07:00;1,5\n', /semicolon/],
    ['a duplicate header', 'mark,mark,date,camber\nIM-1,IM-1,2026-11-02 07:00,1\n', /names "mark" twice/],
    ['a header only', 'mark,date,camber\n', /no data rows/],
    ['an empty file', '', /empty/],
    ['an unbalanced quote', 'mark,date,camber\nIM-1,"2026-11-02 07:00,1\n', /quote/],
    ['a stray quote mid-field', 'mark,date,camber\nIM-1,2026-11-02 07:00,1 "3/8\n', /line 2/],
    ['a 5,000-character field', `mark,date,camber\nIM-1,2026-11-02 07:00,${'9'.repeat(5000)}\n`, /too long/],
    ['a line with 10,000 columns', `${Array.from({ length: 10_000 }, (_, i) => `c${i}`).join(',')}\n`, /too long|columns/],
    ['a NUL byte in a cell', Buffer.from('mark,date,camber\nIM-1,2026-11-02 07:00,1\u0000\n'), /NUL/],
    ['one row with a column too many', 'mark,date,camber\nIM-1,2026-11-02 07:00,1\nIM-2,2026-11-02 07:00,1,extra\n', /line 3.*different number of columns/],
    ['a PNG renamed .csv', Buffer.from('89504e470d0a1a0a0000000d49484452', 'hex'), /NUL|UTF-8/],
  ])('%s', async (_name, body, message) => {
    const before = await readingsCount();
    const started = Date.now();
    const res = await upload(body as Buffer | string);
    expect(res.status).toBe(422);
    expect(res.body.code).toBe('csv_rejected');
    expect(res.body.message).toMatch(message as RegExp);
    expect(Date.now() - started).toBeLessThan(5000);
    expect(await readingsCount()).toBe(before);
  });
});

describe('CSV imports — accepted files', () => {
  it('when the file has a BOM, CRLF or CR-only line ends and blank lines, then the same rows are read', async () => {
    const tag = uniq();
    const rows = ['Mark,Taken at,Camber,Note', `IM-1,2026-11-02 07:00,1 3/8,${tag}`];
    for (const [bom, eol] of [['\ufeff', '\r\n'], ['', '\r'], ['', '\n']] as const) {
      const res = await upload(`${bom}${rows.join(eol)}${eol}${eol}${eol} ${eol}`.replace(`${eol} ${eol}`, eol) + `${'#'.repeat(eol.length ? 0 : 0)}`);
      expect(res.status).toBe(201);
      expect(res.body.proposedMapping).toMatchObject({ mark: 'Mark', takenAt: 'Taken at', value: 'Camber', note: 'Note' });
      const preview = await eng.agent.post(`/api/imports/${res.body.id}/preview`).set('X-CSRF-Token', eng.csrf).send({ mapping: res.body.proposedMapping });
      expect(preview.body).toMatchObject({ total: 1, valid: 1, invalid: 0 });
      expect(Number(preview.body.rows[0].values.valueMm)).toBeCloseTo(34.925, 6);
    }
  });

  it('when some rows are bad, then the good ones land, the bad ones are refused with line and column, and can be downloaded', async () => {
    const tag = uniq();
    const csv = [
      'mark,date,camber,note',
      `IM-1,2026-11-03 07:00,3 5/16,${tag} ok 1`,
      `IM-1,2026-11-04 07:00,"-1/4""",${tag} ok 2`,
      `IM-2,2026-11-03 07:00,−1/4,${tag} ok 3`,
      `IM-2,2026-11-04 07:00,"0'-1 5/16""",${tag} ok 4`,
      `IM-3,2026-11-03 07:00,1/0,${tag} bad value`,
      `IM-3,2026-11-04 07:00,3/7,${tag} bad value`,
      `IM-3,2026-11-05 07:00,abc,${tag} bad value`,
      `IM-3,2026-11-06 07:00,1e400,${tag} bad value`,
      `IM-3,03/04/2026,1,${tag} ambiguous date`,
      `IM-3,2026-03-08 02:30,1,${tag} in the DST gap`,
      `IM-3,2099-01-01 07:00,1,${tag} future`,
      `NOPE-9,2026-11-03 07:00,1,${tag} unknown mark`,
      `IM-1,2026-11-03 07:00,3 5/16,${tag} duplicate of line 2`,
      `IM-3,2026-11-07 07:00,1,=1+1 ${tag}`,
    ].join('\n');
    const up = await upload(csv);
    expect(up.status).toBe(201);
    const before = await readingsCount();
    const res = await commit(up.body.id, { ...up.body.proposedMapping, takenAt: 'date', value: 'camber' });
    expect(res.status).toBe(200);
    expect(res.body.result).toEqual({ total: 14, added: 5, duplicates: 0, rejected: 9 });
    expect(await readingsCount()).toBe(before + 5);
    const stored = await t.ds.query(`SELECT entered_text, value_mm, note FROM reading WHERE note LIKE $1 ORDER BY note`, [`%${tag}%`]);
    expect(stored.map((r: { entered_text: string }) => r.entered_text)).toContain(`0'-1 5/16"`);
    expect(stored.find((r: { note: string }) => r.note.startsWith('=1+1')).note).toBe(`=1+1 ${tag}`); // data is stored verbatim
    const refused = await eng.agent.get(`/api/imports/${up.body.id}/refused.csv`);
    expect(refused.headers['content-type']).toBe('text/csv; charset=utf-8');
    const rows = parse(refused.text, { columns: true }) as Array<Record<string, string>>;
    expect(rows).toHaveLength(9);
    const reasons = rows.map((r) => r.error!).join('\n');
    expect(reasons).toMatch(/line 6, camber: .*not \/0/);
    expect(reasons).toMatch(/line 7, camber: .*not \/7/);
    expect(reasons).toMatch(/line 10, date: .*YYYY-MM-DD HH:mm/);
    expect(reasons).toMatch(/line 11, date: .*does not exist in America\/Chicago/);
    expect(reasons).toMatch(/line 12, date: .*future/);
    expect(reasons).toMatch(/line 13, mark: no piece "NOPE-9"/);
    expect(reasons).toMatch(/line 14, mark: the same piece and time as line 2/);
  });

  it('when "all or nothing" is chosen and a row is bad, then nothing lands', async () => {
    const tag = uniq();
    const up = await upload(`mark,date,camber,note\nIM-1,2026-11-08 07:00,1,${tag}\nIM-1,2026-11-09 07:00,abc,${tag}\n`);
    const before = await readingsCount();
    const res = await commit(up.body.id, up.body.proposedMapping, true);
    expect(res.body.status).toBe('rejected');
    expect(res.body.result).toMatchObject({ added: 0, rejected: 1 });
    expect(await readingsCount()).toBe(before);
  });

  it('when a required column is missing, then the commit names it, and extra columns are listed as ignored', async () => {
    const up = await upload(`mark,camber,operator\nIM-1,1,${uniq()}\n`);
    expect(up.body.ignoredColumns).toEqual(['operator']);
    const res = await commit(up.body.id, up.body.proposedMapping);
    expect(res.status).toBe(400);
    expect(res.body.message).toMatch(/Taken at/);
  });

  it('when the same file comes again, then the first import answers and nothing is added', async () => {
    const csv = `mark,date,camber,note\nIM-2,2026-11-10 07:00,1 1/8,${uniq()}\n`;
    const up = await upload(csv);
    await commit(up.body.id, up.body.proposedMapping);
    const count = await readingsCount();
    const again = await upload(csv);
    expect(again.status).toBe(200);
    expect(again.body).toMatchObject({ id: up.body.id, repeated: true, status: 'committed', result: { added: 1 } });
    const recommit = await commit(up.body.id, up.body.proposedMapping);
    expect(recommit.body.result.added).toBe(1);
    expect(await readingsCount()).toBe(count);
  });

  it('when a reading is already in the database, then it counts as a duplicate and is not stored twice', async () => {
    const row = `IM-3,2026-11-11 07:00,1 1/4`;
    const a = await upload(`mark,date,camber,note\n${row},${uniq()}\n`);
    await commit(a.body.id, a.body.proposedMapping);
    const b = await upload(`mark,date,camber,note\n${row},${uniq()}\n`);
    const res = await commit(b.body.id, b.body.proposedMapping);
    expect(res.body.result).toMatchObject({ added: 0, duplicates: 1 });
  });

  it('imports a piece schedule, and the same marks again add nothing', async () => {
    const csv = `mark,job,design,cast date,ship date,bay,position\nPS-1,${jobNumber},${designCode},2026-11-01,2026-12-20,Bay Z,1\nPS-2,${jobNumber},${designCode},2026-11-02,2026-12-20,Bay Z,2\nPS-3,J-NONE,${designCode},2026-11-02,,,\n`;
    const up = await upload(csv, 'pieces');
    expect(up.status).toBe(201);
    const res = await commit(up.body.id, up.body.proposedMapping);
    expect(res.body.result).toEqual({ total: 3, added: 2, duplicates: 0, rejected: 1 });
    const up2 = await upload(`${csv}\n`, 'pieces');
    const res2 = await commit(up2.body.id, up2.body.proposedMapping);
    expect(res2.body.result).toMatchObject({ added: 0, duplicates: 2 });
  });

  it('imports 100,000 readings in one transaction, and the same file again adds nothing', async () => {
    const lines = ['mark,date,camber'];
    const start = Date.UTC(2026, 0, 1, 13, 0);
    for (let i = 0; i < 100_000; i++) {
      const at = new Date(start + Math.floor(i / 3) * 60_000).toISOString().replace('T', ' ').slice(0, 16);
      lines.push(`IM-${(i % 3) + 1},${at},${1 + (i % 16) / 16}`);
    }
    const csv = `${lines.join('\n')}\n`;
    const before = await readingsCount();
    const up = await upload(csv);
    expect(up.status).toBe(201);
    const res = await commit(up.body.id, up.body.proposedMapping);
    expect(res.body.result).toMatchObject({ total: 100_000, added: 100_000, rejected: 0 });
    expect(await readingsCount()).toBe(before + 100_000);
    const audits = await t.ds.query(`SELECT count(*)::int AS n FROM audit_event WHERE entity = 'csv_import' AND entity_id = $1`, [up.body.id]);
    expect(audits).toEqual([{ n: 1 }]);
    const again = await upload(csv);
    expect(again.body.repeated).toBe(true);
    expect(await readingsCount()).toBe(before + 100_000);
  }, 120_000);
});

describe('CSV exports', () => {
  it('text cells that start with = + - @ tab or CR come back neutralised; negative numbers stay numbers', async () => {
    const triggers = ['=1+1', '+1', '-cmd', '@SUM(A1)', '\t=1', '\r=1'];
    for (const [i, note] of triggers.entries()) {
      await t.ds.query(
        `INSERT INTO reading (plant_id, piece_id, taken_at, value_mm, entered_text, entered_unit, method, support, note, taken_by, idempotency_key, request_hash)
         VALUES ($1, $2, $3, -3.175, '-1/8', 'in', 'level', 'bed', $4, $5, $6, 'x')`,
        [plant.plantId, pieceIds[2], new Date(Date.UTC(2025, 0, 1, i)).toISOString(), note, plant.users.inspector.id, `exp-${i}-${uniq()}`],
      );
    }
    const res = await eng.agent.get('/api/exports/readings.csv');
    expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(res.headers['content-disposition']).toBe('attachment; filename="readings.csv"');
    expect(res.headers['cache-control']).toBe('no-store');
    const rows = parse(res.text, { columns: true }) as Array<Record<string, string>>;
    for (const note of triggers) expect(rows.some((r) => r.note === `'${note}`)).toBe(true);
    const negative = rows.find((r) => r.as_entered === "'-1/8")!;
    expect(negative.camber_mm).toBe('-3.175');
    expect(res.text).toMatch(/,-3\.175,/); // an unquoted, unprefixed number
  });
});
