/**
 * The engine shared by the two fixed-word layouts of the community's merged
 * near-Earth solar-wind data set (references §11): one line per time step,
 * words separated by blanks, gaps filled with 9s. Each layout is one table
 * (layouts.ts: one row per quantity, one column per file) naming the 1-based word of every quantity, so a
 * fix to a word number is a one-line change there. Pure: no Node or DOM APIs.
 */
import { parseNumberText } from '../../cli/args';
import { checkTime } from '../../cli/batch/inputs';
import { pdynFromPlasmaNominal } from '../../physics/field/magnetopause';
import { MS_PER_DAY } from '../../physics/constants';
import { isNinesFill, isoUtc, LIMITS, ninesIn, type SeriesRecord, type SeriesValue, type StormIndexKind } from './record';

/** One word of a layout: its 1-based position, a label for messages, and its fill pattern. */
export interface WordSpec {
  word: number;
  label: string;
  /** The all-9s gap marker of this word (e.g. `999.9`); absent for words never filled (time). */
  fill?: string;
}

export interface WordLayout {
  format: 'hourly' | 'highres';
  /** How messages name the layout. */
  title: string;
  /** Word counts a data line of this layout may have (variants of the file). */
  wordCounts: readonly number[];
  /** Which storm index the `stormIndexNt` word holds. */
  stormIndex: StormIndexKind;
  words: {
    year: WordSpec;
    dayOfYear: WordSpec;
    hour: WordSpec;
    minute?: WordSpec;
    byGsmNt: WordSpec;
    bzGsmNt: WordSpec;
    densityCm3: WordSpec;
    speedKms: WordSpec;
    alphaRatio?: WordSpec;
    pressureNpa: WordSpec;
    stormIndexNt: WordSpec;
  };
}

/** 1.67e-6 nPa per cm⁻³ (km/s)²: the data set's own flow-pressure coefficient with the alpha term (references §3, §11). */
export const FLOW_PRESSURE_ALPHA_COEFF = 1.67e-6;

/** "word 17 (Bz GSM)". */
export function wordName(w: WordSpec): string {
  return `word ${w.word} (${w.label})`;
}

/** "55 or 56", "46, 48 or 49". */
export function countsText(counts: readonly number[]): string {
  return counts.length === 1 ? String(counts[0]) : `${counts.slice(0, -1).join(', ')} or ${counts[counts.length - 1]}`;
}

class LineProblem extends Error {
  constructor(readonly skip: boolean, message: string) { super(message); }
}

function isLeap(y: number): boolean {
  return (y % 4 === 0 && y % 100 !== 0) || y % 400 === 0;
}

const POW10 = [1, 10, 100, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15];

/**
 * A plain decimal word (sign, digits, one point; at most 15 digits) read as
 * m / 10^k: both exact doubles, so the quotient is the correctly rounded value,
 * the same as Number(text) (Clinger 1990, "How to read floating point numbers
 * accurately", PLDI '90, the exact fast path). Anything else (exponents, long
 * digit strings, junk) goes through the strict general parser.
 */
export function parseWord(t: string): number | null {
  const n = t.length;
  let i = 0;
  let neg = false;
  const c0 = t.charCodeAt(0);
  if (c0 === 45 || c0 === 43) { neg = c0 === 45; i = 1; }
  let m = 0;
  let digits = 0;
  let frac = -1;
  for (; i < n; i++) {
    const c = t.charCodeAt(i);
    if (c >= 48 && c <= 57) { m = m * 10 + (c - 48); digits++; if (frac >= 0) frac++; }
    else if (c === 46 && frac < 0) frac = 0;
    else return parseNumberText(t);
  }
  if (digits === 0 || digits > 15) return parseNumberText(t);
  const v = frac > 0 ? m / POW10[frac] : m;
  return neg ? -v : v;
}

function pad2(v: number): string {
  return v < 10 ? `0${v}` : String(v);
}

/**
 * Parses the data lines of one layout. `parseLine` returns one record per
 * non-blank line and null for a blank one. Allocation per line: the word
 * texts it reads and the record.
 */
export class FixedWordParser {
  private readonly starts: Int32Array;
  private readonly ends: Int32Array;
  private readonly capacity: number;
  private readonly fillNines = new Map<WordSpec, number>();
  private readonly maxWord: number;
  /** Years wholly inside the main-field model's span (checked once per year). */
  private readonly yearsInSpan = new Set<number>();
  /** "YYYY-MM-DDT" of the last day seen, and its key year·1000 + day. */
  private dayKey = -1;
  private dayPrefix = '';

  constructor(readonly layout: WordLayout, private readonly label = 'series') {
    this.capacity = Math.max(...layout.wordCounts) + 1;
    this.starts = new Int32Array(this.capacity);
    this.ends = new Int32Array(this.capacity);
    let maxWord = 0;
    for (const w of Object.values(layout.words)) {
      if (!w) continue;
      if (w.fill !== undefined) this.fillNines.set(w, ninesIn(w.fill));
      maxWord = Math.max(maxWord, w.word);
    }
    this.maxWord = maxWord;
    if (layout.wordCounts.some((c) => c < maxWord)) throw new RangeError(`${layout.title} layout: a word count is below the highest word used (${maxWord})`);
  }

  /** Split on blanks (space, tab); returns the number of words (positions kept for the first `capacity`). */
  private split(text: string): number {
    let count = 0;
    let inWord = false;
    const n = text.length;
    for (let i = 0; i < n; i++) {
      const c = text.charCodeAt(i);
      const blank = c === 32 || c === 9 || c === 11 || c === 12;
      if (blank) {
        if (inWord) { if (count <= this.capacity) this.ends[count - 1] = i; inWord = false; }
      } else if (!inWord) {
        inWord = true;
        if (count < this.capacity) this.starts[count] = i;
        count++;
      }
    }
    if (inWord && count <= this.capacity) this.ends[count - 1] = n;
    return count;
  }

  private text(line: string, w: WordSpec): string {
    return line.slice(this.starts[w.word - 1], this.ends[w.word - 1]);
  }

  /** A number, or undefined for a fill value; a LineProblem for anything else. */
  private value(line: string, w: WordSpec): number | undefined {
    const t = this.text(line, w);
    const nines = this.fillNines.get(w);
    if (nines !== undefined && isNinesFill(t, nines)) return undefined;
    const v = parseWord(t);
    if (v === null) throw new LineProblem(false, `${wordName(w)}: expected a number, got "${t}"`);
    return v;
  }

  private integer(line: string, w: WordSpec, lo: number, hi: number): number {
    const t = this.text(line, w);
    const v = parseWord(t);
    if (v === null || !Number.isInteger(v) || v < lo || v > hi) throw new LineProblem(false, `${wordName(w)}: expected a whole number in ${lo}..${hi}, got "${t}"`);
    return v;
  }

  /** Count of words a line must have (for detection). */
  accepts(wordCount: number): boolean {
    return this.layout.wordCounts.includes(wordCount);
  }

  /** Number of blank-separated words of a line. */
  wordCount(text: string): number {
    return this.split(text);
  }

  parseLine(text: string, line: number, cut = false): SeriesRecord | null {
    const where = `${this.label} line ${line}`;
    const count = this.split(text);
    if (count === 0 && !cut) return null;
    if (cut) return { kind: 'error', line, error: `${where}: the line is longer than ${text.length} characters; a ${this.layout.title} line has ${countsText(this.layout.wordCounts)} words` };
    if (!this.layout.wordCounts.includes(count)) {
      return { kind: 'error', line, error: `${where}: ${count} word${count === 1 ? '' : 's'}; a ${this.layout.title} line has ${countsText(this.layout.wordCounts)}` };
    }
    let time: string | undefined;
    try {
      const L = this.layout.words;
      const year = this.integer(text, L.year, 1000, 9999);
      const doy = this.integer(text, L.dayOfYear, 1, isLeap(year) ? 366 : 365);
      const hour = this.integer(text, L.hour, 0, 23);
      const minute = L.minute ? this.integer(text, L.minute, 0, 59) : 0;
      const dayMs = Date.UTC(year, 0, 1) + (doy - 1) * MS_PER_DAY;
      const timeMs = dayMs + (hour * 60 + minute) * 60_000;
      const key = year * 1000 + doy;
      if (key !== this.dayKey) { this.dayKey = key; this.dayPrefix = isoUtc(dayMs).slice(0, 11); }
      time = `${this.dayPrefix}${pad2(hour)}:${pad2(minute)}:00Z`;
      if (!this.yearsInSpan.has(year)) {
        try {
          checkTime(time);
          // A year whose first and last minute both pass is checked once.
          checkTime(isoUtc(Date.UTC(year, 0, 1)));
          checkTime(isoUtc(Date.UTC(year + 1, 0, 1) - 60_000));
          this.yearsInSpan.add(year);
        } catch {
          try { checkTime(time); } catch (e) { throw new LineProblem(false, (e as Error).message); }
        }
      }
      return { kind: 'ok', line, value: this.values(text, time, timeMs) };
    } catch (e) {
      if (!(e instanceof LineProblem)) throw e;
      return e.skip
        ? { kind: 'skipped', line, reason: `${where}: ${e.message}; row skipped`, time }
        : { kind: 'error', line, error: `${where}: ${e.message}`, time };
    }
  }

  private values(text: string, time: string, timeMs: number): SeriesValue {
    const L = this.layout.words;
    const by = this.value(text, L.byGsmNt);
    const bz = this.value(text, L.bzGsmNt);
    const n = this.value(text, L.densityCm3);
    const v = this.value(text, L.speedKms);
    const alpha = L.alphaRatio ? this.value(text, L.alphaRatio) : undefined;
    const p = this.value(text, L.pressureNpa);
    const idx = this.value(text, L.stormIndexNt);
    // Out-of-range numbers are errors (a damaged line), checked before gaps are reported.
    const imf = LIMITS.imfMaxNt;
    if (by !== undefined && Math.abs(by) > imf) throw new LineProblem(false, `${wordName(L.byGsmNt)}: ${by} is outside −${imf}..${imf} nT`);
    if (bz !== undefined && Math.abs(bz) > imf) throw new LineProblem(false, `${wordName(L.bzGsmNt)}: ${bz} is outside −${imf}..${imf} nT`);
    if (n !== undefined && !(n > 0)) throw new LineProblem(false, `${wordName(L.densityCm3)}: expected a density > 0 cm⁻³, got ${n}`);
    if (v !== undefined && !(v > 0)) throw new LineProblem(false, `${wordName(L.speedKms)}: expected a speed > 0 km/s, got ${v}`);
    if (alpha !== undefined && !(alpha >= 0 && alpha <= 1)) throw new LineProblem(false, `${wordName(L.alphaRatio!)}: expected a ratio in 0..1, got ${alpha}`);
    if (p !== undefined && !(p > 0 && p <= LIMITS.pdynMaxNpa)) throw new LineProblem(false, `${wordName(L.pressureNpa)}: expected a pressure > 0 and ≤ ${LIMITS.pdynMaxNpa} nPa, got ${p}`);
    if (idx !== undefined && Math.abs(idx) > LIMITS.dstMaxNt) throw new LineProblem(false, `${wordName(L.stormIndexNt)}: ${idx} is outside −${LIMITS.dstMaxNt}..${LIMITS.dstMaxNt} nT`);

    const gaps: string[] = [];
    if (by === undefined) gaps.push(this.gap(text, L.byGsmNt));
    if (bz === undefined) gaps.push(this.gap(text, L.bzGsmNt));
    let pdynNpa: number | undefined;
    let pdynSource: SeriesValue['pdynSource'] = 'flow_pressure';
    if (p !== undefined) pdynNpa = p;
    else if (n !== undefined && v !== undefined) {
      if (alpha !== undefined) {
        pdynNpa = FLOW_PRESSURE_ALPHA_COEFF * n * v * v * (1 + 4 * alpha);
        pdynSource = 'density_speed_alpha';
      } else {
        pdynNpa = pdynFromPlasmaNominal(n, v);
        pdynSource = 'density_speed';
      }
      if (pdynNpa > LIMITS.pdynMaxNpa) throw new LineProblem(false, `pressure from ${wordName(L.densityCm3)} and ${wordName(L.speedKms)}: ${pdynNpa} nPa is above the allowed ${LIMITS.pdynMaxNpa} nPa`);
    } else {
      const parts = [this.gap(text, L.pressureNpa)];
      if (n === undefined) parts.push(this.gap(text, L.densityCm3));
      if (v === undefined) parts.push(this.gap(text, L.speedKms));
      gaps.push(`no pressure: ${parts.join(', ')}`);
    }
    if (gaps.length > 0 || pdynNpa === undefined) throw new LineProblem(true, gaps.join('; '));
    const out: SeriesValue = { time, timeMs, pdynNpa, pdynSource, bzNt: bz!, byNt: by! };
    if (n !== undefined) out.densityCm3 = n;
    if (v !== undefined) out.speedKms = v;
    if (idx !== undefined) { out.dstNt = idx; out.dstKind = this.layout.stormIndex; }
    return out;
  }

  private gap(text: string, w: WordSpec): string {
    return `${wordName(w)} is a fill value (${this.text(text, w)})`;
  }

  /** The highest word number the layout reads. */
  get highestWord(): number {
    return this.maxWord;
  }
}
