/**
 * The word layouts of the merged near-Earth solar-wind data set's two text
 * files (references §11), in one table: the hourly file (one year per file, one
 * hour per line, 55 words; an extended variant adds a 56th) and the
 * high-resolution file (one line per 1- or 5-minute average: 46 words in the
 * 1-minute file, 49 in the 5-minute file, three proton-flux words appended).
 * One row per quantity, one column pair (word, fill pattern) per file, so a fix
 * to a word number is a one-cell change. Hourly words 1–16 and high-resolution
 * words 1–37 are checked against the published format descriptions; the
 * others, and the 5-minute word count, are from memory of them (references §11).
 * Pure: no Node or DOM APIs.
 */
import { FixedWordParser, type WordLayout, type WordSpec } from './words';

type Quantity = keyof WordLayout['words'];

/**
 * quantity | label | hourly word, fill | high-resolution word, fill
 * (-: not in that file; a word without a fill is never filled).
 */
const WORD_TABLE = `
year         | year               |  1        |  1
dayOfYear    | day of year        |  2        |  2
hour         | hour               |  3        |  3
minute       | minute             |  -        |  4
byGsmNt      | By GSM             | 16 999.9  | 18 9999.99
bzGsmNt      | Bz GSM             | 17 999.9  | 19 9999.99
speedKms     | flow speed         | 25 9999.  | 22 99999.9
densityCm3   | proton density     | 24 999.9  | 26 999.99
alphaRatio   | alpha/proton ratio | 28 9.999  |  -
pressureNpa  | flow pressure      | 29 99.99  | 28 99.99
stormIndexNt | Dst                | 41 99999  |  -
stormIndexNt | SYM/H              |  -        | 42 99999
`;

function layout(format: 'hourly' | 'highres', title: string, wordCounts: number[], stormIndex: WordLayout['stormIndex']): WordLayout {
  const words: Partial<Record<Quantity, WordSpec>> = {};
  for (const row of WORD_TABLE.trim().split('\n')) {
    const [quantity, label, hourly, highres] = row.split('|').map((c) => c.trim());
    const [w, fill] = (format === 'hourly' ? hourly : highres).split(/\s+/);
    if (w === '-') continue;
    words[quantity as Quantity] = fill === undefined ? { word: Number(w), label } : { word: Number(w), label, fill };
  }
  return { format, title, wordCounts, stormIndex, words: words as WordLayout['words'] };
}

export const HOURLY_LAYOUT: WordLayout = layout('hourly', 'hourly', [55, 56], 'dst');
export const HIGHRES_LAYOUT: WordLayout = layout('highres', 'high-resolution', [46, 49], 'sym_h');

/** A parser for one of the two files; `label` starts every message ("series line 12: …"). */
export function fixedWordParser(format: 'hourly' | 'highres', label = 'series'): FixedWordParser {
  return new FixedWordParser(format === 'hourly' ? HOURLY_LAYOUT : HIGHRES_LAYOUT, label);
}
