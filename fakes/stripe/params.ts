import { invalidRequest, missingParam, unknownParam } from './errors';
import type { FormObject, FormValue } from './form-body';
import { currencyParam } from './money';

const INTEGER = /^-?\d+$/;

/**
 * Reads one hash of a decoded form body (or query), coercing the strings the wire carries and
 * naming a bad value by its full parameter path (`line_items[0][quantity]`), as the provider does.
 */
export class Params {
  constructor(
    private readonly values: FormObject,
    private readonly prefix = '',
  ) {}

  /** Refuses any key not listed, as the provider refuses parameters it does not know. */
  only(...keys: string[]): this {
    const allowed = new Set([...keys, ...(this.prefix === '' ? ['expand'] : [])]);
    for (const key of Object.keys(this.values)) {
      if (!allowed.has(key)) throw unknownParam(this.paramName(key));
    }
    return this;
  }

  string(key: string): string | undefined {
    const value = this.raw(key);
    if (value === undefined || value === '') return undefined;
    if (typeof value !== 'string') throw invalidRequest('Invalid string', { param: this.paramName(key) });
    return value;
  }

  requiredString(key: string): string {
    const value = this.string(key);
    if (value === undefined) throw missingParam(this.paramName(key));
    return value;
  }

  enum<T extends string>(key: string, values: readonly T[]): T | undefined {
    const value = this.string(key);
    if (value === undefined) return undefined;
    if (!(values as readonly string[]).includes(value)) {
      throw invalidRequest(`Invalid ${this.paramName(key)}: must be one of ${values.join(', ')}`, {
        code: 'parameter_invalid_string',
        param: this.paramName(key),
      });
    }
    return value as T;
  }

  requiredEnum<T extends string>(key: string, values: readonly T[]): T {
    const value = this.enum(key, values);
    if (value === undefined) throw missingParam(this.paramName(key));
    return value;
  }

  integer(key: string, { min }: { min?: number } = {}): number | undefined {
    const value = this.string(key);
    if (value === undefined) return undefined;
    const number = Number(value);
    if (!INTEGER.test(value) || !Number.isSafeInteger(number)) {
      throw invalidRequest(`Invalid integer: ${value}`, { code: 'parameter_invalid_integer', param: this.paramName(key) });
    }
    if (min !== undefined && number < min) {
      throw invalidRequest(`This value must be greater than or equal to ${min}.`, { param: this.paramName(key) });
    }
    return number;
  }

  requiredInteger(key: string, options: { min?: number } = {}): number {
    const value = this.integer(key, options);
    if (value === undefined) throw missingParam(this.paramName(key));
    return value;
  }

  boolean(key: string): boolean | undefined {
    const value = this.string(key);
    if (value === undefined) return undefined;
    if (value !== 'true' && value !== 'false') {
      throw invalidRequest(`Invalid boolean: ${value}`, { code: 'parameter_invalid_boolean', param: this.paramName(key) });
    }
    return value === 'true';
  }

  currency(key: string): string | undefined {
    const value = this.string(key);
    return value === undefined ? undefined : currencyParam(value, this.paramName(key));
  }

  requiredCurrency(key: string): string {
    return currencyParam(this.requiredString(key), this.paramName(key));
  }

  url(key: string): string | undefined {
    const value = this.string(key);
    if (value === undefined) return undefined;
    // Kept as sent (so `{CHECKOUT_SESSION_ID}` stays literal), hence no control characters: it ends up in a Location header.
    if (/[\u0000-\u001F\u007F]/.test(value) || !URL.canParse(value) || !/^https?:$/.test(new URL(value).protocol)) {
      throw invalidRequest('Not a valid URL', { code: 'url_invalid', param: this.paramName(key) });
    }
    return value;
  }

  requiredUrl(key: string): string {
    const value = this.url(key);
    if (value === undefined) throw missingParam(this.paramName(key));
    return value;
  }

  hash(key: string): Params | undefined {
    const value = this.raw(key);
    if (value === undefined || value === '') return undefined;
    if (typeof value === 'string' || Array.isArray(value)) {
      throw invalidRequest('Invalid hash', { param: this.paramName(key) });
    }
    return new Params(value, this.paramName(key));
  }

  requiredHash(key: string): Params {
    const value = this.hash(key);
    if (value === undefined) throw missingParam(this.paramName(key));
    return value;
  }

  /** An array of hashes (`line_items[0][…]`). */
  hashes(key: string): Params[] | undefined {
    const value = this.raw(key);
    if (value === undefined || value === '') return undefined;
    if (!Array.isArray(value)) throw invalidRequest('Invalid array', { param: this.paramName(key) });
    return value.map((item, index) => {
      const name = `${this.paramName(key)}[${index}]`;
      if (typeof item === 'string' || Array.isArray(item)) throw invalidRequest('Invalid hash', { param: name });
      return new Params(item, name);
    });
  }

  /** `metadata[key]=value` pairs; an empty value leaves the key out, as it unsets it on the provider. */
  metadata(key = 'metadata'): Record<string, string> {
    const hash = this.hash(key);
    const metadata: Record<string, string> = {};
    if (!hash) return metadata;
    for (const name of hash.keys()) {
      const value = hash.raw(name);
      if (typeof value !== 'string') throw invalidRequest('Invalid string', { param: hash.paramName(name) });
      if (value !== '') metadata[name] = value;
    }
    return metadata;
  }

  keys(): string[] {
    return Object.keys(this.values);
  }

  private raw(key: string): FormValue | undefined {
    return Object.hasOwn(this.values, key) ? this.values[key] : undefined;
  }

  /** The full parameter path of `key`, for errors a caller raises itself. */
  paramName(key: string): string {
    return this.prefix === '' ? key : `${this.prefix}[${key}]`;
  }
}
