/**
 * Which layout a series file has, from its first non-blank line (references
 * §11): a CSV header has commas; a fixed-word data line has blank-separated
 * words, 55 or 56 for the hourly file, 46 or 49 for the high-resolution file.
 * Pure: no Node or DOM APIs.
 */
import { InputError } from '../../physics/errors';
import { SERIES_CSV_EXPECTED } from './csv-series';
import { HOURLY_LAYOUT, HIGHRES_LAYOUT } from './layouts';
import { countsText } from './words';
import type { SeriesFormat } from './record';

function wordCount(line: string): number {
  let n = 0;
  let inWord = false;
  for (let i = 0; i < line.length; i++) {
    const c = line.charCodeAt(i);
    const blank = c === 32 || c === 9 || c === 11 || c === 12;
    if (!blank && !inWord) n++;
    inWord = !blank;
  }
  return n;
}

/** The format of a file whose first non-blank line is `line` (at file line `lineNo`); an InputError when none fits. */
export function detectSeriesFormat(line: string, lineNo = 1): SeriesFormat {
  const text = line.charCodeAt(0) === 0xfeff ? line.slice(1) : line;
  if (text.includes(',')) return 'csv';
  const n = wordCount(text);
  if (HOURLY_LAYOUT.wordCounts.includes(n)) return 'hourly';
  if (HIGHRES_LAYOUT.wordCounts.includes(n)) return 'highres';
  const shown = text.trim();
  const sample = shown.length > 60 ? `${shown.slice(0, 57)}...` : shown;
  throw new InputError('format', `cannot tell the series format from line ${lineNo} ("${sample}": ${n} blank-separated word${n === 1 ? '' : 's'}, no comma). ` +
    `Expected a CSV header (${SERIES_CSV_EXPECTED}), an hourly data line (${countsText(HOURLY_LAYOUT.wordCounts)} words) ` +
    `or a high-resolution data line (${countsText(HIGHRES_LAYOUT.wordCounts)} words); or choose the format explicitly: csv, hourly or highres`);
}
