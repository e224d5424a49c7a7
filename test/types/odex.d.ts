// Local declaration for odex (its shipped .ts source breaks strict checks).
declare module 'odex' {
  export type Derivative = (x: number, y: number[]) => number[];
  export interface Options {
    absoluteTolerance?: number | number[];
    relativeTolerance?: number | number[];
    maxSteps?: number;
    initialStepSize?: number;
    maxStepSize?: number;
    denseOutput?: boolean;
    [k: string]: unknown;
  }
  export enum Outcome { Converged = 0, MaxStepsExceeded = 1, EarlyReturn = 2 }
  export interface Result { x: number; y: number[]; outcome: Outcome; nStep: number; nAccept: number; nReject: number; nEval: number }
  export class Solver {
    constructor(f: Derivative, n: number, options?: Partial<Options>);
    constructor(n: number);
    solve(f: Derivative, x0: number, y0: number[], xEnd: number, solOut?: unknown): Result;
    solve(x0: number, y0: number[], xEnd: number, solOut?: unknown): Result;
    [k: string]: unknown;
  }
}
