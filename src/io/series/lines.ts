/**
 * Lines of a text fed in chunks of any size: a line may span chunks, and CRLF,
 * LF or a lone CR each end one line (a CRLF split between chunks counts once).
 * A leading byte-order mark is dropped. Memory: one partial line is carried,
 * at most MAX_LINE_CHARS of it. Pure: no Node or DOM APIs.
 */

/** Called once per line; `cut` is true when the line was longer than the cap and only its start is given. */
export type LineSink = (text: string, line: number, cut: boolean) => void;

/** Longest line kept whole (a data line of these files is a few hundred characters). */
export const MAX_LINE_CHARS = 1 << 16;

/** What a chunked reader keeps between chunks about where the next chunk starts. */
export interface ChunkStartState {
  /** A chunk has been read (a byte-order mark can only open the first). */
  started: boolean;
  /** The previous chunk ended in CR outside quotes: a leading LF of the next one belongs to it. */
  afterCr: boolean;
}

/**
 * Index of the first character of `chunk` to read: past a leading byte-order
 * mark of the first chunk and past the LF of a CRLF split between chunks.
 * Shared by this splitter and the CSV record splitter (../batch-csv.ts).
 */
export function chunkStart(state: ChunkStartState, chunk: string): number {
  let i = 0;
  if (!state.started) {
    state.started = true;
    if (chunk.charCodeAt(0) === 0xfeff) i = 1;
  }
  if (state.afterCr) {
    state.afterCr = false;
    if (chunk.charCodeAt(i) === 10) i++;
  }
  return i;
}

export class LineSplitter implements ChunkStartState {
  private carry = '';
  private line = 1;
  started = false;
  afterCr = false;
  /** The carried line passed MAX_LINE_CHARS; the rest of it is dropped. */
  private cut = false;

  constructor(private readonly sink: LineSink) {}

  push(chunk: string): void {
    const n = chunk.length;
    if (n === 0) return;
    const i = chunkStart(this, chunk);
    // Line ends found with indexOf (fast native search) for LF and CR separately.
    let lf = chunk.indexOf('\n', i);
    let cr = chunk.indexOf('\r', i);
    let start = i;
    while (lf >= 0 || cr >= 0) {
      const isCr = cr >= 0 && (lf < 0 || cr < lf);
      const end = isCr ? cr : lf;
      this.emit(chunk.slice(start, end));
      start = end + 1;
      if (isCr) {
        if (end + 1 === n) this.afterCr = true;
        else if (lf === end + 1) start++;
      }
      if (lf >= 0 && lf < start) lf = chunk.indexOf('\n', start);
      if (cr >= 0 && cr < start) cr = chunk.indexOf('\r', start);
    }
    if (start < n && !this.cut) {
      this.carry += chunk.slice(start);
      if (this.carry.length > MAX_LINE_CHARS) { this.carry = this.carry.slice(0, MAX_LINE_CHARS); this.cut = true; }
    }
  }

  private emit(piece: string): void {
    let text = piece;
    if (this.carry !== '') { text = this.carry + piece; this.carry = ''; }
    const cut = this.cut || text.length > MAX_LINE_CHARS;
    this.cut = false;
    this.sink(cut ? text.slice(0, MAX_LINE_CHARS) : text, this.line++, cut);
  }

  /** Flush the last line when the text does not end with a line end. */
  end(): void {
    if (this.carry !== '' || this.cut) {
      const text = this.carry;
      const cut = this.cut;
      this.carry = '';
      this.cut = false;
      this.sink(text, this.line++, cut);
    }
  }

  /** Characters held for an unfinished line (for a memory check). */
  get pending(): number {
    return this.carry.length;
  }
}
