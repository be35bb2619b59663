// Typed error for invalid fit-engine input. No physics source: this is the engine's input contract.

/**
 * Thrown when an input is not a usable number for the formula (NaN, non-finite, out of its physical
 * domain) or when the inputs put the result outside double-precision range. `field` names the input,
 * with a dotted path for nested objects (e.g. `mirrorA.transmissionPpm.value`).
 */
export class FitInputError extends Error {
  readonly field: string;

  constructor(field: string, message: string) {
    super(`${field}: ${message}`);
    this.name = 'FitInputError';
    this.field = field;
  }
}
