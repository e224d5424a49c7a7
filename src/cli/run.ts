/**
 * The command line as a function: `run(argv, io)` → exit code. main.ts binds it
 * to the process; tests call it in-process. Stdout gets only the result;
 * warnings and errors go to stderr. Exit codes: 0 success, 2 bad arguments,
 * 1 computation failure.
 */
import { prepareModel, type PreparedModel } from '../physics/field/model';
import { featureCollection } from '../io/geojson';
import { writeJson } from '../io/json';
import { UsageError, errorText, parseFlags, flagHelp, asksForHelp } from './args';
import { commonFlags, conditionsFromFlags, conditionsBlock, csvMetadata, programVersion, sourceReOf, usageFromInputError, DEFAULT_ALT_KM, type OutputFormat } from './common';
import type { CommandDef } from './command';
import { fieldCommand } from './commands/field';
import { traceCommand } from './commands/trace';
import { ovalCommand } from './commands/oval';
import { sweepCommand } from './commands/sweep';
import { timelineCommand } from './commands/timeline';
import { runBatch, batchHelp, BATCH_SUMMARY } from './batch/index';
import { EXIT_OK, EXIT_FAILURE, EXIT_USAGE, EXIT_ROWS_FAILED } from './exit-codes';

interface CliIo {
  stdout(text: string): void;
  stderr(text: string): void;
  /** The default for --time. */
  now(): Date;
}

const PROGRAM = 'fieldline-atlas';
const COMMANDS: readonly CommandDef[] = [fieldCommand, traceCommand, ovalCommand, sweepCommand, timelineCommand];

/** Every command name, the streamed `batch` included (it parses and prints on its own). */
const COMMAND_NAMES: readonly string[] = [...COMMANDS.map((c) => c.name), 'batch'];

function topHelp(): string {
  const width = Math.max(...COMMANDS.map((c) => c.name.length)) + 4;
  return [
    `${PROGRAM} ${programVersion()}: field lines, footpoints, conjugate points and oval boundaries`,
    'through the IGRF-14 main field (or its centred dipole), a Shue (1998) magnetopause with its',
    'compression field, and a penetrating IMF.',
    '',
    'Usage: npm run --silent cli -- <command> [options]',
    '',
    'Commands:',
    ...COMMANDS.map((c) => `  ${c.name.padEnd(width)}${c.summary}`),
    `  ${'batch'.padEnd(width)}${BATCH_SUMMARY}`,
    '',
    'Options common to every command:',
    flagHelp(commonFlags(['json', 'csv', 'geojson'])),
    '',
    'Run `<command> --help` for the options of one command.',
    'Output goes to stdout (JSON by default, with a "conditions" block); messages to stderr.',
    'Exit codes: 0 success, 2 bad arguments, 1 computation failure, 3 finished but nothing (oval, sweep) or not every row (batch) computed.',
    '',
  ].join('\n');
}

function commandHelp(c: CommandDef): string {
  return [
    `Usage: npm run --silent cli -- ${c.usage}`,
    '',
    `${c.name}: ${c.summary}.`,
    '',
    'Options:',
    flagHelp(c.flags),
    '',
    'Common options:',
    flagHelp(commonFlags(c.formats)),
    '',
    c.notes,
    '',
    'Examples:',
    ...c.examples.map((e) => `  npm run --silent cli -- ${e}`),
    '',
  ].join('\n');
}

function report(io: CliIo, cmd: string, e: unknown): number {
  const prefix = cmd ? `${PROGRAM} ${cmd}` : PROGRAM;
  const usage = e instanceof UsageError ? e : usageFromInputError(e);
  if (usage) {
    io.stderr(`${prefix}: ${usage.message}\n(see: ${cmd ? `${cmd} ` : ''}--help)\n`);
    return EXIT_USAGE;
  }
  io.stderr(`${prefix}: computation failed: ${errorText(e)}\n`);
  return EXIT_FAILURE;
}

/** Run one command line (the words after `cli --`). Never throws; returns the exit code. */
export async function run(argv: readonly string[], io: CliIo): Promise<number> {
  const [name, ...rest] = argv;
  if (name === undefined) {
    io.stderr(`${PROGRAM}: a command is required\n\n${topHelp()}`);
    return EXIT_USAGE;
  }
  if (name === '--help' || name === '-h' || name === 'help') {
    if (name === 'help' && rest[0] === 'batch') { io.stdout(batchHelp()); return EXIT_OK; }
    const sub = name === 'help' ? COMMANDS.find((c) => c.name === rest[0]) : undefined;
    if (name === 'help' && rest.length > 0 && !sub) return report(io, '', new UsageError('', `help: unknown command "${rest[0]}"; expected ${COMMAND_NAMES.join(', ')}`));
    io.stdout(sub ? commandHelp(sub) : topHelp());
    return EXIT_OK;
  }
  if (name === '--version') {
    io.stdout(`${programVersion()}\n`);
    return EXIT_OK;
  }
  if (name === 'batch') return runBatch(rest, io); // streams its own output (src/cli/batch)
  const cmd = COMMANDS.find((c) => c.name === name);
  if (!cmd) {
    const what = name.startsWith('-') ? `expected a command before options, got "${name}"` : `unknown command "${name}"`;
    return report(io, '', new UsageError('', `${what}; commands: ${COMMAND_NAMES.join(', ')}`));
  }
  if (asksForHelp(rest, [...cmd.flags, ...commonFlags(cmd.formats)])) {
    io.stdout(commandHelp(cmd));
    return EXIT_OK;
  }
  try {
    const flags = parseFlags(rest, [...cmd.flags, ...commonFlags(cmd.formats)], cmd.name);
    const conditions = conditionsFromFlags(flags, io.now());
    const altKm = (flags['alt-km'] as number | undefined) ?? DEFAULT_ALT_KM;
    const format = ((flags.format as string | undefined) ?? 'json') as OutputFormat;
    let model: PreparedModel;
    try {
      model = prepareModel(conditions);
    } catch (e) {
      // Bad conditions are argument errors even when the engine finds them.
      throw usageFromInputError(e) ?? e;
    }
    const warnings: string[] = [...model.warnings];
    const warn = (m: string) => { if (!warnings.includes(m)) warnings.push(m); };
    const result = await cmd.run({ flags, conditions: model.conditions, model, altKm, warn, io });
    if (result.ownWarningsOnly) warnings.splice(0, model.warnings.length);
    const block = { ...conditionsBlock(model, altKm, warnings, sourceReOf(flags)), ...result.settings };
    let text = '';
    if (result.streamed) text = '';
    else if (format === 'csv' && result.csv) text = csvMetadata({ program: `${PROGRAM} ${cmd.name}`, ...block }) + result.csv();
    else if (format === 'geojson' && result.geojson) text = writeJson(featureCollection(result.geojson(), { conditions: block }));
    else text = writeJson({ conditions: block, ...result.json });
    for (const w of warnings) io.stderr(`${PROGRAM} ${cmd.name}: warning: ${w}\n`);
    if (text) io.stdout(text);
    if (result.summary) io.stderr(`${PROGRAM} ${cmd.name}: ${result.summary}\n`);
    if (result.nothingComputed) {
      io.stderr(`${PROGRAM} ${cmd.name}: nothing computed: ${result.nothingComputed}\n`);
      return EXIT_ROWS_FAILED;
    }
    return EXIT_OK;
  } catch (e) {
    return report(io, cmd.name, e);
  }
}
