// Types for the parts of `fmin` (general-purpose Nelder–Mead minimiser) that the tests use.
declare module 'fmin' {
  export function nelderMead(
    f: (x: number[]) => number,
    x0: number[],
    parameters?: { maxIterations?: number; minErrorDelta?: number; minTolerance?: number },
  ): { x: number[]; fx: number };
}
