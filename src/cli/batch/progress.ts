/** Progress on stderr: rows done, rows/s and ETA, at most once a second. */
export class Progress {
  private readonly t0 = performance.now();
  private last = 0;
  private readonly tty = process.stderr.isTTY === true;

  /** `expectedRows` is an estimate (line count of the series × sites); 0 when unknown. */
  constructor(private readonly write: (text: string) => void, private readonly expectedRows: number) {}

  update(rows: number, force = false): void {
    const now = performance.now();
    if (!force && now - this.last < 1000) return;
    this.last = now;
    const s = (now - this.t0) / 1000;
    const rate = s > 0 ? rows / s : 0;
    const total = Math.max(this.expectedRows, rows);
    const eta = rate > 0 && total > rows ? (total - rows) / rate : 0;
    const pct = total > 0 ? ` (${((100 * rows) / total).toFixed(1)} %)` : '';
    const text = `batch: ${rows}/${total} rows${pct}, ${Math.round(rate)} rows/s, ETA ${formatDuration(eta)}`;
    this.write(this.tty ? `\r${text}\x1b[K` : `${text}\n`);
  }

  done(): void {
    if (this.tty) this.write('\r\x1b[K');
  }
}

function formatDuration(seconds: number): string {
  const s = Math.round(seconds);
  const h = Math.floor(s / 3600), m = Math.floor((s % 3600) / 60), r = s % 60;
  return h > 0 ? `${h}h${String(m).padStart(2, '0')}m` : m > 0 ? `${m}m${String(r).padStart(2, '0')}s` : `${r}s`;
}
