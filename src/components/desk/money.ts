// Prices: typed in major units (1250.50 EUR), stored as integer minor units with an ISO 4217 code.
/** Digits of the currency's minor unit (ISO 4217: JPY and KRW have none), from the runtime's own table. */
export function minorDigits(currency: string): number {
  try {
    return new Intl.NumberFormat('en', { style: 'currency', currency }).resolvedOptions().maximumFractionDigits ?? 2;
  } catch {
    return 2;
  }
}

type ParsedPrice = { ok: true; minor: number } | { ok: false; message: string };

/**
 * "1250", "1 250.50", "1,250.50", "1250,50" → minor units. A lone comma followed by exactly three
 * digits groups thousands (1,250), otherwise it is a decimal comma (12,5).
 */
export function parseMajorUnits(text: string, currency: string): ParsedPrice {
  const s = text.trim().replace(/[\s\u2009\u202f\u00a0_']/g, '');
  if (s === '') return { ok: false, message: 'Set a price.' };
  let normalised: string;
  if (s.includes('.') && s.includes(',')) {
    const decimal = s.lastIndexOf('.') > s.lastIndexOf(',') ? '.' : ',';
    const grouping = decimal === '.' ? ',' : '.';
    normalised = s.split(grouping).join('').replace(decimal, '.');
  } else if (s.includes(',')) {
    const groups = s.split(',');
    normalised = groups.slice(1).every((g) => g.length === 3) ? groups.join('') : groups.length === 2 ? groups.join('.') : s;
  } else {
    normalised = s;
  }
  if (!/^\d+(\.\d*)?$|^\.\d+$/.test(normalised)) return { ok: false, message: 'Enter the price as a number, e.g. 1250 or 1250.50.' };
  const digits = minorDigits(currency);
  const fraction = normalised.split('.')[1] ?? '';
  if (fraction.replace(/0+$/, '').length > digits) {
    return {
      ok: false,
      message:
        digits === 0
          ? `${currency} has no minor unit: give a whole number.`
          : `${currency} has ${digits} decimal places: round to ${(10 ** -digits).toFixed(digits)}.`,
    };
  }
  return { ok: true, minor: Math.round(Number(normalised) * 10 ** digits) };
}

/** What the price field shows for a stored price: 45000 EUR → "450.00". */
export function majorUnitsText(minor: number, currency: string): string {
  const digits = minorDigits(currency);
  return (minor / 10 ** digits).toFixed(digits);
}
