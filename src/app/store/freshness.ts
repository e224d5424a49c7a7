/**
 * Whether a result in the store matches the current inputs. A result is
 * current only when it was computed for exactly the conditions, product
 * settings, sites and view options now in the store (answeredFor holds them
 * by reference) and its channel has no error. Exports refuse stale results
 * and carry the inputs of the result, never the current ones.
 */
import type { AnsweredFor, AppState } from './index';

export type ResultKind = 'scene' | 'oval' | 'sites' | 'sweep';

const RESULT_OF: Record<ResultKind, (s: AppState) => unknown> = {
  scene: (s) => s.scene,
  oval: (s) => s.oval,
  sites: (s) => s.siteResults,
  sweep: (s) => s.sweep,
};

const WHAT: Record<ResultKind, string> = { scene: 'field lines', oval: 'boundaries', sites: 'site results', sweep: 'sweep' };

/** The inputs a result depends on, compared by reference with those it was computed for. */
function matches(kind: ResultKind, s: AppState, a: AnsweredFor): boolean {
  if (a.conditions !== s.conditions) return false;
  if (kind === 'scene') return true;
  if (a.products !== s.products) return false;
  if (kind === 'sites') return a.sites === s.sites;
  if (kind === 'sweep') return a.view.sweepVary === s.view.sweepVary && a.view.sweepMlt === s.view.sweepMlt;
  return true;
}

/** Null when the result of `kind` is present and current; otherwise why not, in one sentence. */
export function staleReason(s: AppState, kind: ResultKind): string | null {
  const err = s.errors[kind] ?? s.errors.engine;
  if (err) return `no ${WHAT[kind]} for the current inputs: ${err}`;
  const a = s.answeredFor[kind];
  if (RESULT_OF[kind](s) == null || !a) return `no ${WHAT[kind]} yet: they are being computed`;
  if (!matches(kind, s, a)) return `the ${WHAT[kind]} shown are for earlier inputs and are being recomputed; try again in a moment`;
  return null;
}

/** The inputs the current result of `kind` was computed for (null when there is none). */
export function inputsOf(s: AppState, kind: ResultKind): AnsweredFor | null {
  return s.answeredFor[kind] ?? null;
}
