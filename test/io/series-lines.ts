/**
 * Hand-made data lines of the two fixed-word layouts (references §11), built
 * word by word from the published word numbers with invented values. Words the
 * reader does not use hold plausible filler so every line has the full count.
 */

/** Words of an hourly line (55, or 56 for the extended variant); `set` maps 1-based word → text. */
export function hourlyLine(set: Record<number, string>, words = 55): string {
  const w: string[] = [];
  for (let i = 1; i <= words; i++) w.push(set[i] ?? defaultHourly(i));
  // Right-aligned fields of assorted widths, as a Fortran fixed format writes them.
  return w.map((t, i) => t.padStart(i < 3 ? 4 : 7)).join('');
}

function defaultHourly(i: number): string {
  switch (i) {
    case 1: return '2027';
    case 2: return '302';
    case 3: return '14';
    case 4: return '2631'; // Bartels rotation number (invented)
    case 16: return '-3.4';
    case 17: return '-12.7';
    case 24: return '14.2';
    case 25: return '612.';
    case 28: return '.041';
    case 29: return '9.87';
    case 41: return '-143';
    default: return String((i * 37) % 200 / 10); // filler, never read
  }
}

/** Words of a high-resolution line (46 for 1-min, 49 for 5-min). */
export function highresLine(set: Record<number, string>, words = 46): string {
  const w: string[] = [];
  for (let i = 1; i <= words; i++) w.push(set[i] ?? defaultHighres(i));
  return w.map((t, i) => t.padStart(i < 4 ? 4 : 9)).join(' ');
}

function defaultHighres(i: number): string {
  switch (i) {
    case 1: return '2027';
    case 2: return '60';
    case 3: return '23';
    case 4: return '35';
    case 18: return '4.12';
    case 19: return '-8.56';
    case 22: return '487.3';
    case 26: return '6.81';
    case 28: return '3.24';
    case 42: return '-57';
    default: return String((i * 53) % 300 / 10);
  }
}
