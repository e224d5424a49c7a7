/**
 * Entry point: `npm run --silent cli -- <command> [options]` (tsx src/cli/main.ts).
 * Binds run() to the process; the exit code is set, not forced, so stdout drains.
 */
import { run } from './run';

process.stdout.on('error', (e: NodeJS.ErrnoException) => {
  // A closed pipe (e.g. `| head`) is not a failure of ours.
  if (e.code === 'EPIPE') process.exit(0);
  throw e;
});

const code = await run(process.argv.slice(2), {
  stdout: (t) => void process.stdout.write(t),
  stderr: (t) => void process.stderr.write(t),
  now: () => new Date(),
});
process.exitCode = code;
