/**
 * The goal forms of the search page: per mode, its fields with units and defaults, and the
 * conversion from what the buyer typed to the API's goal (checked by the same schema the endpoint
 * uses, with each problem put back on its field). Field keys are the search page's URL parameters.
 */
import { GoalSearchSchema, type GoalMode, type GoalSearchRequest } from '../schemas/search';

export type Values = Record<string, string>;

export interface GoalField {
  key: string;
  label: string;
  unit?: string;
  hint?: string;
  options?: { value: string; label: string }[];
  /** May stay empty. */
  optional?: boolean;
  show?: (v: Values) => boolean;
  initial: string;
}

export const MODE_LABELS: Record<'text' | GoalMode, string> = {
  text: 'Words',
  cavity: 'Cavity',
  squeezing: 'Squeezing',
  counting: 'Photon counting',
  laser: 'Laser',
};

const is =
  (key: string, ...values: string[]) =>
  (v: Values) =>
    values.includes(v[key] ?? '');

export const GOAL_FIELDS: Record<GoalMode, GoalField[]> = {
  cavity: [
    { key: 'wl', label: 'Wavelength', unit: 'nm', initial: '780' },
    {
      key: 'target',
      label: 'Goal',
      options: [
        { value: 'finesse', label: 'finesse at least' },
        { value: 'linewidth', label: 'linewidth at most' },
        { value: 'storage', label: 'storage time at least' },
      ],
      initial: 'finesse',
    },
    { key: 'finesse', label: 'Finesse', initial: '100000', show: is('target', 'finesse') },
    { key: 'linewidth', label: 'Linewidth (FWHM)', unit: 'kHz', initial: '30', show: is('target', 'linewidth') },
    { key: 'storage', label: 'Storage time', unit: 'µs', initial: '5', show: is('target', 'storage') },
    { key: 'len', label: 'Cavity length', unit: 'mm', initial: '50' },
    {
      key: 'config',
      label: 'Mirrors',
      options: [
        { value: 'pair', label: 'a pair from one listing' },
        { value: 'two-listings', label: 'one mirror each from two listings' },
        { value: 'with-own-mirror', label: 'one listed mirror with my own' },
      ],
      initial: 'pair',
    },
    {
      key: 'ownBy',
      label: 'My mirror is given by',
      options: [
        { value: 'r', label: 'its reflectivity' },
        { value: 't', label: 'its transmission and loss' },
      ],
      initial: 'r',
      show: is('config', 'with-own-mirror'),
    },
    {
      key: 'ownR',
      label: 'My mirror: reflectivity',
      unit: '%',
      initial: '99.998',
      show: (v) => v.config === 'with-own-mirror' && v.ownBy !== 't',
    },
    {
      key: 'ownT',
      label: 'My mirror: transmission',
      unit: 'ppm',
      initial: '10',
      show: (v) => v.config === 'with-own-mirror' && v.ownBy === 't',
    },
    {
      key: 'ownL',
      label: 'My mirror: loss',
      unit: 'ppm',
      initial: '5',
      optional: true,
      show: (v) => v.config === 'with-own-mirror' && v.ownBy === 't',
    },
    {
      key: 'ownRoc',
      label: 'My mirror: radius of curvature',
      unit: 'mm',
      hint: 'Empty for a flat mirror.',
      initial: '100',
      optional: true,
      show: is('config', 'with-own-mirror'),
    },
    {
      key: 'extra',
      label: 'Extra round-trip loss',
      unit: 'ppm',
      hint: 'Crystal, windows or AR surfaces inside the cavity.',
      initial: '',
      optional: true,
    },
    { key: 'atomWl', label: 'Atom line (optional): wavelength', unit: 'nm', initial: '', optional: true },
    { key: 'atomGamma', label: 'Atom line: natural linewidth Γ/2π', unit: 'MHz', initial: '', optional: true },
  ],
  squeezing: [
    { key: 'wl', label: 'Wavelength', unit: 'nm', initial: '1550' },
    { key: 'db', label: 'Goal: measured squeezing', unit: 'dB', initial: '10' },
    { key: 'sideband', label: 'Sideband frequency', unit: 'MHz', initial: '5' },
    {
      key: 'source',
      label: 'Source',
      options: [
        { value: 'opo', label: 'OPO (pump parameter, linewidth)' },
        { value: 'initial', label: 'initial squeezing' },
      ],
      initial: 'opo',
    },
    { key: 'initial', label: 'Initial squeezing', unit: 'dB', initial: '15', show: is('source', 'initial') },
    { key: 'pump', label: 'Pump parameter x = √(P/P_th)', initial: '0.8', show: is('source', 'opo') },
    { key: 'opoLw', label: 'OPO linewidth (FWHM)', unit: 'MHz', initial: '60', show: is('source', 'opo') },
    { key: 'escape', label: 'Escape efficiency', unit: '%', initial: '98' },
    { key: 'prop', label: 'Propagation efficiency', unit: '%', initial: '98' },
    { key: 'vis', label: 'Fringe visibility', unit: '%', initial: '99' },
    { key: 'lo', label: 'Local-oscillator power', unit: 'mW', initial: '5' },
    { key: 'phase', label: 'Phase noise (rms)', unit: 'mrad', initial: '10', optional: true },
  ],
  counting: [
    { key: 'wl', label: 'Wavelength', unit: 'nm', initial: '1550' },
    {
      key: 'target',
      label: 'Goal',
      options: [
        { value: 'eberhard', label: 'Bell test, Eberhard (2/3)' },
        { value: 'chsh', label: 'Bell test, CHSH (82.8 %)' },
        { value: 'heralding', label: 'heralding efficiency at least' },
      ],
      initial: 'eberhard',
    },
    { key: 'herald', label: 'Heralding efficiency', unit: '%', initial: '70', show: is('target', 'heralding') },
    { key: 'optical', label: 'Your optical efficiency per arm', unit: '%', initial: '90' },
    { key: 'rate', label: 'Photon rate at each detector', unit: 'k/s', initial: '100', optional: true },
    { key: 'window', label: 'Coincidence window (full width)', unit: 'ns', initial: '1', optional: true },
    { key: 'car', label: 'Coincidence-to-accidental ratio at least', hint: 'Needs the rate and the window.', initial: '', optional: true },
  ],
  laser: [
    {
      key: 'wlKind',
      label: 'Wavelength',
      options: [
        { value: 'fixed', label: 'one wavelength' },
        { value: 'range', label: 'a range to cover' },
      ],
      initial: 'fixed',
    },
    { key: 'wl', label: 'Wavelength', unit: 'nm', initial: '780', show: (v) => v.wlKind !== 'range' },
    { key: 'tol', label: 'Tolerance', unit: 'nm', initial: '', optional: true, show: (v) => v.wlKind !== 'range' },
    { key: 'wlMin', label: 'From', unit: 'nm', initial: '770', show: is('wlKind', 'range') },
    { key: 'wlMax', label: 'To', unit: 'nm', initial: '790', show: is('wlKind', 'range') },
    {
      key: 'coh',
      label: 'Coherence',
      options: [
        { value: 'linewidth', label: 'linewidth at most' },
        { value: 'length', label: 'coherence length at least' },
        { value: 'none', label: 'no requirement' },
      ],
      initial: 'linewidth',
    },
    { key: 'lw', label: 'Linewidth', unit: 'kHz', initial: '100', show: is('coh', 'linewidth') },
    { key: 'lc', label: 'Coherence length', unit: 'm', initial: '100', show: is('coh', 'length') },
    { key: 'power', label: 'Power at least', unit: 'mW', initial: '10', optional: true },
  ],
};

export function initialValues(mode: GoalMode): Values {
  return Object.fromEntries(GOAL_FIELDS[mode].map((f) => [f.key, f.initial]));
}

export function visibleFields(mode: GoalMode, v: Values): GoalField[] {
  return GOAL_FIELDS[mode].filter((f) => !f.show || f.show(v));
}

/** "100 000", "0,5" and "1e-3" as numbers; empty as undefined; anything else as NaN. */
export function parseTyped(s: string | undefined): number | undefined {
  const t = (s ?? '').replace(/[\s\u2009\u202f]/g, '').replace(',', '.');
  if (t === '') return undefined;
  return /^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(t) ? Number(t) : NaN;
}

type Built = { goal: unknown; errors: Record<string, string> };

function builder(mode: GoalMode, v: Values) {
  const errors: Record<string, string> = {};
  const fields = new Map(visibleFields(mode, v).map((f) => [f.key, f]));
  /** The field's number times `scale` (its unit to the API's); undefined when it is empty and may be. */
  const num = (key: string, scale = 1): number | undefined => {
    const f = fields.get(key);
    if (!f) return undefined;
    const x = parseTyped(v[key]);
    if (x === undefined) {
      if (!f.optional) errors[key] = `Enter the ${f.label.toLowerCase()}.`;
      return undefined;
    }
    if (Number.isNaN(x)) {
      errors[key] = 'Enter a number, like 780 or 0.5.';
      return undefined;
    }
    return x * scale;
  };
  return { errors, num };
}

const defined = <T extends object>(o: T): T => Object.fromEntries(Object.entries(o).filter(([, x]) => x !== undefined)) as T;

function cavityGoal(v: Values): Built {
  const { errors, num } = builder('cavity', v);
  const own =
    v.config === 'with-own-mirror'
      ? defined(
          v.ownBy === 't'
            ? { transmissionPpm: num('ownT'), lossPpm: num('ownL') ?? 0, rocMm: num('ownRoc') ?? null }
            : { reflectivity: num('ownR', 0.01), rocMm: num('ownRoc') ?? null },
        )
      : undefined;
  const atomWl = num('atomWl');
  const atomGamma = num('atomGamma', 1e6);
  if ((atomWl === undefined) !== (atomGamma === undefined))
    errors[atomWl === undefined ? 'atomWl' : 'atomGamma'] = 'Give both the atom line’s wavelength and its linewidth, or neither.';
  const goal = defined({
    wavelengthNm: num('wl'),
    finesse: num('finesse'),
    linewidthHz: num('linewidth', 1e3),
    storageTimeS: num('storage', 1e-6),
    lengthMm: num('len'),
    configuration: v.config,
    ownMirror: own,
    extraLossPpm: num('extra'),
    atom: atomWl !== undefined && atomGamma !== undefined ? { wavelengthNm: atomWl, gammaHz: atomGamma } : undefined,
  });
  return { goal, errors };
}

function squeezingGoal(v: Values): Built {
  const { errors, num } = builder('squeezing', v);
  const source =
    v.source === 'initial'
      ? { kind: 'initial', initialDb: num('initial') }
      : { kind: 'opo', pumpParameter: num('pump'), linewidthHz: num('opoLw', 1e6) };
  const goal = defined({
    wavelengthNm: num('wl'),
    targetDb: num('db'),
    sidebandHz: num('sideband', 1e6),
    source,
    escapeEfficiency: num('escape', 0.01),
    propagationEfficiency: num('prop', 0.01),
    visibility: num('vis', 0.01),
    loPowerW: num('lo', 1e-3),
    phaseNoiseRad: num('phase', 1e-3),
  });
  return { goal, errors };
}

function countingGoal(v: Values): Built {
  const { errors, num } = builder('counting', v);
  const rate = num('rate', 1e3);
  const window = num('window', 1e-9);
  const car = num('car');
  if (car !== undefined && (rate === undefined || window === undefined))
    errors.car = 'A coincidence-to-accidental goal needs the photon rate and the window.';
  const target =
    v.target === 'heralding'
      ? { kind: 'heralding', efficiency: num('herald', 0.01) }
      : { kind: 'bell', test: v.target === 'chsh' ? 'chsh' : 'eberhard' };
  const goal = defined({
    wavelengthNm: num('wl'),
    target,
    opticalEfficiency: num('optical', 0.01),
    countRateHz: rate,
    coincidenceWindowS: window,
    carMin: car,
  });
  return { goal, errors };
}

function laserGoal(v: Values): Built {
  const { errors, num } = builder('laser', v);
  const wavelength =
    v.wlKind === 'range'
      ? { kind: 'range', minNm: num('wlMin'), maxNm: num('wlMax') }
      : defined({ kind: 'fixed', nm: num('wl'), toleranceNm: num('tol') });
  const coherence =
    v.coh === 'length'
      ? { kind: 'coherence-length', minM: num('lc') }
      : v.coh === 'none'
        ? undefined
        : { kind: 'linewidth', maxHz: num('lw', 1e3) };
  const goal = defined({ wavelength, coherence, minPowerW: num('power', 1e-3) });
  return { goal, errors };
}

const BUILD: Record<GoalMode, (v: Values) => Built> = {
  cavity: cavityGoal,
  squeezing: squeezingGoal,
  counting: countingGoal,
  laser: laserGoal,
};

/** The schema's goal paths, back onto the form fields they come from. */
const PATH_TO_FIELD: Record<GoalMode, Record<string, string>> = {
  cavity: {
    wavelengthNm: 'wl',
    finesse: 'finesse',
    linewidthHz: 'linewidth',
    storageTimeS: 'storage',
    lengthMm: 'len',
    configuration: 'config',
    ownMirror: 'ownR',
    'ownMirror.reflectivity': 'ownR',
    'ownMirror.transmissionPpm': 'ownT',
    'ownMirror.lossPpm': 'ownL',
    'ownMirror.rocMm': 'ownRoc',
    extraLossPpm: 'extra',
    'atom.wavelengthNm': 'atomWl',
    'atom.gammaHz': 'atomGamma',
  },
  squeezing: {
    wavelengthNm: 'wl',
    targetDb: 'db',
    sidebandHz: 'sideband',
    'source.initialDb': 'initial',
    'source.pumpParameter': 'pump',
    'source.linewidthHz': 'opoLw',
    escapeEfficiency: 'escape',
    propagationEfficiency: 'prop',
    visibility: 'vis',
    loPowerW: 'lo',
    phaseNoiseRad: 'phase',
  },
  counting: {
    wavelengthNm: 'wl',
    'target.efficiency': 'herald',
    opticalEfficiency: 'optical',
    countRateHz: 'rate',
    coincidenceWindowS: 'window',
    carMin: 'car',
  },
  laser: {
    'wavelength.nm': 'wl',
    'wavelength.toleranceNm': 'tol',
    'wavelength.minNm': 'wlMin',
    'wavelength.maxNm': 'wlMax',
    'coherence.maxHz': 'lw',
    'coherence.minM': 'lc',
    minPowerW: 'power',
  },
};

/** A field name for an error path of the API (goal.wavelengthNm → wl); null when it names no field. */
export function fieldForPath(mode: GoalMode, path: string): string | null {
  const p = path.replace(/^goal\./, '');
  return PATH_TO_FIELD[mode][p] ?? null;
}

export type GoalRequestResult = { ok: true; request: GoalSearchRequest } | { ok: false; errors: Record<string, string> };

/** The form's values as a goal search request, or the problems on their fields. */
export function goalRequest(mode: GoalMode, v: Values, rest: Omit<GoalSearchRequest, 'mode' | 'goal'>): GoalRequestResult {
  const { goal, errors } = BUILD[mode](v);
  if (Object.keys(errors).length > 0) return { ok: false, errors };
  const parsed = GoalSearchSchema.safeParse({ mode, goal, ...rest });
  if (parsed.success) return { ok: true, request: parsed.data };
  const out: Record<string, string> = {};
  for (const issue of parsed.error.issues) {
    const key = fieldForPath(mode, issue.path.join('.')) ?? '_';
    out[key] ??= issue.message;
  }
  return { ok: false, errors: out };
}

/** A short name for the goal, for a saved search: "Finesse 100000 at 780 nm, 50 mm, pair". */
export function describeGoal(mode: GoalMode, v: Values): string {
  switch (mode) {
    case 'cavity': {
      const target =
        v.target === 'linewidth'
          ? `Linewidth ≤ ${v.linewidth} kHz`
          : v.target === 'storage'
            ? `Storage time ≥ ${v.storage} µs`
            : `Finesse ${v.finesse}`;
      const config = v.config === 'two-listings' ? 'two listings' : v.config === 'with-own-mirror' ? 'with my mirror' : 'pair';
      return `${target} at ${v.wl} nm, ${v.len} mm, ${config}`;
    }
    case 'squeezing':
      return `${v.db} dB squeezing at ${v.wl} nm, ${v.sideband} MHz`;
    case 'counting':
      return `${v.target === 'heralding' ? `Heralding ${v.herald} %` : v.target === 'chsh' ? 'CHSH Bell test' : 'Eberhard Bell test'} at ${v.wl} nm`;
    case 'laser':
      return `Laser ${v.wlKind === 'range' ? `${v.wlMin}–${v.wlMax}` : v.wl} nm${v.coh === 'linewidth' ? `, ≤ ${v.lw} kHz` : ''}${v.power ? `, ≥ ${v.power} mW` : ''}`;
  }
}
