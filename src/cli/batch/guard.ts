/**
 * The batch output must never be one of its inputs: writing the table over the
 * sites or the series would destroy it (and a series read while it is being
 * overwritten never ends). Same path after resolving, or the same file by
 * device and inode (hard links, symbolic links, `./x` vs `x`).
 */
import { stat } from 'node:fs/promises';
import { resolve } from 'node:path';
import { UsageError } from '../args';

export async function checkOutNotInput(out: string, inputs: readonly { flag: string; path: string }[]): Promise<void> {
  const o = await stat(out).catch(() => null);
  for (const { flag, path } of inputs) {
    const same = resolve(out) === resolve(path) || (o !== null && o.isFile() && await stat(path).then((i) => i.dev === o.dev && i.ino === o.ino, () => false));
    if (same) throw new UsageError('--out', `${out} is the ${flag} input file; writing there would destroy it. Choose another output file`);
  }
}
