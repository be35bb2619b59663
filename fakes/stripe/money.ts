import { invalidRequest } from './errors';

// The provider's zero-decimal currencies: amounts are whole units, not hundredths.
const ZERO_DECIMAL = new Set('bif clp djf gnf jpy kmf krw mga pyg rwf ugx vnd vuv xaf xof xpf'.split(' '));

const SUPPORTED = new Set(Intl.supportedValuesOf('currency').map((code) => code.toLowerCase()));

/** A currency parameter, lower-cased as the provider stores it. */
export function currencyParam(value: string, param: string): string {
  const currency = value.toLowerCase();
  if (!SUPPORTED.has(currency)) throw invalidRequest(`Invalid currency: ${value}.`, { param });
  return currency;
}

function majorUnits(amount: number, currency: string): number {
  return ZERO_DECIMAL.has(currency) ? amount : amount / 100;
}

/** `€150.00`, the way the provider writes amounts into its error messages. */
export function formatAmount(amount: number, currency: string): string {
  const digits = ZERO_DECIMAL.has(currency) ? 0 : 2;
  return new Intl.NumberFormat('en-US', {
    style: 'currency',
    currency: currency.toUpperCase(),
    minimumFractionDigits: digits,
    maximumFractionDigits: digits,
  }).format(majorUnits(amount, currency));
}

const EURO_COUNTRIES = new Set('AT BE CY DE EE ES FI FR GR HR IE IT LT LU LV MT NL PT SI SK'.split(' '));
const COUNTRY_CURRENCIES: Record<string, string> = {
  AU: 'aud',
  CA: 'cad',
  CH: 'chf',
  CZ: 'czk',
  DK: 'dkk',
  GB: 'gbp',
  HU: 'huf',
  JP: 'jpy',
  NO: 'nok',
  NZ: 'nzd',
  PL: 'pln',
  RO: 'ron',
  SE: 'sek',
  SG: 'sgd',
  US: 'usd',
};

/** An account's `default_currency`, from its country; `fallback` for countries not listed. */
export function countryCurrency(country: string, fallback: string): string {
  if (EURO_COUNTRIES.has(country)) return 'eur';
  return COUNTRY_CURRENCIES[country] ?? fallback;
}
