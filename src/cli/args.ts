/**
 * Flag parsing for the command line. Flags are `--name value` or
 * `--name=value`; switches (`--points`) take no value. A value flag always
 * takes the next word, so negative numbers (`--bz -5`) work. Every problem is
 * a UsageError naming the flag and what is allowed (exit code 2).
 */

import { InputError } from '../physics/errors';

/** The text of a thrown value: an Error's message, else the value as text. */
export function errorText(e: unknown): string {
  return e instanceof Error ? e.message : String(e);
}

/** What an engine InputError says without its leading input name ("pdynNpa: …" → "…"), to re-word it for a flag or a column. */
export function inputErrorReason(e: InputError): string {
  const prefix = `${e.field}: `;
  return e.message.startsWith(prefix) ? e.message.slice(prefix.length) : e.message;
}

export class UsageError extends Error {
  /** The flag at fault, with its dashes (e.g. "--pdyn"), or "" for the command itself. */
  readonly flag: string;
  constructor(flag: string, message: string) {
    super(flag ? `${flag}: ${message}` : message);
    this.name = 'UsageError';
    this.flag = flag;
  }
}

type FlagKind = 'number' | 'integer' | 'enum' | 'switch' | 'string' | 'triple' | 'numbers';

export interface FlagSpec {
  /** Without dashes, e.g. "tilt-deg". */
  name: string;
  kind: FlagKind;
  /** Value placeholder for help, e.g. "<nPa>". */
  meta?: string;
  help: string;
  unit?: string;
  /** Allowed words (kind 'enum'). */
  values?: readonly string[];
  /** Inclusive range of numbers (kinds number, integer, numbers, triple). */
  min?: number;
  max?: number;
  /** Exclusive lower bound (e.g. pressure > 0). */
  above?: number;
  /** Default shown in help (and applied by the caller). */
  defaultText?: string;
  required?: boolean;
}

type FlagValue = number | string | boolean | number[];
export type ParsedFlags = Record<string, FlagValue | undefined>;

const NUMBER_RE = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;

/** Strict decimal number (no hex, no Infinity/NaN, no empty text). */
export function parseNumberText(text: string): number | null {
  const t = text.trim();
  return NUMBER_RE.test(t) ? Number(t) : null;
}

function rangeText(s: FlagSpec): string {
  const u = s.unit ? ` ${s.unit}` : '';
  if (s.above !== undefined && s.max !== undefined) return `a number > ${s.above} and ≤ ${s.max}${u}`;
  if (s.above !== undefined) return `a number > ${s.above}${u}`;
  if (s.min !== undefined && s.max !== undefined) return `${s.kind === 'integer' ? 'a whole number' : 'a number'} in ${s.min}..${s.max}${u}`;
  return `${s.kind === 'integer' ? 'a whole number' : 'a number'}${u ? ` in${u}` : ''}`;
}

/** One named item of a flag's value (e.g. the latitude of --geo) against an inclusive range; returns it. */
export function requireFlagItem(flag: string, item: string, v: number, range: { min: number; max: number }, unit: string): number {
  if (v < range.min || v > range.max) throw new UsageError(flag, `${item}: expected ${rangeText({ name: '', kind: 'number', help: '', unit, ...range })}, got ${v}`);
  return v;
}

function checkNumber(s: FlagSpec, raw: string, label: string): number {
  const v = parseNumberText(raw);
  const flag = `--${s.name}`;
  if (v === null || !Number.isFinite(v)) throw new UsageError(flag, `expected ${label === '' ? rangeText(s) : `${label} as ${rangeText(s)}`}, got "${raw}"`);
  if (s.kind === 'integer' && !Number.isInteger(v)) throw new UsageError(flag, `expected ${rangeText(s)}, got "${raw}"`);
  const low = (s.min !== undefined && v < s.min) || (s.above !== undefined && v <= s.above);
  const high = s.max !== undefined && v > s.max;
  if (low || high) throw new UsageError(flag, `expected ${label === '' ? rangeText(s) : `${label} as ${rangeText(s)}`}, got ${raw}`);
  return v;
}

function convert(s: FlagSpec, raw: string): FlagValue {
  const flag = `--${s.name}`;
  switch (s.kind) {
    case 'number':
    case 'integer':
      return checkNumber(s, raw, '');
    case 'enum': {
      const vals = s.values ?? [];
      if (!vals.includes(raw)) throw new UsageError(flag, `expected ${vals.slice(0, -1).join(', ')}${vals.length > 1 ? ' or ' : ''}${vals[vals.length - 1]}, got "${raw}"`);
      return raw;
    }
    case 'string':
      if (raw === '') throw new UsageError(flag, 'expected a value, got an empty text');
      return raw;
    case 'triple':
    case 'numbers': {
      const parts = raw.split(',');
      if (s.kind === 'triple' && parts.length !== 3) throw new UsageError(flag, `expected three comma-separated numbers ${s.meta ?? ''}, got "${raw}"`.replace('  ', ' '));
      return parts.map((p, i) => {
        const v = parseNumberText(p);
        if (v === null) throw new UsageError(flag, `expected comma-separated numbers ${s.meta ?? ''}; item ${i + 1} is "${p}"`.replace('  ', ' '));
        if (s.kind === 'numbers') return checkNumber(s, p, `item ${i + 1}`);
        return v;
      });
    }
    case 'switch':
      return true;
  }
}

/** Parse the words after the command name against the command's flags. */
export function parseFlags(words: readonly string[], specs: readonly FlagSpec[], command: string): ParsedFlags {
  const byName = new Map(specs.map((s) => [s.name, s]));
  const out: ParsedFlags = {};
  const validList = () => specs.map((s) => `--${s.name}`).join(', ');
  for (let i = 0; i < words.length; i++) {
    const w = words[i];
    if (!w.startsWith('--') || w === '--') {
      throw new UsageError('', `${command}: unexpected argument "${w}" (options are flags such as --time; see ${command} --help)`);
    }
    const eq = w.indexOf('=');
    const name = eq >= 0 ? w.slice(2, eq) : w.slice(2);
    const spec = byName.get(name);
    if (!spec) throw new UsageError(`--${name}`, `unknown flag for ${command}; valid flags: ${validList()}`);
    if (out[name] !== undefined) throw new UsageError(`--${name}`, 'given more than once');
    if (spec.kind === 'switch') {
      if (eq >= 0) throw new UsageError(`--${name}`, `is a switch and takes no value, got "${w.slice(eq + 1)}"`);
      out[name] = true;
      continue;
    }
    let raw: string;
    if (eq >= 0) raw = w.slice(eq + 1);
    else {
      // A value never starts with "--" (negative numbers have one dash): the next word is another flag.
      if (i + 1 >= words.length || words[i + 1].startsWith('--')) throw new UsageError(`--${name}`, `expected a value${spec.meta ? ` ${spec.meta}` : ''}${i + 1 < words.length ? `, got the flag "${words[i + 1]}"` : ''}`);
      raw = words[++i];
    }
    out[name] = convert(spec, raw);
  }
  for (const s of specs) {
    if (s.required && out[s.name] === undefined) throw new UsageError(`--${s.name}`, `is required for ${command}${s.meta ? ` (${s.meta})` : ''}`);
  }
  return out;
}

/**
 * Whether the words ask for help: `--help` or `-h` where a flag may stand, not
 * as the (missing) value of the flag before it (`--time --help` is a missing
 * --time value, reported by parseFlags).
 */
export function asksForHelp(words: readonly string[], specs: readonly FlagSpec[]): boolean {
  const byName = new Map(specs.map((s) => [s.name, s]));
  for (let i = 0; i < words.length; i++) {
    const w = words[i];
    if (w === '--help' || w === '-h') return true;
    if (!w.startsWith('--') || w.includes('=')) continue;
    const spec = byName.get(w.slice(2));
    if (!spec || spec.kind === 'switch') continue;
    const next = words[i + 1];
    if (next === undefined || next.startsWith('--')) return false; // a missing value: parseFlags reports it
    i++;
  }
  return false;
}

/** Help lines for a list of flags, aligned. */
export function flagHelp(specs: readonly FlagSpec[]): string {
  const left = specs.map((s) => `  --${s.name}${s.kind === 'switch' ? '' : ` ${s.meta ?? '<value>'}`}`);
  const width = Math.max(...left.map((l) => l.length)) + 2;
  return specs
    .map((s, i) => {
      const extra = [s.required ? 'required' : '', s.defaultText !== undefined ? `default ${s.defaultText}` : ''].filter(Boolean).join('; ');
      return `${left[i].padEnd(width)}${s.help}${extra ? ` (${extra})` : ''}`;
    })
    .join('\n');
}
