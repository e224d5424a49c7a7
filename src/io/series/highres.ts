/**
 * The high-resolution (1-minute or 5-minute) file of the merged near-Earth
 * solar-wind data set (references §11): one line per average, 46 words in the
 * 1-minute file, 49 in the 5-minute file (three proton-flux words appended).
 * One line per word below: a fix to the layout is a one-line change. Words
 * 1–37 checked against the published format description; 38–46 and the
 * 5-minute word count from memory of it (references §11).
 */
import { FixedWordParser, type WordLayout } from './words';

export const HIGHRES_LAYOUT: WordLayout = {
  format: 'highres',
  title: 'high-resolution',
  wordCounts: [46, 49],
  stormIndex: 'sym_h',
  words: {
    year: { word: 1, label: 'year' },
    dayOfYear: { word: 2, label: 'day of year' },
    hour: { word: 3, label: 'hour' },
    minute: { word: 4, label: 'minute' },
    byGsmNt: { word: 18, label: 'By GSM', fill: '9999.99' },
    bzGsmNt: { word: 19, label: 'Bz GSM', fill: '9999.99' },
    speedKms: { word: 22, label: 'flow speed', fill: '99999.9' },
    densityCm3: { word: 26, label: 'proton density', fill: '999.99' },
    pressureNpa: { word: 28, label: 'flow pressure', fill: '99.99' },
    stormIndexNt: { word: 42, label: 'SYM/H', fill: '99999' },
  },
};

/** A parser for high-resolution lines; `label` starts every message ("series line 12: …"). */
export function highresParser(label = 'series'): FixedWordParser {
  return new FixedWordParser(HIGHRES_LAYOUT, label);
}
