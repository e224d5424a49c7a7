/** Run the CLI in-process or as a child process, capturing stdout, stderr and the exit code. */
import { spawnSync } from 'node:child_process';
import { run } from '../../src/cli/run';
import { EXIT_OK } from '../../src/cli/exit-codes';

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
