/**
 * The batch output: a sink with backpressure (a file, or stdout), the
 * metadata block, and the framing of each format.
 *  - csv: `# key: value` metadata lines, the header (not repeated by shards 2..n,
 *    so shard files concatenate), one record per row; CRLF record ends.
 *  - json: JSON Lines — a first line {"metadata": {...}}, then one object per row
 *    (concatenation of shards stays valid JSON Lines).
 *  - geojson: one FeatureCollection (RFC 7946) with the metadata as a foreign
 *    member and one Point feature per row at the conjugate point.
 */
import { createWriteStream, type WriteStream } from 'node:fs';
import { stat, rename, unlink } from 'node:fs/promises';
import { once } from 'node:events';
import { basename, dirname, join } from 'node:path';
import { csvField } from '../../io/csv';
import { writeJson } from '../../io/json';
import type { BatchColumn, BatchFormat } from './compute';

export interface Sink {
  write(text: string): Promise<void>;
  /** Finish: the file gets its final name (atomic rename of the temporary file). */
  end(): Promise<void>;
  /**
   * Give up (interruption, failure): the temporary file is removed, or with
   * `keepPartial` renamed to `<target>.partial`; the target is never touched.
   * Returns the partial file's path when one was kept.
   */
  abort(keepPartial: boolean): Promise<string | null>;
}

/** Suffix of the file an interrupted or failed run leaves with --keep-partial. */
export const PARTIAL_SUFFIX = '.partial';

function waitDrainOrError(s: WriteStream): Promise<void> {
  return new Promise<void>((res) => {
    const done = () => { s.off('drain', done); s.off('error', done); s.off('close', done); res(); };
    s.on('drain', done); s.on('error', done); s.on('close', done);
  });
}

function openStream(path: string): Promise<WriteStream> {
  const s = createWriteStream(path, { encoding: 'utf8', flags: 'w' });
  return new Promise((resolve, reject) => {
    s.once('error', reject);
    s.once('open', () => { s.off('error', reject); resolve(s); });
  });
}

/** Resolves when the stream has closed (after an error or destroy too). */
function closed(s: WriteStream): Promise<void> {
  return s.closed ? Promise.resolve() : new Promise((res) => s.once('close', () => res()));
}

/**
 * A file sink. A regular file (or a new path) is written as a temporary file
 * beside the target (`.<name>.writing-<pid>`) and renamed onto it by `end()`,
 * so the target holds either its old content or the complete new table. A
 * device or pipe (e.g. /dev/stdout) is written directly.
 */
export async function fileSink(target: string): Promise<Sink> {
  const existing = await stat(target).catch(() => null);
  const direct = existing !== null && !existing.isFile();
  const path = direct ? target : join(dirname(target), `.${basename(target)}.writing-${process.pid}`);
  const s = await openStream(path);
  let err: Error | null = null;
  s.on('error', (e) => { err ??= e; });
  let finished = false;
  return {
    async write(text) {
      if (err) throw err;
      if (!s.write(text)) await waitDrainOrError(s);
      if (err) throw err;
    },
    async end() {
      if (err) throw err;
      await new Promise<void>((res) => s.end(() => res()));
      await closed(s);
      if (err) throw err;
      if (!direct) await rename(path, target);
      finished = true;
    },
    async abort(keepPartial) {
      if (finished) return null;
      finished = true;
      if (!s.destroyed) {
        if (keepPartial && !err) await new Promise<void>((res) => s.end(() => res()));
        s.destroy();
      }
      await closed(s);
      if (direct) return null;
      if (keepPartial) {
        const partial = target + PARTIAL_SUFFIX;
        try { await rename(path, partial); return partial; } catch { /* fall through: remove it */ }
      }
      await unlink(path).catch(() => {});
      return null;
    },
  };
}

/**
 * Writes through the CLI's stdout function. When that function feeds
 * process.stdout (the command line), its buffer is watched for backpressure;
 * when it is captured (tests), process.stdout never fills and nothing waits.
 */
export function stdoutSink(write: (text: string) => void): Sink {
  return {
    async write(text) {
      write(text);
      if (process.stdout.writableNeedDrain) await once(process.stdout, 'drain');
    },
    async end() {},
    async abort() { return null; },
  };
}

/** Text before the first row. */
export function outputPrefix(format: BatchFormat, metadata: Record<string, unknown>, withHeader: boolean, columns: readonly BatchColumn[]): string {
  if (format === 'csv') {
    const lines = Object.entries(metadata).map(([k, v]) => `# ${k}: ${typeof v === 'string' ? v : JSON.stringify(v)}`.replace(/[\r\n]+/g, ' '));
    if (withHeader) lines.push(columns.map((c) => csvField(c)).join(','));
    return lines.join('\r\n') + '\r\n';
  }
  if (format === 'json') return writeJson({ metadata }, 0);
  const head = writeJson({ type: 'FeatureCollection', metadata, features: [] }, 0).trimEnd();
  // Open the features array: `{"type":…,"metadata":{…},"features":[` then the rows.
  return head.slice(0, -2) + '\n';
}

/** Text between two non-empty row chunks. */
export function chunkSeparator(format: BatchFormat): string {
  return format === 'geojson' ? ',\n' : '';
}

/** Text after the last row. */
export function outputSuffix(format: BatchFormat): string {
  return format === 'geojson' ? '\n]}\n' : '';
}
