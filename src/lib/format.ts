/** Dates as 2026-12-01 (unambiguous across the labs' countries). */
export function formatDate(d: Date | number | string): string {
  return new Date(d).toISOString().slice(0, 10);
}

export function formatDateTime(d: Date | number | string): string {
  return new Date(d).toISOString().slice(0, 16).replace('T', ' ') + ' UTC';
}

/** Integer minor units in their currency: 180000 EUR → "€1,800.00"; zero-decimal currencies stay whole. */
export function formatMoney(minor: number, currency: string): string {
  const fmt = new Intl.NumberFormat('en', { style: 'currency', currency });
  const digits = fmt.resolvedOptions().maximumFractionDigits ?? 2;
  return fmt.format(minor / 10 ** digits);
}
