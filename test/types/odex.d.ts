// Local declaration for odex 2.0.4 (its shipped .ts source breaks strict checks).
// Checked against node_modules/odex/src/odex.ts: the constructor takes only the
// dimension; options are public properties set on the instance; solve() takes
// the derivative each call and returns { y, outcome, nStep, xEnd, nAccept, nReject, nEval }
// (xEnd is the requested end, also on an early return).
declare module 'odex' {
  /** y' = f(x, y); must return a new array of length n. */
  export type Derivative = (x: number, y: number[]) => number[];
  /** Called after each accepted step; return false to stop the integration. */
  export type OutputFunction = (
    nr: number,
    xOld: number,
    x: number,
    y: number[],
    dense?: (component: number, x: number) => number,
  ) => boolean | void;
  export enum Outcome {
    Converged = 0,
    MaxStepsExceeded = 1,
    EarlyReturn = 2,
  }
  export interface Result {
    y: number[];
    outcome: Outcome;
    nStep: number;
    xEnd: number;
    nAccept: number;
    nReject: number;
    nEval: number;
  }
  export class Solver {
    constructor(n: number);
    n: number;
    uRound: number;
    maxSteps: number;
    initialStepSize: number;
    /** 0 means xEnd − x. */
    maxStepSize: number;
    maxExtrapolationColumns: number;
    stepSizeSequence: number;
    stabilityCheckCount: number;
    stabilityCheckTableLines: number;
    denseOutput: boolean;
    denseOutputErrorEstimator: boolean;
    denseComponents: number[] | undefined;
    interpolationFormulaDegree: number;
    stepSizeReductionFactor: number;
    stepSizeFac1: number;
    stepSizeFac2: number;
    stepSizeFac3: number;
    stepSizeFac4: number;
    stepSafetyFactor1: number;
    stepSafetyFactor2: number;
    relativeTolerance: number | number[];
    absoluteTolerance: number | number[];
    debug: boolean;
    grid(dt: number, out: (xOut: number, yOut: number[]) => unknown): OutputFunction;
    solve(f: Derivative, x0: number, y0: number[], xEnd: number, solOut?: OutputFunction): Result;
    static stepSizeSequence(nSeq: number, n: number): number[];
  }
}
