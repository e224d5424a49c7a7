import { describe, it, expect } from 'vitest';
import { writeJson, readJson, triples } from '../../src/io/json';

// Source: RFC 8259 (JSON has no NaN/Infinity; numbers round-trip through the shortest form, ECMA-262 Number::toString).
describe('json io', () => {
  it('round-trips finite doubles exactly', () => {
    const v = { a: 0.1 + 0.2, b: -1e-300, c: 123456789.123456789, d: [Math.PI] };
    expect(readJson(writeJson(v))).toEqual(v);
  });

  it('writes non-finite numbers as null and typed arrays as arrays, ends with a newline', () => {
    const t = writeJson({ x: Number.NaN, y: Number.POSITIVE_INFINITY, z: new Float64Array([1, 2.5]) }, 0);
    expect(t).toBe('{"x":null,"y":null,"z":[1,2.5]}\n');
  });

  it('reads with a byte-order mark and names what failed', () => {
    expect(readJson('\uFEFF{"a":1}')).toEqual({ a: 1 });
    expect(() => readJson('{', 'sites file')).toThrow(/sites file: not valid JSON/);
  });

  it('groups a flat xyz array into triples and refuses a ragged one', () => {
    expect(triples(new Float64Array([1, 2, 3, 4, 5, 6]))).toEqual([[1, 2, 3], [4, 5, 6]]);
    expect(() => triples([1, 2])).toThrow(/not a multiple of 3/);
  });
});

describe('json layout', () => {
  it('keeps numeric arrays on one line and leaves strings alone', () => {
    const v = { p: [[1, -2.5e-7, null], [3, 4, 5]], s: ['a,\n 1', '2'], e: [] };
    const t = writeJson(v);
    expect(t).toContain('[1, -2.5e-7, null]');
    expect(t).toContain('"a,\\n 1"');
    expect(readJson(t)).toEqual(v);
  });
});
