/**
 * What a generic marketplace does: straight SQL over the listings table (specs in the JSON column),
 * the goal's formula in the query, LIKE for words, GROUP BY for facet counts. It reads the spec
 * columns only: measured spectra, ring-downs and efficiency curves are not used. Formulas as in
 * search-floor.ts (form 1.3 after Hecht §9.6; Kogelnik & Li stability; physics.md 5.1, 12.2–12.3).
 */
import { getClient } from '../../src/server/db/client';
import type { FloorCavityGoal, FloorSqueezingGoal } from './search-floor';

const PUBLIC = `l.published IS NOT NULL AND l.status IN ('live', 'sold-out', 'in-review', 'changes-requested') AND l.quantity > 0`;
const J = (path: string) => `json_extract(l.published, '$.specs.${path}')`;

async function facets(where: string, args: Record<string, number | string>) {
  const c = getClient();
  return Promise.all([
    c.execute({ sql: `SELECT count(*) AS n FROM listings l WHERE ${where}`, args }),
    c.execute({ sql: `SELECT l.category AS v, count(*) AS n FROM listings l WHERE ${where} GROUP BY 1`, args }),
    c.execute({
      sql: `SELECT json_extract(l.published, '$.condition') AS v, count(*) AS n FROM listings l WHERE ${where} GROUP BY 1`,
      args,
    }),
  ]);
}

export async function sqlText(terms: readonly string[]) {
  const args: Record<string, string> = {};
  const like = terms.map((t, i) => {
    args[`t${i}`] = `%${t}%`;
    return `lower(json_extract(l.published, '$.title') || ' ' || json_extract(l.published, '$.description') || ' ' || b.name) LIKE :t${i}`;
  });
  const where = `${PUBLIC}${like.map((w) => ` AND ${w}`).join('')}`;
  const page = await getClient().execute({
    sql: `SELECT l.id FROM listings l JOIN labs b ON b.id = l.lab_id WHERE ${where} ORDER BY json_extract(l.published, '$.approvedAt') DESC LIMIT 20`,
    args,
  });
  const c = getClient();
  const counts = await Promise.all([
    c.execute({ sql: `SELECT count(*) AS n FROM listings l JOIN labs b ON b.id = l.lab_id WHERE ${where}`, args }),
    c.execute({
      sql: `SELECT l.category AS v, count(*) AS n FROM listings l JOIN labs b ON b.id = l.lab_id WHERE ${where} GROUP BY 1`,
      args,
    }),
    c.execute({
      sql: `SELECT json_extract(l.published, '$.condition') AS v, count(*) AS n FROM listings l JOIN labs b ON b.id = l.lab_id WHERE ${where} GROUP BY 1`,
      args,
    }),
  ]);
  return { ids: page.rows.map((r) => r.id as string), total: Number(counts[0].rows[0]?.n ?? 0) };
}

/** Loss of one mirror from its spec columns, at nominal and with both tolerances added, as a fraction. */
const MIRROR_COLUMNS = `
  l.id AS id, l.price_cents AS price,
  (${J('transmissionPpm.value')} + ${J('lossPpm.value')}) * 1e-6 AS l1,
  min(${J('transmissionPpm.value')} + coalesce(${J('transmissionPpm.tol')}, 0) + ${J('lossPpm.value')} + coalesce(${J('lossPpm.tol')}, 0), 999999) * 1e-6 AS w1,
  CASE WHEN ${J('rocMm')} IS NULL THEN 1.0 ELSE 1.0 - :L / (${J('rocMm')} / 1000.0) END AS g`;
const IN_BAND = `l.category = 'cavity-mirror' AND ${J('bandMinNm')} <= :nm AND ${J('bandMaxNm')} >= :nm AND ${J('aoiDeg')} <= 5`;
const FINESSE = (a: string, b: string) =>
  `pi() * power((1 - ${a}) * (1 - ${b}) * (1 - :x), 0.25) / (1 - sqrt((1 - ${a}) * (1 - ${b}) * (1 - :x)))`;

export async function sqlPair(g: FloorCavityGoal) {
  const args = { nm: g.nm, L: g.lengthM, x: g.extraLoss, goal: g.finesse };
  const page = await getClient().execute({
    sql: `WITH m AS (SELECT ${MIRROR_COLUMNS} FROM listings l WHERE ${PUBLIC} AND l.quantity >= 2 AND ${IN_BAND}),
      f AS (SELECT id, price, ${FINESSE('l1', 'l1')} AS fin, ${FINESSE('w1', 'w1')} AS finw FROM m WHERE abs(g) < 1e-9 OR (g * g > 1e-9 AND g * g < 1 - 1e-9))
      SELECT id, fin, finw FROM f ORDER BY (finw >= :goal) DESC, (fin >= :goal) DESC, finw DESC, price LIMIT 20`,
    args,
  });
  const [total] = await facets(`${PUBLIC} AND l.category = 'cavity-mirror' AND l.quantity >= 2`, {});
  return { ids: page.rows.map((r) => r.id as string), total: Number(total.rows[0]?.n ?? 0) };
}

export async function sqlTwoListings(g: FloorCavityGoal) {
  const args = { nm: g.nm, L: g.lengthM, x: g.extraLoss };
  const pairs = await getClient().execute({
    sql: `WITH m AS MATERIALIZED (SELECT ${MIRROR_COLUMNS} FROM listings l WHERE ${PUBLIC} AND ${IN_BAND})
      SELECT a.id AS a, b.id AS b, ${FINESSE('a.w1', 'b.w1')} AS finw FROM m a JOIN m b ON a.id < b.id
      WHERE (abs(a.g) < 1e-9 AND abs(b.g) < 1e-9) OR (a.g * b.g > 1e-9 AND a.g * b.g < 1 - 1e-9) ORDER BY finw DESC LIMIT 100`,
    args,
  });
  await facets(`${PUBLIC} AND l.category = 'cavity-mirror'`, {});
  return { pairs: pairs.rows.map((r) => [r.a as string, r.b as string]) };
}

export async function sqlSqueezing(g: FloorSqueezingGoal) {
  const perQe = (1.602176634e-19 * g.nm * 1e-9) / (6.62607015e-34 * 299_792_458);
  const args = {
    nm: g.nm,
    sb: g.sidebandHz,
    lo: g.loPowerW,
    chain: g.chain,
    k: g.k,
    target: g.targetDb,
    q: 2 * 1.602176634e-19 * perQe * g.loPowerW,
  };
  const page = await getClient().execute({
    sql: `WITH d AS (SELECT l.id AS id, l.price_cents AS price,
        ${J('quantumEfficiency.value')} AS qe, max(0, ${J('quantumEfficiency.value')} - coalesce(${J('quantumEfficiency.tol')}, 0)) AS ql,
        ${J('noiseCurrentAPerRtHz.value')} AS nz, ${J('noiseCurrentAPerRtHz.value')} + coalesce(${J('noiseCurrentAPerRtHz.tol')}, 0) AS nh
        FROM listings l WHERE ${PUBLIC} AND l.category IN ('photodiode', 'balanced-detector') AND abs(${J('wavelengthNm')} - :nm) <= 1
          AND ${J('bandwidthHz')} >= :sb AND coalesce(${J('saturationPowerW')}, 1e9) >= :lo),
      s AS (SELECT id, price, qe, ql, :q * qe / (nz * nz) AS sn, :q * ql / (nh * nh) AS sw FROM d),
      f AS (SELECT id, price, -10 * log10(1 - :chain * qe * (sn / (1 + sn)) * :k) AS fig, -10 * log10(1 - :chain * ql * (sw / (1 + sw)) * :k) AS worst FROM s)
      SELECT id, fig, worst FROM f ORDER BY (worst >= :target) DESC, (fig >= :target) DESC, worst DESC, price LIMIT 20`,
    args,
  });
  const [total] = await facets(`${PUBLIC} AND l.category IN ('photodiode', 'balanced-detector')`, {});
  return { ids: page.rows.map((r) => r.id as string), total: Number(total.rows[0]?.n ?? 0) };
}
