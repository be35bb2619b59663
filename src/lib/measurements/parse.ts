// The contract the upload code calls: one measurement CSV in, parsed points in base units (and the
// ring-down fit) or the first error with its line and column out.

import type { MeasurementKind } from '../listings/constants';
import { CsvFailure, readCsv } from './csv';
import { parseEfficiencyCurve } from './efficiency-curve';
import { parseRingdown } from './ringdown';
import { parseSpectrum } from './spectrum';
import type { MeasurementResult, ParseOptions } from './types';

export const DEFAULT_MAX_LINES = 200_000;

export function parseMeasurementCsv(kind: MeasurementKind, text: string, opts: ParseOptions = {}): MeasurementResult {
  try {
    const file = readCsv(text, opts.maxLines ?? DEFAULT_MAX_LINES);
    switch (kind) {
      case 'spectrum':
        return { ok: true, data: parseSpectrum(file) };
      case 'ringdown':
        return { ok: true, data: parseRingdown(file) };
      case 'efficiency-curve':
        return { ok: true, data: parseEfficiencyCurve(file) };
    }
  } catch (e) {
    if (e instanceof CsvFailure) return { ok: false, error: e.error };
    throw e;
  }
}
