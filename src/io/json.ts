/**
 * JSON out and in for results and exports. Writing is lossless for finite
 * numbers (shortest round-trip form); non-finite numbers become null (JSON has
 * no NaN), typed arrays become plain arrays, undefined members are dropped.
 *
 * Pure: no Node or DOM APIs; shared by the CLI and the browser app.
 */

function replacer(_key: string, value: unknown): unknown {
  if (typeof value === 'number' && !Number.isFinite(value)) return null;
  if (ArrayBuffer.isView(value) && !(value instanceof DataView)) return Array.from(value as unknown as ArrayLike<number>);
  return value;
}

// An indented array whose items are only numbers or null (no strings, objects or nested arrays).
const NUMERIC_ARRAY = /\[\s*\n[\s\d.eE+\-,null]*?\]/g;

/**
 * JSON text of a result with a final newline: 2-space indented (0 = compact),
 * arrays of plain numbers kept on one line ([x, y, z] stays readable).
 */
export function writeJson(value: unknown, indent = 2): string {
  const text = JSON.stringify(value, replacer, indent > 0 ? indent : undefined);
  if (text === undefined) throw new RangeError('writeJson: the value has no JSON form');
  if (indent <= 0) return text + '\n';
  return text.replace(NUMERIC_ARRAY, (m) => `[${m.slice(1, -1).trim().split(/\s*,\s*/).join(', ')}]`) + '\n';
}

/** Parse JSON text; the error names what was being read. */
export function readJson(text: string, what = 'json'): unknown {
  try {
    return JSON.parse(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text);
  } catch (e) {
    throw new RangeError(`${what}: not valid JSON (${(e as Error).message})`);
  }
}

/** xyz triples of a flat Float64Array as [[x, y, z], …]. */
export function triples(flat: ArrayLike<number>): [number, number, number][] {
  if (flat.length % 3 !== 0) throw new RangeError(`triples: length ${flat.length} is not a multiple of 3`);
  const out: [number, number, number][] = [];
  for (let i = 0; i < flat.length; i += 3) out.push([flat[i], flat[i + 1], flat[i + 2]]);
  return out;
}
