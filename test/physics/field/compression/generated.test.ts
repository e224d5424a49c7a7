import { describe, it, expect } from 'vitest';
import { readFileSync } from 'node:fs';
import { generateCompressionKernel, GENERATED_PATH } from '../../../../scripts/gen-compression-kernel';
import { compressionPairs } from '../../../../src/physics/field/compression/pairs';
import { UNROLLED_ORDER, UNROLLED_PAIRS } from '../../../../src/physics/field/compression/kernel.generated';

describe('kernel.generated.ts is the output of scripts/gen-compression-kernel.ts', () => {
  it('the committed file equals the generator output (run `npx tsx scripts/gen-compression-kernel.ts` after changing the generator)', () => {
    const committed = readFileSync(GENERATED_PATH, 'utf8');
    expect(committed === generateCompressionKernel(), 'kernel.generated.ts differs from the generator output').toBe(true);
  });

  it('the unrolled pair list is the basis rule of fit.ts at the unrolled order (14 pairs at order 4: i = 0, j = 0, i = j, (3,4), (4,3))', () => {
    expect(UNROLLED_PAIRS).toBe(compressionPairs(UNROLLED_ORDER).join(','));
    expect(UNROLLED_PAIRS.split(',').length / 2).toBe(14);
  });

  it('the generator follows its order: order 2 writes no e5/g3 powers and fewer terms', () => {
    const text = generateCompressionKernel(2);
    expect(text).toContain("export const UNROLLED_PAIRS = '0,1,0,2,1,0,1,1,2,0,2,2';");
    expect(text).not.toMatch(/\be5\b|\bg3\b|\bc3\b/);
  });
});
