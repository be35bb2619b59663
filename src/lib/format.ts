/** Dates as 2026-12-01 (unambiguous across the labs' countries). */
export function formatDate(d: Date | number | string): string {
  return new Date(d).toISOString().slice(0, 10);
}

export function formatDateTime(d: Date | number | string): string {
  return new Date(d).toISOString().slice(0, 16).replace('T', ' ') + ' UTC';
}
