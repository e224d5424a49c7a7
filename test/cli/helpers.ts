/** Run the CLI in-process or as a child process, capturing stdout, stderr and the exit code. */
import { spawnSync } from 'node:child_process';
import { run } from '../../src/cli/run';
import { EXIT_OK } from '../../src/cli/exit-codes';
import { runBatch } from '../../src/cli/batch/index';
import { mkdtempSync, writeFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

export interface CliOutcome {
  code: number;
  out: string;
  err: string;
}

/** A fixed instant for reproducible tests (the default --time is "now"). */
export const TEST_NOW = new Date('2025-03-20T12:00:00Z');

export async function cli(...argv: string[]): Promise<CliOutcome> {
  let out = '';
  let err = '';
  const code = await run(argv, { stdout: (t) => { out += t; }, stderr: (t) => { err += t; }, now: () => TEST_NOW });
  return { code, out, err };
}

/** JSON stdout of a successful in-process run (fails loudly otherwise). */
export async function cliJson(...argv: string[]): Promise<Record<string, any>> {
  const r = await cli(...argv);
  if (r.code !== EXIT_OK) throw new Error(`exit ${r.code} for ${argv.join(' ')}: ${r.err}`);
  return JSON.parse(r.out);
}

/** The real thing: `npx tsx src/cli/main.ts …` in a child process. */
export function spawnCli(...argv: string[]): CliOutcome {
  const p = spawnSync('npx', ['tsx', 'src/cli/main.ts', ...argv], { encoding: 'utf8', cwd: new URL('../..', import.meta.url).pathname });
  return { code: p.status ?? -1, out: p.stdout, err: p.stderr };
}

/** The batch command in-process, at a fixed "now" (2025-03-20T22:00Z). */
export async function batchCli(args: string[]): Promise<CliOutcome> {
  let out = '', err = '';
  const code = await runBatch(args, { stdout: (t) => { out += t; }, stderr: (t) => { err += t; }, now: () => new Date('2025-03-20T22:00:00Z') });
  return { code, out, err };
}

/** A scratch folder for input files: `file(name, text)` writes one and returns its path. */
export function scratchDir(prefix: string): { file(name: string, text: string): string; path(name: string): string; remove(): void } {
  const dir = mkdtempSync(join(tmpdir(), prefix));
  return {
    file: (name, text) => { const p = join(dir, name); writeFileSync(p, text); return p; },
    path: (name) => join(dir, name),
    remove: () => rmSync(dir, { recursive: true, force: true }),
  };
}

/** The CSV table after the `#` metadata lines. */
export function csvBody(text: string): string {
  let i = 0;
  while (text.startsWith('#', i)) {
    const nl = text.indexOf('\n', i);
    if (nl < 0) return '';
    i = nl + 1;
  }
  return text.slice(i);
}

/** The `# key: value` metadata lines of a CSV as an object (values as written). */
export function csvMeta(text: string): Record<string, string> {
  const out: Record<string, string> = {};
  for (const line of text.split(/\r?\n/)) {
    if (!line.startsWith('# ')) break;
    const k = line.indexOf(': ');
    out[line.slice(2, k)] = line.slice(k + 2);
  }
  return out;
}
