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
import { once } from 'node:events';
import { csvField } from '../../io/csv';
import { writeJson } from '../../io/json';
import { BATCH_COLUMNS, type BatchFormat } from './compute';

export interface Sink {
  write(text: string): Promise<void>;
  end(): Promise<void>;
}

export function fileSink(path: string): Promise<Sink> {
  const s: WriteStream = createWriteStream(path, { encoding: 'utf8' });
  return new Promise((resolve, reject) => {
    s.once('error', reject);
    s.once('open', () => {
      s.off('error', reject);
      let err: Error | null = null;
      s.on('error', (e) => { err = e; });
      resolve({
        async write(text) {
          if (err) throw err;
          if (!s.write(text)) await new Promise<void>((res) => { const done = () => { s.off('drain', done); s.off('error', done); res(); }; s.on('drain', done); s.on('error', done); });
          if (err) throw err;
        },
        async end() {
          s.end();
          await once(s, 'finish');
          if (err) throw err;
        },
      });
    });
  });
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
  };
}

/** Text before the first row. */
export function outputPrefix(format: BatchFormat, metadata: Record<string, unknown>, withHeader: boolean): string {
  if (format === 'csv') {
    const lines = Object.entries(metadata).map(([k, v]) => `# ${k}: ${typeof v === 'string' ? v : JSON.stringify(v)}`.replace(/[\r\n]+/g, ' '));
    if (withHeader) lines.push(BATCH_COLUMNS.map((c) => csvField(c)).join(','));
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
