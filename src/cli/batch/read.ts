/** Streaming reads of the batch inputs: records of a CSV file, chunk by chunk. */
import { createReadStream } from 'node:fs';
import { stat } from 'node:fs/promises';
import { CsvRecordSplitter, type CsvRecord } from '../../io/batch-csv';
import { UsageError } from '../args';

/**
 * The records of a CSV file, read in 64 KiB chunks (a record may span chunks).
 * Malformed quoting gives an error record (see CsvRecordSplitter) and reading goes on.
 */
export async function* csvRecords(path: string): AsyncGenerator<CsvRecord> {
  const splitter = new CsvRecordSplitter();
  const stream = createReadStream(path, { encoding: 'utf8', highWaterMark: 1 << 16 });
  try {
    for await (const chunk of stream) yield* splitter.push(chunk as string);
    yield* splitter.end();
  } finally {
    stream.destroy();
  }
}

/** Fail early, as a usage error, when an input file cannot be read. */
export async function requireFile(path: string, flag: string): Promise<number> {
  try {
    const s = await stat(path);
    if (!s.isFile()) throw new UsageError(flag, `${path} is not a file`);
    return s.size;
  } catch (e) {
    if (e instanceof UsageError) throw e;
    throw new UsageError(flag, `cannot read ${path} (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
  }
}

/** Number of line ends in a file (a cheap upper bound of its records, for the progress estimate). */
export async function countLines(path: string): Promise<number> {
  let n = 0;
  let last = 10;
  for await (const chunk of createReadStream(path, { highWaterMark: 1 << 20 })) {
    const b = chunk as Buffer;
    for (let i = b.indexOf(10); i >= 0; i = b.indexOf(10, i + 1)) n++;
    if (b.length) last = b[b.length - 1];
  }
  return last === 10 ? n : n + 1;
}
