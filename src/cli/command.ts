/** What a command is: its flags, its help, and how it turns conditions into a result. */
import type { FieldConditions } from '../physics/field/conditions';
import type { PreparedModel } from '../physics/field/model';
import type { FeatureCollection } from '../io/geojson';
import type { FlagSpec, ParsedFlags } from './args';
import type { OutputFormat } from './common';

export interface CommandContext {
  flags: ParsedFlags;
  conditions: FieldConditions;
  /** The model for `conditions` (sweeps prepare more of their own). */
  model: PreparedModel;
  altKm: number;
  /** Add a warning: printed on stderr and listed in conditions.warnings. */
  warn(message: string): void;
  /** The process's streams, for commands that stream their rows (result.streamed). */
  io: { stdout(text: string): void; stderr(text: string): void };
}

export interface CommandResult {
  /** Members after the conditions block. */
  json: Record<string, unknown>;
  /** Header-first CSV text. */
  csv?(): string;
  /** Features of a GeoJSON FeatureCollection (the conditions block is added as a foreign member). */
  geojson?(): FeatureCollection['features'];
  /** Settings of this run beyond the conditions (e.g. conjugateAltKm, sourceRe): added to the conditions block and the CSV metadata. */
  settings?: Record<string, unknown>;
  /** A summary line for stderr (e.g. how many boundaries were found and why others are missing). */
  summary?: string;
  /** The command wrote its output itself (through ctx.io); only warnings and the summary remain. */
  streamed?: boolean;
  /** The conditions came from elsewhere (a series): drop the warnings of the flags' model, keep only those the command added. */
  ownWarningsOnly?: boolean;
  /** Set when the command finished but computed nothing: the reason (stderr; exit code 3). */
  nothingComputed?: string;
}

export interface CommandDef {
  name: string;
  summary: string;
  usage: string;
  /** Paragraphs after the flag list. */
  notes: string;
  /** Command-specific flags (the common ones are added). */
  flags: FlagSpec[];
  formats: OutputFormat[];
  examples: string[];
  run(ctx: CommandContext): CommandResult | Promise<CommandResult>;
}

/** Round for CSV: 6 decimals (1e-6° ≈ 0.1 m on the ground). */
export const CSV_DECIMALS = 6;
