/**
 * The layout's rules, checked on the source text: no run-time import cycles among
 * the modules of src/ and workers/, and the engine (src/physics) stays pure — no
 * app, CLI, worker, Node, React or three imports (DEVELOPERS.md, "Architecture").
 */
import { describe, it, expect } from 'vitest';
import { readFileSync, readdirSync, statSync, existsSync } from 'node:fs';
import { join, dirname, relative, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '..');

function sourceFiles(dir: string): string[] {
  const out: string[] = [];
  for (const name of readdirSync(dir)) {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) out.push(...sourceFiles(p));
    else if (/\.tsx?$/.test(name) && !name.endsWith('.d.ts')) out.push(p);
  }
  return out;
}

/**
 * Module specifiers of static imports, re-exports, side-effect imports and `import('…')`.
 * With `withTypeOnly` false, `import type` / `export type` statements are left out: the
 * compiler erases them, so they cannot form a cycle at run time.
 */
function specifiers(text: string, withTypeOnly = true): string[] {
  const out: string[] = [];
  const statement = withTypeOnly ? /^\s*(?:import|export)\s[^;]*?\sfrom\s*['"]([^'"]+)['"]/gm : /^\s*(?:import|export)\s(?!type\s)[^;]*?\sfrom\s*['"]([^'"]+)['"]/gm;
  const patterns = [
    statement,
    /^\s*import\s*['"]([^'"]+)['"]/gm,
    /\bimport\(\s*['"]([^'"]+)['"]\s*\)/g,
  ];
  for (const re of patterns) for (const m of text.matchAll(re)) out.push(m[1]);
  return out;
}

/** The file a relative specifier names (the bundler's rules: .ts, .tsx, index), or null. */
function resolveRelative(from: string, spec: string): string | null {
  const base = resolve(dirname(from), spec);
  for (const c of [base, `${base}.ts`, `${base}.tsx`, join(base, 'index.ts'), join(base, 'index.tsx')]) {
    if (existsSync(c) && statSync(c).isFile()) return c;
  }
  return null;
}

const files = [...sourceFiles(join(ROOT, 'src')), ...sourceFiles(join(ROOT, 'workers'))];
const graph = new Map<string, string[]>();
const unresolved: string[] = [];
for (const f of files) {
  const deps: string[] = [];
  for (const spec of specifiers(readFileSync(f, 'utf8'), true)) {
    if (!spec.startsWith('.')) continue;
    const target = resolveRelative(f, spec);
    if (target === null) unresolved.push(`${relative(ROOT, f)} → ${spec}`);
    else deps.push(target);
  }
  graph.set(f, deps);
}

/** Cycles by depth-first search (white/grey/black); each reported once as the path that closes it. */
function findCycles(g: Map<string, string[]>): string[][] {
  const state = new Map<string, 1 | 2>();
  const stack: string[] = [];
  const cycles: string[][] = [];
  const visit = (v: string): void => {
    state.set(v, 1);
    stack.push(v);
    for (const w of g.get(v) ?? []) {
      const s = state.get(w);
      if (s === 1) cycles.push([...stack.slice(stack.indexOf(w)), w]);
      else if (s === undefined) visit(w);
    }
    stack.pop();
    state.set(v, 2);
  };
  for (const v of g.keys()) if (!state.has(v)) visit(v);
  return cycles;
}

describe('architecture', () => {
  it('finds the modules and resolves every relative import (the checks below see the whole graph)', () => {
    expect(files.length).toBeGreaterThan(50);
    expect(unresolved).toEqual([]);
  });

  it('has no import cycles among src/** and workers/** (type-only imports included)', () => {
    const cycles = findCycles(graph).map((c) => c.map((f) => relative(ROOT, f)).join(' → '));
    expect(cycles).toEqual([]);
  });

  it('the cycle search does find a cycle (self-check on a small graph)', () => {
    const g = new Map([['a', ['b']], ['b', ['c']], ['c', ['a']], ['d', ['a']]]);
    expect(findCycles(g)).toEqual([['a', 'b', 'c', 'a']]);
    expect(findCycles(new Map([['a', ['b']], ['b', []]]))).toEqual([]);
  });

  it('the import parser reads every statement form (self-check)', () => {
    const text = "import type { A } from './a';\nimport { b, type C } from './b';\nexport { d } from \"../d\";\nimport './e';\ntype F = import('./f').F;\nimport {\n  g,\n} from 'node:fs';\n";
    expect(specifiers(text)).toEqual(['./a', './b', '../d', 'node:fs', './e', './f']);
    expect(specifiers(text, false)).toEqual(['./b', '../d', 'node:fs', './e', './f']);
  });

  it('src/physics imports nothing from src/app, src/cli, workers, Node, React or three', () => {
    const physics = join(ROOT, 'src', 'physics');
    const forbiddenDirs = [join(ROOT, 'src', 'app'), join(ROOT, 'src', 'cli'), join(ROOT, 'workers')];
    const forbiddenPackage = /^(node:|react$|react\/|react-dom|three$|three\/|@react-three\/|comlink$|fs$|path$|url$|os$|worker_threads$|child_process$)/;
    const bad: string[] = [];
    for (const f of files.filter((p) => p.startsWith(physics + '/'))) {
      for (const spec of specifiers(readFileSync(f, 'utf8'))) {
        if (spec.startsWith('.')) {
          const target = resolveRelative(f, spec);
          if (target && (!target.startsWith(physics + '/') || forbiddenDirs.some((d) => target.startsWith(d + '/')))) bad.push(`${relative(ROOT, f)} → ${spec}`);
        } else if (forbiddenPackage.test(spec)) bad.push(`${relative(ROOT, f)} → ${spec}`);
      }
    }
    expect(bad).toEqual([]);
  });
});
