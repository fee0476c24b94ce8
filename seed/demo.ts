import type { DataSource } from 'typeorm';
import { predictParsed } from '#shared/camber/predict';
import { predictInputSchema } from '#shared/camber/schema';
import { formatSixteenths, parseTape } from '#shared/camber/tape';
import { DEFAULT_READING_AGES } from '#shared/yard/schedule';
import { hashPassword } from '#server/auth/password';
import { DEMO_DESIGNS, DEMO_JOBS, DEMO_PASSWORD, DEMO_PLANT, DEMO_USERS } from './designs';
import { seeded } from './random';

const DAY = 86_400_000;
const isoDate = (d: Date): string => d.toISOString().slice(0, 10);

interface PiecePlan { design: string; job: string; count: number; prefix: string; start: number }
const PLAN: PiecePlan[] = [
  { design: 'DT28-60', job: 'J-2611', count: 34, prefix: 'DT-', start: 101 },
  { design: 'IT36-30', job: 'J-2611', count: 16, prefix: 'IT-', start: 301 },
  { design: 'HC8-30', job: 'J-2614', count: 36, prefix: 'HC-', start: 201 },
  { design: 'HC8-30', job: 'J-2618', count: 18, prefix: 'HC-', start: 501 },
  { design: 'DT28-60', job: 'J-2618', count: 16, prefix: 'DT-', start: 601 },
  { design: 'BG54-110', job: 'J-2620', count: 30, prefix: 'G-', start: 401 },
];
/** Every 17th piece creeps far more than its design predicts: the drifting pieces of the scenario. */
export const isDriftingIndex = (i: number): boolean => i % 17 === 5;

/**
 * Loads the demo scenario once: an invented plant with 150 pieces cast over the last four months and
 * their readings. Running it again changes nothing (the plant's code is the key).
 */
export async function seedDemo(ds: DataSource, opts: { now?: Date; bcryptCost?: number } = {}): Promise<{ created: boolean }> {
  const now = opts.now ?? new Date();
  const existing: unknown[] = await ds.query(`SELECT 1 FROM plant WHERE code = $1`, [DEMO_PLANT.code]);
  if (existing.length) return { created: false };
  const rnd = seeded(2611);
  const hash = await hashPassword(DEMO_PASSWORD, opts.bcryptCost ?? 11);

  await ds.transaction(async (tx) => {
    const [plant] = await tx.query(`INSERT INTO plant (name, code, time_zone, unit_system) VALUES ($1, $2, $3, $4) RETURNING id`, [DEMO_PLANT.name, DEMO_PLANT.code, DEMO_PLANT.timeZone, DEMO_PLANT.unitSystem]);
    const plantId: string = plant.id;
    const jobIds = new Map<string, string>();
    for (const j of DEMO_JOBS) {
      const [row] = await tx.query(`INSERT INTO job (plant_id, number, name) VALUES ($1, $2, $3) RETURNING id`, [plantId, j.number, j.name]);
      jobIds.set(j.number, row.id);
    }
    const userIds = new Map<string, string>();
    for (const u of DEMO_USERS) {
      const jobId = u.role === 'viewer' ? jobIds.get('J-2620') : null;
      const [row] = await tx.query(`INSERT INTO app_user (plant_id, email, name, role, password_hash, job_id) VALUES ($1, $2, $3, $4, $5, $6) RETURNING id`, [plantId, u.email, u.name, u.role, hash, jobId]);
      userIds.set(u.role, row.id);
    }
    const designIds = new Map<string, string>();
    for (const d of DEMO_DESIGNS) {
      const [row] = await tx.query(`INSERT INTO member_design (plant_id, code, name, product_type, version, spec, created_by) VALUES ($1, $2, $3, $4, 1, $5, $6) RETURNING id`, [plantId, d.code, d.name, d.productType, JSON.stringify(d.spec), userIds.get('engineer')]);
      designIds.set(d.code, row.id);
    }
    const inspector = userIds.get('inspector')!;
    let index = 0;
    for (const plan of PLAN) {
      const design = DEMO_DESIGNS.find((d) => d.code === plan.design)!;
      let bayShip = new Date(0);
      for (let k = 0; k < plan.count; k++, index++) {
        const bayNo = Math.floor(k / 6) + 1;
        const inBays = plan.design === 'DT28-60' || plan.design === 'BG54-110';
        // Pieces of one erection bay are cast on consecutive days and ship together.
        const castDaysAgo = inBays ? 4 + ((bayNo * 37 + plan.start * 11) % 108) + (5 - (k % 6)) : 4 + Math.floor(((index * 7919) % 150) * (116 / 150));
        const cast = new Date(now.getTime() - castDaysAgo * DAY);
        const releaseAge = Number(design.spec.concrete.releaseAgeDays ?? 1);
        const release = new Date(cast.getTime() + releaseAge * DAY);
        if (!inBays || k % 6 === 0) bayShip = new Date(cast.getTime() + (50 + Math.floor(rnd.next() * 30)) * DAY);
        const ship = bayShip;
        const erection = new Date(ship.getTime() + 2 * DAY);
        const bay = inBays ? (plan.design === 'BG54-110' ? `Span ${bayNo}` : `${plan.job === 'J-2611' ? 'Level 2' : 'Roof'} bay ${bayNo}`) : null;
        const status = ship.getTime() < now.getTime() ? 'shipped' : 'in_storage';
        const [piece] = await tx.query(
          `INSERT INTO piece (plant_id, job_id, design_id, mark, bed, cast_date, release_date, ship_date, erection_date, bay, bay_position, status)
           VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12) RETURNING id`,
          [plantId, jobIds.get(plan.job), designIds.get(plan.design), `${plan.prefix}${plan.start + k}`, `Bed ${1 + (index % 4)}`, isoDate(cast), isoDate(release), isoDate(ship), isoDate(erection), bay, inBays ? (k % 6) + 1 : null, status],
        );
        // Every fourth piece still waits for its latest scheduled reading if that fell in the last week.
        const waiting = index % 4 === 1 ? 7 * DAY : 0;
        const lastDay = Math.min(now.getTime() - waiting, ship.getTime());
        const ages = [releaseAge, ...DEFAULT_READING_AGES].filter((a) => cast.getTime() + a * DAY <= lastDay);
        if (ages.length === 0) continue;
        const curve = predictParsed(predictInputSchema.parse({ ...design.spec, agesDays: ages }));
        // Ordinary pieces scatter a little around their prediction; the drifting ones creep far more.
        const elasticFactor = rnd.normal(0.97, 0.03);
        const growthFactor = isDriftingIndex(index) ? rnd.normal(2.3, 0.1) : rnd.normal(1.0, 0.06);
        for (const p of curve.points) {
          const sunny = rnd.next() < 0.08 && p.ageDays > releaseAge;
          const thermal = sunny ? 0.15 + rnd.next() * 0.2 : 0;
          const inches = elasticFactor * p.elastic + growthFactor * p.growth + rnd.normal(0, 0.03) + thermal;
          const text = formatSixteenths(Math.round(inches * 16)).replace(/ in$/, '');
          const mm = parseTape(text, 'in').mm;
          // 07:00 local in the plant's time zone is about 13:00 UTC; sun readings are mid-afternoon.
          const taken = new Date(cast.getTime() + p.ageDays * DAY);
          taken.setUTCHours(sunny ? 21 : 13, Math.floor(rnd.next() * 50), 0, 0);
          const support = p.ageDays <= releaseAge ? 'bed' : 'dunnage';
          await tx.query(
            `INSERT INTO reading (plant_id, piece_id, taken_at, received_at, value_mm, entered_text, entered_unit, method, support, air_temp_c, sky, taken_by, idempotency_key, request_hash)
             VALUES ($1, $2, $3, $3, $4, $5, 'in', $6, $7, $8, $9, $10, $11, 'demo')`,
            [plantId, piece.id, taken.toISOString(), mm.toFixed(6), text, plan.design === 'BG54-110' ? 'level' : 'tape-string-line', support, Math.round(rnd.normal(sunny ? 24 : 8, 5)), sunny ? 'sun-on-top' : rnd.pick(['overcast', 'shade', 'night']), inspector, `demo-${piece.id}-${p.ageDays}`],
          );
        }
      }
    }
  });
  return { created: true };
}
