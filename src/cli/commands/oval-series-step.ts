/** One step of `oval --conditions`: the model for the step's conditions, its boundaries as rows (runs in a worker). */
import { prepareModel } from '../../physics/field/model';
import type { FieldConditions } from '../../physics/field/conditions';
import type { CsvCell } from '../../io/csv';
import { errorText } from '../args';
import { CONDITION_COLUMNS } from '../common';
import { OVAL_COLUMNS, ovalStep, type OvalRowSettings, type StepHints } from './oval-rows';

/** This thread's last answers per hemisphere and MLT: the next step's starting guesses. */
const hints: StepHints = new Map();

export interface OvalSeriesJob {
  seq: number;
  /** Series line of the step. */
  line: number;
  conditions: FieldConditions;
  /** What dst_source says: 'given' (the file's index) or 'integrated' (through the series). */
  dstSource: 'given' | 'integrated';
  settings: OvalRowSettings;
}

export interface OvalSeriesResult {
  seq: number;
  line: number;
  rows: CsvCell[][];
  found: number;
  missing: number;
  warnings: string[];
  /** Set when the step could not be computed (its rows then carry the reason). */
  error?: string;
}

const DST_SOURCE_COL = CONDITION_COLUMNS.indexOf('dst_source');

export function computeOvalSeriesStep(job: OvalSeriesJob): OvalSeriesResult {
  try {
    const model = prepareModel(job.conditions);
    const st = ovalStep(model, job.settings, hints);
    for (const r of st.rows) r[DST_SOURCE_COL] = job.dstSource;
    return { seq: job.seq, line: job.line, rows: st.rows, found: st.found, missing: st.missing, warnings: [...model.warnings] };
  } catch (e) {
    const reason = `step not computed (series line ${job.line}): ${errorText(e)}`;
    const c = job.conditions;
    const rows: CsvCell[][] = [];
    for (const h of job.settings.hemispheres)
      for (const mlt of job.settings.mlts) {
        const row: CsvCell[] = [c.time, c.pdynNpa, c.bzNt, c.byNt, c.dstNt ?? null, job.dstSource, c.internal, job.settings.sourceRe, job.settings.altKm, h, mlt];
        while (row.length < OVAL_COLUMNS.length) row.push(null);
        row[OVAL_COLUMNS.indexOf('open_closed_reason')] = reason;
        row[OVAL_COLUMNS.indexOf('equatorward_reason')] = reason;
        rows.push(row);
      }
    return { seq: job.seq, line: job.line, rows, found: 0, missing: rows.length * 2, warnings: [], error: reason };
  }
}
