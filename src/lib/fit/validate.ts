// Input checks shared by every fit module. The domains follow physics.md A0 (power fractions,
// cyclic Hz, SI lengths); the result check enforces the engine's rule that no formula hands back
// NaN or ±Infinity.

import { FitInputError } from './errors';

function describe(v: unknown): string {
  return typeof v === 'number' ? String(v) : typeof v;
}

export function finite(field: string, v: unknown): number {
  if (typeof v !== 'number' || !Number.isFinite(v)) {
    throw new FitInputError(field, `must be a finite number, got ${describe(v)}`);
  }
  return v;
}

export function positive(field: string, v: unknown): number {
  const x = finite(field, v);
  if (x <= 0) throw new FitInputError(field, `must be greater than 0, got ${x}`);
  return x;
}

export function nonNegative(field: string, v: unknown): number {
  const x = finite(field, v);
  if (x < 0) throw new FitInputError(field, `must not be negative, got ${x}`);
  return x;
}

/** A power reflectivity, transmission or loss that leaves some light: [0, 1). */
export function powerFraction(field: string, v: unknown): number {
  const x = finite(field, v);
  if (x < 0 || x >= 1) throw new FitInputError(field, `must be a power fraction in [0, 1), got ${x}`);
  return x;
}

/** An efficiency: (0, 1]. */
export function efficiency(field: string, v: unknown): number {
  const x = finite(field, v);
  if (x <= 0 || x > 1) throw new FitInputError(field, `must be an efficiency in (0, 1], got ${x}`);
  return x;
}

/** A probability or fraction that may be 0 or 1: [0, 1]. */
export function unitInterval(field: string, v: unknown): number {
  const x = finite(field, v);
  if (x < 0 || x > 1) throw new FitInputError(field, `must lie in [0, 1], got ${x}`);
  return x;
}

export function inRange(field: string, v: unknown, min: number, max: number, what: string): number {
  const x = finite(field, v);
  if (x < min || x > max) throw new FitInputError(field, `${what} (${min} to ${max}), got ${x}`);
  return x;
}

export function integerAtLeast(field: string, v: unknown, min: number): number {
  const x = finite(field, v);
  if (!Number.isInteger(x) || x < min) {
    throw new FitInputError(field, `must be an integer of at least ${min}, got ${x}`);
  }
  return x;
}

export function requireObject(field: string, v: unknown): Record<string, unknown> {
  if (typeof v !== 'object' || v === null || Array.isArray(v)) {
    throw new FitInputError(field, `must be an object, got ${v === null ? 'null' : typeof v}`);
  }
  return v as Record<string, unknown>;
}

export function requireArray(field: string, v: unknown): unknown[] {
  if (!Array.isArray(v)) throw new FitInputError(field, `must be an array, got ${typeof v}`);
  return v;
}

export function oneOf<T extends string>(field: string, v: unknown, options: readonly T[]): T {
  if (typeof v !== 'string' || !(options as readonly string[]).includes(v)) {
    throw new FitInputError(field, `must be one of ${options.join(', ')}, got ${describe(v)}`);
  }
  return v as T;
}

/**
 * A computed number that left double-precision range (overflow to ±Infinity, or 0/0) means the
 * inputs were outside any physical regime; the caller is told which input to look at.
 */
export function finiteResult(field: string, value: number, what: string): number {
  if (!Number.isFinite(value)) {
    throw new FitInputError(field, `${what} is not representable for these inputs (out of range)`);
  }
  return value;
}
