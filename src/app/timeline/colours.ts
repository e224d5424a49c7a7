/** Colours of the per-site strips (our own): relation to the oval and the sky's darkness. The line types use the app palette. */
export const RELATION_COLOURS = { poleward: '#7d8cf0', inside: '#5cf07a', equatorward: '#46607a', unknown: '#3a3a44' } as const;
export const TWILIGHT_COLOURS = { day: '#9cc3e0', civil: '#6d8fb5', nautical: '#3f5a88', astronomical: '#23305a', night: '#0c0f26' } as const;
export const MOON_COLOUR = '#d8dde8';
export const BEST_COLOUR = '#ffe14d';
