import { describe, it, expect } from 'vitest';
import { EXIT_OK, EXIT_FAILURE, EXIT_USAGE, EXIT_ROWS_FAILED } from '../../src/cli/exit-codes';

// Source: the CLI contract (docs/references.md §13): 0 success, 1 failure, 2 bad arguments,
// 3 batch rows failed. The other CLI tests compare against these names, so the numbers are pinned here.
describe('exit codes', () => {
  it('keep the documented numbers', () => {
    expect([EXIT_OK, EXIT_FAILURE, EXIT_USAGE, EXIT_ROWS_FAILED]).toEqual([0, 1, 2, 3]);
  });
});
