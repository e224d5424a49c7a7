import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { join, relative } from 'node:path';

/**
 * Every source the code, tests and docs cite must open inside the repository:
 * citations point at docs/references.md ("references §n", or a link to one of
 * its anchors), never at files outside the repository or at project
 * bookkeeping (issue numbers). The from-memory marks in that document's
 * bibliography must agree with its own summary list and with every place that
 * cites an entry as "from memory".
 */

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const THIS_FILE = fileURLToPath(import.meta.url);
const SCANNED_DIRS = ['src', 'test', 'workers', 'scripts', 'bench', 'docs'];
const SCANNED_FILES = ['README.md', 'DEVELOPERS.md'];
const TEXT_EXT = /\.(ts|tsx|mts|mjs|js|md|svg|css|html)$/;

function walk(dir: string, out: string[]): void {
  for (const name of readdirSync(dir)) {
    if (name === 'node_modules' || name.startsWith('.')) continue;
    const p = join(dir, name);
    if (statSync(p).isDirectory()) walk(p, out);
    else if (TEXT_EXT.test(name)) out.push(p);
  }
}

function scannedFiles(): string[] {
  const out: string[] = [];
  for (const d of SCANNED_DIRS) walk(join(ROOT, d), out);
  for (const f of SCANNED_FILES) out.push(join(ROOT, f));
  return out.filter((f) => f !== THIS_FILE);
}

/** Citations that point outside the repository or at issue numbers. */
const FORBIDDEN: readonly { what: string; re: RegExp }[] = [
  { what: 'a "CHECKS" citation (cite references §n)', re: /CHECKS/ },
  { what: 'a "STYLE.md" citation (cite DEVELOPERS.md or references §n)', re: /STYLE\.md/ },
  { what: 'a path outside the repository ("../shared")', re: /\.\.\/shared|\/work\/shared/ },
  { what: 'an issue-number citation (say what it means, or cite references §12 / §13)', re: /\bissues?[ -]#?\d+/i },
];

function forbiddenHits(text: string): string[] {
  const hits: string[] = [];
  text.split('\n').forEach((line, i) => {
    for (const f of FORBIDDEN) if (f.re.test(line)) hits.push(`line ${i + 1}: ${f.what}: ${line.trim().slice(0, 120)}`);
  });
  return hits;
}

/** Section numbers cited as "references §n" (also "references §1, §4" and "references §1 and §4"). */
function citedSections(text: string): number[] {
  const out: number[] = [];
  for (const m of text.matchAll(/references\s+§\d+(?:\s*(?:,|and)\s*§\d+)*/g)) {
    for (const n of m[0].matchAll(/§(\d+)/g)) out.push(Number(n[1]));
  }
  return out;
}

/** Anchors linked as references.md#anchor. */
function linkedAnchors(text: string): string[] {
  return [...text.matchAll(/references\.md#([\w-]+)/g)].map((m) => m[1]);
}

const REFS_PATH = join(ROOT, 'docs', 'references.md');
const REFS = readFileSync(REFS_PATH, 'utf8');
const [REFS_BODY, REFS_BIB = ''] = REFS.split('<a id="bibliography"></a>');

/** Section number → its anchor, from `<a id="sec-n"></a>` followed by a `## §n …` heading. */
function sections(doc: string): Map<number, string> {
  const out = new Map<number, string>();
  for (const m of doc.matchAll(/<a id="(sec-(\d+))"><\/a>\n## §(\d+) \S/g)) {
    expect(m[2], `anchor ${m[1]} heads section §${m[3]}`).toBe(m[3]);
    out.set(Number(m[2]), m[1]);
  }
  return out;
}

interface BibEntry { key: string; text: string; fromMemory: boolean }

function bibliography(bib: string): BibEntry[] {
  return bib.split(/\n(?=- \[)/).slice(1).map((chunk) => {
    const key = /^- \[(\w+)\]/.exec(chunk)![1];
    const text = chunk.replace(/\s+/g, ' ');
    return { key, text, fromMemory: /\(from memory/.test(text) };
  });
}

/** The keys listed after "Entries cited from memory:" (up to the first blank line). */
function summaryList(bib: string): string[] {
  const m = /Entries cited from memory:([\s\S]*?)\n\n/.exec(bib);
  return m ? [...m[1].matchAll(/\[(\w+)\]/g)].map((k) => k[1]) : [];
}

/** First author's surname (letters only) and year from a key such as OBrien2000 or ChapmanFerraro1931. */
function authorYear(key: string): { surname: string; year: string } | null {
  const m = /^((?:[A-Z](?=[A-Z][a-z]))?[A-Z][a-z]+)\w*?(\d{4})$/.exec(key);
  return m ? { surname: m[1], year: m[2] } : null;
}

/** Whether a line cites this author and year with "from memory" later in the same clause (no ';' between). */
function citesFromMemory(line: string, surname: string, year: string): boolean {
  const letters = line.replace(/['’]/g, '');
  return new RegExp(`${surname}[^;\\n]{0,60}?${year}[^;\\n]{0,80}?from memory`, 'i').test(letters);
}

describe('citations stay inside the repository (references §1–§13)', () => {
  const files = scannedFiles();

  it('the detectors themselves catch what they are meant to catch', () => {
    expect(forbiddenHits('see CHECKS §3')).toHaveLength(1);
    expect(forbiddenHits('// issue 6 calibration')).toHaveLength(1);
    expect(forbiddenHits('the issue-3 model, issues 2 and 3')).toHaveLength(1);
    expect(forbiddenHits('reissue 5 tissues 4')).toHaveLength(0);
    expect(citedSections('(references §1, §4) and references §7 and §9')).toEqual([1, 4, 7, 9]);
    expect(authorYear('OBrien2000')).toEqual({ surname: 'OBrien', year: '2000' });
    expect(authorYear('ChapmanFerraro1931')).toEqual({ surname: 'Chapman', year: '1931' });
    expect(citesFromMemory('Burton et al. 1975: 15.8, from memory', 'Burton', '1975')).toBe(true);
    expect(citesFromMemory('O’Brien & McPherron 2000: 7.26; Burton et al. 1975: 15.8, from memory', 'OBrien', '2000')).toBe(false);
  });

  it(`scans a real tree (${files.length} files)`, () => {
    expect(files.length).toBeGreaterThan(50);
    expect(files.some((f) => f.endsWith(join('docs', 'references.md')))).toBe(true);
  });

  it('no citation of files outside the repository, of STYLE.md or of issue numbers', () => {
    const problems: string[] = [];
    for (const f of files) for (const h of forbiddenHits(readFileSync(f, 'utf8'))) problems.push(`${relative(ROOT, f)} ${h}`);
    expect(problems, problems.join('\n')).toEqual([]);
  });

  it('every "references §n" names a section of docs/references.md, and every link names one of its anchors', () => {
    const secs = sections(REFS);
    expect([...secs.keys()].sort((a, b) => a - b)).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13]);
    const anchors = new Set([...REFS.matchAll(/<a id="([\w-]+)"><\/a>/g)].map((m) => m[1]));
    const problems: string[] = [];
    let cited = 0;
    for (const f of files) {
      const text = readFileSync(f, 'utf8');
      for (const n of citedSections(text)) {
        cited++;
        if (!secs.has(n)) problems.push(`${relative(ROOT, f)}: references §${n} does not exist`);
      }
      for (const a of linkedAnchors(text)) if (!anchors.has(a)) problems.push(`${relative(ROOT, f)}: references.md#${a} is no anchor`);
    }
    expect(problems, problems.join('\n')).toEqual([]);
    expect(cited).toBeGreaterThan(50);
  });

  it('README links its "references §n" citations to docs/references.md', () => {
    const readme = readFileSync(join(ROOT, 'README.md'), 'utf8');
    const bare = readme.split('\n').filter((l) => /references §\d/.test(l) && !/\[references §\d+\]\(docs\/references\.md#sec-\d+\)/.test(l));
    expect(bare, bare.join('\n')).toEqual([]);
  });

  it('every bibliography key cited in the document exists, and every entry is cited', () => {
    const keys = new Set(bibliography(REFS_BIB).map((e) => e.key));
    const citedKeys = new Set([...REFS_BODY.matchAll(/\[([A-Z]\w*\d{2,4})\]/g)].map((m) => m[1]));
    expect([...citedKeys].filter((k) => !keys.has(k)), 'cited but not in the bibliography').toEqual([]);
    expect([...keys].filter((k) => !citedKeys.has(k)), 'in the bibliography but cited nowhere in §1–§13').toEqual([]);
  });

  it('the "(from memory)" entries are exactly the summary list', () => {
    const entries = bibliography(REFS_BIB);
    expect(entries.length).toBeGreaterThan(20);
    const marked = entries.filter((e) => e.fromMemory).map((e) => e.key).sort();
    expect(summaryList(REFS_BIB).sort()).toEqual(marked);
  });

  it('no silent from-memory sources: an entry cited anywhere as "from memory" is marked so in the bibliography', () => {
    const entries = bibliography(REFS_BIB);
    const texts = files.map((f) => ({ f, text: f === REFS_PATH ? REFS_BODY : readFileSync(f, 'utf8') }));
    const problems: string[] = [];
    for (const e of entries) {
      const ay = authorYear(e.key);
      if (!ay || e.fromMemory) continue;
      for (const { f, text } of texts) {
        text.split('\n').forEach((line, i) => {
          if (/from memory/i.test(line) && citesFromMemory(line, ay.surname, ay.year)) {
            problems.push(`${relative(ROOT, f)}:${i + 1} cites ${e.key} as from memory, but its bibliography entry is not marked`);
          }
        });
      }
    }
    expect(problems, problems.join('\n')).toEqual([]);
  });
});
