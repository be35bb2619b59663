import { spawn, type ChildProcess } from 'node:child_process';
import { createServer } from 'node:net';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { Client, startTestApp, type TestApp } from '../setup/app';
import { linkIn, mailTo, waitForMail } from '../setup/mailbox';

const PASSWORD = 'demo-password-1';
const BUYER = 'buyer@demo.lightyard.example';
let app: TestApp;
let seller: Client;
let moderator: Client;
let buyer: Client;
let anon: Client;

async function as(who: string): Promise<Client> {
  const c = new Client(app.origin);
  expect((await c.signIn(`${who}@demo.lightyard.example`, PASSWORD)).status).toBe(200);
  return c;
}

beforeAll(async () => {
  app = await startTestApp();
  [seller, moderator, buyer] = await Promise.all([as('seller'), as('moderator'), as('buyer')]);
  anon = new Client(app.origin);
});
afterAll(async () => {
  await app?.stop();
});

/** A word no demo listing uses, so each test finds its own listings. */
const WORD = 'Quillwort';

interface MirrorOpts {
  name: string;
  t: number;
  tTol: number;
  loss: number;
  lossTol: number;
  rocMm: number | null;
  quantity: number;
  priceCents?: number;
  nm?: number;
}

/** A mirror listing made live the way a lab and a moderator do it: create, submit, approve. */
async function liveMirror(o: MirrorOpts): Promise<string> {
  const nm = o.nm ?? 1397;
  const created = await seller.post('/api/listings', {
    category: 'cavity-mirror',
    title: `${WORD} ${o.name} ${nm} nm mirror`,
    description: 'Test mirror with known transmission and loss.',
    condition: 'new',
    quantity: o.quantity,
    priceCents: o.priceCents ?? 100_000,
    currency: 'EUR',
    shipsTo: ['EU'],
    specs: {
      diameterMm: 12.7,
      substrate: 'fused silica',
      rocMm: o.rocMm,
      designWavelengthNm: nm,
      bandMinNm: nm - 20,
      bandMaxNm: nm + 20,
      transmissionPpm: { value: o.t, tol: o.tTol },
      lossPpm: { value: o.loss, tol: o.lossTol },
      aoiDeg: 0,
    },
  });
  expect(created.status).toBe(201);
  const { id } = (await created.json()) as { id: string };
  expect((await seller.post(`/api/listings/${id}/submit`)).status).toBe(200);
  expect((await moderator.post(`/api/moderation/listings/${id}`, { action: 'approve' })).status).toBe(200);
  return id;
}

/**
 * physics.md A1 form 1.3, ℱ = π·ρ^¼/(1 − √ρ) with ρ = R1·R2·(1 − L_rt) and R = 1 − T − loss — the
 * standard form of Hecht, Optics, 5th ed. (2017) §9.6, written out here independently of the engine.
 */
function finesse13(mirror1Ppm: number, mirror2Ppm: number, extraLossPpm = 0): number {
  const rho = (1 - mirror1Ppm * 1e-6) * (1 - mirror2Ppm * 1e-6) * (1 - extraLossPpm * 1e-6);
  return (Math.PI * rho ** 0.25) / (1 - Math.sqrt(rho));
}

function expectRelative(actual: number | null, expected: number, rel = 1e-6) {
  expect(actual).not.toBeNull();
  expect(Math.abs((actual as number) - expected) / expected).toBeLessThan(rel);
}

type Fit = {
  pass: boolean;
  verdict: string;
  figure: number | null;
  worst: number | null;
  headroom: number | null;
  unit: string;
  reasons: string[];
  plot: unknown;
};
type Result = { listing: { id: string; title: string; priceCents: number; labName: string }; partner?: { id: string }; fit: Fit };
type GoalResponse = {
  results: Result[];
  total: number;
  facets: Record<string, { value: string; count: number }[]>;
  headline: { label: string; value: string }[];
};

async function goal(body: unknown, client: Client = anon): Promise<GoalResponse> {
  const r = await client.post('/api/search/goal', body);
  expect(r.status, await r.clone().text()).toBe(200);
  return (await r.json()) as GoalResponse;
}

const cavity = (extra: Record<string, unknown>) => ({
  mode: 'cavity',
  goal: { wavelengthNm: 1397, lengthMm: 50, finesse: 200_000, configuration: 'pair', ...extra },
});

describe('cavity goals against mirrors with known T and loss', () => {
  const ids: Record<string, string> = {};
  beforeAll(async () => {
    ids.a = await liveMirror({ name: 'Alpha', t: 12, tTol: 2, loss: 3, lossTol: 1, rocMm: 500, quantity: 2, priceCents: 90_000 });
    ids.b = await liveMirror({ name: 'Beta', t: 4, tTol: 0.5, loss: 1.5, lossTol: 0.5, rocMm: 1000, quantity: 2, priceCents: 150_000 });
    ids.c = await liveMirror({ name: 'Gamma', t: 40, tTol: 5, loss: 8, lossTol: 2, rocMm: 250, quantity: 1, priceCents: 40_000 });
  });

  test('pair: each figure and worst case is form 1.3 to 1e-6; passes first, then headroom, then the rest', async () => {
    const res = await goal(cavity({}));
    const byId = new Map(res.results.map((r) => [r.listing.id, r]));
    expect(byId.has(ids.c!)).toBe(false);
    const a = byId.get(ids.a!)!;
    const b = byId.get(ids.b!)!;
    expectRelative(a.fit.figure, finesse13(15, 15));
    expectRelative(a.fit.worst, finesse13(18, 18));
    expectRelative(b.fit.figure, finesse13(5.5, 5.5));
    expectRelative(b.fit.worst, finesse13(6.5, 6.5));
    expect(b.fit.verdict).toBe('fits');
    expectRelative(b.fit.headroom, finesse13(6.5, 6.5) / 200_000 - 1);
    // Alpha's nominal 209 000 meets 200 000, its worst case 174 000 does not
    expect(a.fit.verdict).toBe('marginal');
    expect(res.results[0]!.listing.id).toBe(ids.b);
    expect(res.results[1]!.listing.id).toBe(ids.a);
    // every demo mirror with two units is out of band at 1397 nm and ranks after both
    expect(
      res.results.slice(2).every((r) => r.fit.verdict === 'does-not-fit' && r.fit.reasons.some((x) => x.includes('out of band'))),
    ).toBe(true);
    expect(res.results.length).toBeGreaterThan(4);
    expect(res.total).toBe(res.results.length);
    expect(res.headline[0]!.value).toContain('200');
    expect(res.results[0]!.fit.plot).toBeTruthy();
  });

  test('the extra round-trip loss enters ρ as (1 − L_rt)', async () => {
    const res = await goal(cavity({ extraLossPpm: 20 }));
    const b = res.results.find((r) => r.listing.id === ids.b)!;
    expectRelative(b.fit.figure, finesse13(5.5, 5.5, 20));
    expectRelative(b.fit.worst, finesse13(6.5, 6.5, 20));
  });

  test('a linewidth goal is the finesse goal FSR/Δν for the length', async () => {
    const lengthM = 0.05;
    const fsr = 299_792_458 / (2 * lengthM);
    const res = await goal(cavity({ finesse: undefined, linewidthHz: 10_000 }));
    const b = res.results.find((r) => r.listing.id === ids.b)!;
    expect(b.fit.unit).toBe('Hz');
    expectRelative(b.fit.figure, fsr / finesse13(5.5, 5.5));
    expectRelative(b.fit.worst, fsr / finesse13(6.5, 6.5));
  });

  test('with my own mirror: mirror 1 is the buyer’s R, every listed unit counts', async () => {
    const res = await goal(cavity({ configuration: 'with-own-mirror', ownMirror: { reflectivity: 0.99999, rocMm: 1000 } }));
    const c = res.results.find((r) => r.listing.id === ids.c)!;
    expectRelative(c.fit.figure, finesse13(10, 48));
    expectRelative(c.fit.worst, finesse13(10, 55));
    const t = await goal(cavity({ configuration: 'with-own-mirror', ownMirror: { transmissionPpm: 3, lossPpm: 2, rocMm: null } }));
    expectRelative(t.results.find((r) => r.listing.id === ids.a)!.fit.figure, finesse13(5, 15));
  });

  test('two listings: best pairs first, each figure form 1.3 of both mirrors', async () => {
    const res = await goal(cavity({ configuration: 'two-listings', finesse: 100_000 }));
    const ours = res.results.filter((r) => [ids.a, ids.b, ids.c].includes(r.listing.id));
    expect(ours.map((r) => new Set([r.listing.id, r.partner?.id]))).toEqual([
      new Set([ids.b, ids.a]),
      new Set([ids.b, ids.c]),
      new Set([ids.a, ids.c]),
    ]);
    expectRelative(ours[0]!.fit.figure, finesse13(5.5, 15));
    expectRelative(ours[0]!.fit.worst, finesse13(6.5, 18));
    expectRelative(ours[2]!.fit.worst, finesse13(18, 55));
    expect(ours[0]!.fit.verdict).toBe('fits');
    expect(res.total).toBe(3);
  });

  test('equal fits rank the cheaper first', async () => {
    const dear = await liveMirror({
      name: 'Dear',
      t: 5,
      tTol: 1,
      loss: 2,
      lossTol: 0.5,
      rocMm: 500,
      quantity: 2,
      priceCents: 200_000,
      nm: 1300,
    });
    const cheap = await liveMirror({
      name: 'Cheap',
      t: 5,
      tTol: 1,
      loss: 2,
      lossTol: 0.5,
      rocMm: 500,
      quantity: 2,
      priceCents: 100_000,
      nm: 1300,
    });
    const res = await goal(cavity({ wavelengthNm: 1300 }));
    expect(res.results.slice(0, 2).map((r) => r.listing.id)).toEqual([cheap, dear]);
    expect(res.results[0]!.fit.headroom).toBe(res.results[1]!.fit.headroom);
    const byPrice = await goal({ ...cavity({ wavelengthNm: 1300 }), sort: 'price' });
    expect(byPrice.results[0]!.listing.id).toBe(cheap);
  });

  test('a mirror whose band misses the wavelength does not fit: "out of band"', async () => {
    const res = await goal({ mode: 'cavity', goal: { wavelengthNm: 780, lengthMm: 50, finesse: 100_000, configuration: 'pair' } });
    const oob = res.results.find((r) => r.listing.title.startsWith('852 nm low-loss mirror, ROC 50 mm'))!;
    expect(oob.fit.verdict).toBe('does-not-fit');
    expect(oob.fit.pass).toBe(false);
    expect(oob.fit.headroom).toBeNull();
    expect(oob.fit.reasons[0]).toMatch(/^out of band: coating band 830–875 nm does not cover 780 nm/);
  });

  test('goals the API refuses answer 400 with the field', async () => {
    const two = await anon.post('/api/search/goal', cavity({ linewidthHz: 1000 }));
    expect(two.status).toBe(400);
    expect(Object.keys((await two.json()).error.fields)).toContain('goal.finesse');
    const own = await anon.post('/api/search/goal', cavity({ configuration: 'with-own-mirror' }));
    expect((await own.json()).error.fields['goal.ownMirror']).toBeTruthy();
    expect((await anon.post('/api/search/goal', { mode: 'magic', goal: {} })).status).toBe(400);
    expect((await anon.get('/api/search?category=spaceship')).status).toBe(400);
  });
});

describe('other goal modes', () => {
  test('squeezing ranks the balanced detectors that reach the goal first, with the required QE as headline', async () => {
    const res = await goal({
      mode: 'squeezing',
      goal: {
        wavelengthNm: 1550,
        targetDb: 6,
        sidebandHz: 5e6,
        source: { kind: 'opo', pumpParameter: 0.8, linewidthHz: 60e6 },
        escapeEfficiency: 0.98,
        propagationEfficiency: 0.98,
        visibility: 0.99,
        loPowerW: 5e-3,
        phaseNoiseRad: 0.01,
      },
    });
    expect(res.results[0]!.fit.verdict).toBe('fits');
    expect(res.results[0]!.fit.unit).toBe('dB');
    const verdicts = res.results.map((r) => r.fit.verdict);
    expect(verdicts.lastIndexOf('fits')).toBeLessThan(verdicts.indexOf('does-not-fit'));
    const headrooms = res.results.filter((r) => r.fit.verdict === 'fits').map((r) => r.fit.headroom as number);
    expect([...headrooms].sort((x, y) => y - x)).toEqual(headrooms);
    expect(res.results.some((r) => r.fit.reasons.some((x) => x.startsWith('no quantum efficiency at 1550 nm')))).toBe(true);
    expect(res.headline[0]!.label).toContain('Quantum efficiency needed');
    expect(
      res.facets
        .category!.filter((c) => c.count > 0)
        .map((c) => c.value)
        .sort(),
    ).toEqual(['balanced-detector', 'photodiode']);
  });

  test('counting and laser goals judge their categories', async () => {
    const ct = await goal({
      mode: 'counting',
      goal: { wavelengthNm: 1550, target: { kind: 'bell', test: 'eberhard' }, opticalEfficiency: 0.9 },
    });
    expect(ct.results[0]!.listing.title).toContain('nanowire');
    expect(ct.results[0]!.fit.verdict).toBe('fits');
    expect(ct.total).toBe(6);
    const la = await goal({
      mode: 'laser',
      goal: { wavelength: { kind: 'fixed', nm: 780 }, coherence: { kind: 'linewidth', maxHz: 1e6 }, minPowerW: 0.01 },
    });
    expect(la.results.filter((r) => r.fit.pass).map((r) => r.listing.title)).toEqual(
      expect.arrayContaining(['780 nm external-cavity diode laser, 80 mW']),
    );
    expect(la.results.find((r) => r.listing.title.startsWith('852 nm DBR'))!.fit.reasons[0]).toContain('does not reach 780 nm');
  });
});

type TextResponse = {
  results: { listing: { id: string; title: string; category: string; condition: string } }[];
  total: number;
  facets: Record<string, { value: string; count: number }[]>;
};

async function text(qs: string): Promise<TextResponse> {
  const r = await anon.get(`/api/search?${qs}`);
  expect(r.status).toBe(200);
  return (await r.json()) as TextResponse;
}

const count = (res: TextResponse, facet: string, value: string) => res.facets[facet]!.find((v) => v.value === value)!.count;

describe('text search and facets', () => {
  test('words find listings by title, specs and lab; every word must match; a unit word alone does not narrow', async () => {
    const supermirror = await text('q=supermirror');
    expect(supermirror.total).toBeGreaterThan(0);
    expect(supermirror.results.every((r) => /supermirror/i.test(r.listing.title))).toBe(true);
    const both = await text('q=1550%20supermirror');
    expect(both.results.map((r) => r.listing.title).sort()).toEqual(
      ['1550 nm supermirror, ROC 250 mm', 'Matched pair of 1550 nm supermirrors, ROC 50 mm'].sort(),
    );
    const lab = await text('q=Brightcount');
    expect(lab.total).toBeGreaterThan(5);
    expect((await text('q=nanowire%20ppktp')).total).toBe(0);
    expect((await text('q=nm')).total).toBe((await text('')).total);
    expect((await text('q=780nm')).total).toBe((await text('q=780')).total);
  });

  test('facet counts match the results, and a facet’s own filter leaves its other values counted', async () => {
    const all = await text('pageSize=50');
    expect(all.total).toBeGreaterThanOrEqual(41);
    const sum = (res: TextResponse, f: string) => res.facets[f]!.reduce((n, v) => n + v.count, 0);
    expect(sum(all, 'category')).toBe(all.total);
    expect(sum(all, 'condition')).toBe(all.total);
    const mirrors = await text('category=cavity-mirror&pageSize=50');
    expect(mirrors.total).toBe(count(all, 'category', 'cavity-mirror'));
    expect(mirrors.results.every((r) => r.listing.category === 'cavity-mirror')).toBe(true);
    expect(count(mirrors, 'category', 'laser')).toBe(count(all, 'category', 'laser'));
    expect(sum(mirrors, 'condition')).toBe(mirrors.total);
    const newMirrors = await text('category=cavity-mirror&condition=new&pageSize=50');
    expect(newMirrors.results.every((r) => r.listing.condition === 'new')).toBe(true);
    expect(newMirrors.total).toBe(count(mirrors, 'condition', 'new'));
    const twoCategories = await text('category=cavity-mirror,laser');
    expect(twoCategories.total).toBe(count(all, 'category', 'cavity-mirror') + count(all, 'category', 'laser'));
    const measured = await text('measured=yes');
    expect(measured.total).toBe(count(all, 'measured', 'yes'));
    const nirLasers = await text('band=near-ir&category=laser');
    expect(nirLasers.total).toBe(count(await text('band=near-ir'), 'category', 'laser'));
    expect(nirLasers.total).toBeGreaterThan(0);
    // a listing shipping worldwide ships to the UK too
    const uk = await text('region=UK');
    const world = await text('region=WORLD');
    expect(uk.total).toBeGreaterThan(world.total);
    expect(count(all, 'region', 'UK')).toBe(uk.total);
  });

  test('sort and pages', async () => {
    const cheap = await text('sort=price-asc&pageSize=5');
    const dear = await text('sort=price-desc&pageSize=5');
    expect(cheap.results[0]!.listing.id).not.toBe(dear.results[0]!.listing.id);
    const p1 = await text('pageSize=10&page=1');
    const p2 = await text('pageSize=10&page=2');
    expect(p1.results.length).toBe(10);
    expect(p2.results.map((r) => r.listing.id).some((id) => p1.results.some((r) => r.listing.id === id))).toBe(false);
  });
});

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address() as { port: number };
      srv.close(() => resolve(port));
    });
    srv.on('error', reject);
  });
}

/** A second app instance on the same database, as behind a load balancer. */
async function secondInstance(): Promise<{ client: Client; stop: () => Promise<void> }> {
  const port = await freePort();
  const origin = `http://127.0.0.1:${port}`;
  const child: ChildProcess = spawn(process.execPath, ['dist/server/entry.mjs'], {
    env: { ...process.env, ...app.env, PORT: String(port) },
    stdio: 'ignore',
  });
  for (let i = 0; i < 300; i++) {
    try {
      if ((await fetch(`${origin}/cautions`)).ok) break;
    } catch {
      await new Promise((r) => setTimeout(r, 100));
    }
  }
  return {
    client: new Client(origin),
    stop: async () => {
      child.kill('SIGTERM');
      await new Promise((r) => (child.exitCode !== null ? r(null) : child.once('exit', r)));
    },
  };
}

async function eventually<T>(f: () => Promise<T>, ok: (x: T) => boolean, ms = 8000): Promise<T> {
  const until = Date.now() + ms;
  for (;;) {
    const x = await f();
    if (ok(x) || Date.now() > until) return x;
    await new Promise((r) => setTimeout(r, 200));
  }
}

describe('the index follows the database without a restart', () => {
  test('an approved listing is found at once; an archived one leaves; another instance catches up by polling', async () => {
    const other = await secondInstance();
    try {
      const find = async (c: Client) => ((await (await c.get('/api/search?q=Marchantia')).json()) as TextResponse).total;
      expect(await find(anon)).toBe(0);
      expect(await find(other.client)).toBe(0);
      const id = await liveMirror({ name: 'Marchantia', t: 10, tTol: 1, loss: 2, lossTol: 0.5, rocMm: 500, quantity: 2 });
      expect(await find(anon)).toBe(1);
      expect(
        await eventually(
          () => find(other.client),
          (n) => n === 1,
        ),
      ).toBe(1);
      expect((await seller.del(`/api/listings/${id}`)).status).toBe(200);
      expect(await find(anon)).toBe(0);
      expect(
        await eventually(
          () => find(other.client),
          (n) => n === 0,
        ),
      ).toBe(0);
    } finally {
      await other.stop();
    }
  });
});

describe('saved searches', () => {
  const request = { mode: 'cavity', goal: { wavelengthNm: 1450, lengthMm: 50, finesse: 300_000, configuration: 'pair' } } as const;

  test('a new fitting listing is e-mailed with its figure, at most once a day; the unsubscribe link works signed out', async () => {
    expect((await anon.post('/api/saved-searches', { name: 'x', search: request, url: '/search' })).status).toBe(401);
    const bad = await buyer.post('/api/saved-searches', { name: '', search: request, url: '/elsewhere' });
    expect(bad.status).toBe(400);
    const created = await buyer.post('/api/saved-searches', {
      name: 'Finesse 300 000 at 1450 nm',
      search: request,
      url: '/search?mode=cavity&wl=1450&finesse=300000&len=50&config=pair',
    });
    expect(created.status).toBe(201);
    const { savedSearch } = await created.json();
    expect(savedSearch.active).toBe(true);
    const before = (await mailTo(app.mailDir, BUYER)).length;

    // does not reach 300 000: no hit, no mail
    await liveMirror({ name: 'Lowly', t: 30, tTol: 3, loss: 5, lossTol: 1, rocMm: 500, quantity: 2, nm: 1450 });
    const first = await liveMirror({ name: 'Ultra', t: 3, tTol: 0.3, loss: 1, lossTol: 0.2, rocMm: 500, quantity: 2, nm: 1450 });
    const mail = await waitForMail(app.mailDir, BUYER, /^New fit for “Finesse 300 000 at 1450 nm”: Quillwort Ultra/);
    expect(mail.text).toContain(`/listings/${first}`);
    expect(mail.text).toMatch(/Predicted finesse: 785\u2009000 \(worst case 698\u2009000, goal 300\u2009000, headroom \+133\u2009%\)/);
    expect(Math.round(finesse13(4, 4) / 1000)).toBe(785);

    // a second fit the same day is recorded but not mailed
    const second = await liveMirror({ name: 'Ultra Two', t: 2, tTol: 0.2, loss: 1, lossTol: 0.2, rocMm: 500, quantity: 2, nm: 1450 });
    await new Promise((r) => setTimeout(r, 2500));
    expect((await mailTo(app.mailDir, BUYER)).length).toBe(before + 1);
    const listed = await (await buyer.get('/api/saved-searches')).json();
    expect(listed.savedSearches[0]).toMatchObject({ id: savedSearch.id, hits: 2, active: true });

    // a day later the next fit is mailed, naming the one held back
    const { getDb } = await import('../../src/server/db/client');
    const { savedSearches } = await import('../../src/server/db/schema');
    const { eq } = await import('drizzle-orm');
    await getDb()
      .update(savedSearches)
      .set({ lastNotifiedAt: new Date(Date.now() - 25 * 3600_000) })
      .where(eq(savedSearches.id, savedSearch.id));
    await liveMirror({ name: 'Ultra Three', t: 2.5, tTol: 0.2, loss: 1, lossTol: 0.2, rocMm: 500, quantity: 2, nm: 1450 });
    const next = await waitForMail(app.mailDir, BUYER, /Quillwort Ultra Three/);
    expect(next.text).toContain('Also fitting since the last e-mail');
    expect(next.text).toContain(`/listings/${second}`);

    // the latest e-mail's link stops the e-mails without signing in
    const link = linkIn(next, '/unsubscribe');
    const page = await fetch(link);
    expect(page.status).toBe(200);
    expect(await page.text()).toContain('Stop these e-mails');
    const token = new URL(link).searchParams.get('token');
    expect((await anon.post('/api/saved-searches/unsubscribe', { token })).status).toBe(200);
    expect((await (await buyer.get('/api/saved-searches')).json()).savedSearches[0].active).toBe(false);
    await getDb().update(savedSearches).set({ lastNotifiedAt: null }).where(eq(savedSearches.id, savedSearch.id));
    await liveMirror({ name: 'Ultra Four', t: 2, tTol: 0.2, loss: 1, lossTol: 0.2, rocMm: 500, quantity: 2, nm: 1450 });
    await new Promise((r) => setTimeout(r, 2500));
    expect((await mailTo(app.mailDir, BUYER)).filter((m) => m.subject.includes('Ultra Four'))).toEqual([]);
    expect((await anon.post('/api/saved-searches/unsubscribe', { token: 'x'.repeat(43) })).status).toBe(404);
  });

  test('a buyer sees and deletes only their own saved searches', async () => {
    const mine = await (
      await buyer.post('/api/saved-searches', { name: 'Lasers', search: { mode: 'text', q: 'laser' }, url: '/search?q=laser' })
    ).json();
    const other = await as('seller2');
    expect((await (await other.get('/api/saved-searches')).json()).savedSearches).toEqual([]);
    expect((await other.del(`/api/saved-searches/${mine.savedSearch.id}`)).status).toBe(404);
    expect((await buyer.del(`/api/saved-searches/${mine.savedSearch.id}`)).status).toBe(200);
    expect((await buyer.post('/api/saved-searches', { name: 'Everything', search: { mode: 'text' }, url: '/search' })).status).toBe(400);
  });
});
