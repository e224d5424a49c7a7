/**
 * Errors raised at the engine's public boundary. Every message says what was
 * wrong and what is allowed. Kernels do not validate; wrappers do.
 */
export class InputError extends RangeError {
  /** The name of the offending input (a conditions key or a CLI flag). */
  readonly field: string;
  constructor(field: string, message: string) {
    super(`${field}: ${message}`);
    this.name = 'InputError';
    this.field = field;
  }
}

/**
 * The one wording of a refused value: "expected <what is allowed>, got <the value>"
 * (`quoted` puts the value in double quotes, for words and raw text). Used by
 * InputError here and by the command line's own errors.
 */
export function expectedGot(allowed: string, got: unknown, quoted = false): string {
  return quoted ? `expected ${allowed}, got "${String(got)}"` : `expected ${allowed}, got ${String(got)}`;
}

/** Require a finite number; returns it. */
export function requireFinite(field: string, v: unknown): number {
  if (typeof v !== 'number' || !Number.isFinite(v)) {
    throw new InputError(field, expectedGot('a finite number', v));
  }
  return v;
}

/** Require a finite number in [lo, hi]; returns it. */
export function requireInRange(field: string, v: unknown, lo: number, hi: number, unit = ''): number {
  const x = requireFinite(field, v);
  if (x < lo || x > hi) {
    const u = unit ? ` ${unit}` : '';
    throw new InputError(field, `${x}${u} is outside the allowed range ${lo}..${hi}${u}`);
  }
  return x;
}
