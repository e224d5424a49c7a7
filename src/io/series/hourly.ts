/**
 * The hourly file of the merged near-Earth solar-wind data set (references §11):
 * one year per file, one hour per line, 55 words (an extended variant adds a
 * 56th). One line per word below: a fix to the layout is a one-line change.
 * Words 1–16 checked against the published format description; 17–41 from
 * memory of it (references §11).
 */
import { FixedWordParser, type WordLayout } from './words';

export const HOURLY_LAYOUT: WordLayout = {
  format: 'hourly',
  title: 'hourly',
  wordCounts: [55, 56],
  stormIndex: 'dst',
  words: {
    year: { word: 1, label: 'year' },
    dayOfYear: { word: 2, label: 'day of year' },
    hour: { word: 3, label: 'hour' },
    byGsmNt: { word: 16, label: 'By GSM', fill: '999.9' },
    bzGsmNt: { word: 17, label: 'Bz GSM', fill: '999.9' },
    densityCm3: { word: 24, label: 'proton density', fill: '999.9' },
    speedKms: { word: 25, label: 'bulk speed', fill: '9999.' },
    alphaRatio: { word: 28, label: 'alpha/proton ratio', fill: '9.999' },
    pressureNpa: { word: 29, label: 'flow pressure', fill: '99.99' },
    stormIndexNt: { word: 41, label: 'Dst', fill: '99999' },
  },
};

/** A parser for hourly lines; `label` starts every message ("series line 12: …"). */
export function hourlyParser(label = 'series'): FixedWordParser {
  return new FixedWordParser(HOURLY_LAYOUT, label);
}
