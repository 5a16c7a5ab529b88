/**
 * The last word on a block that read without errors but gives no β: when the
 * numbers are all finite and positive yet their quotient is not (a gap of
 * 5e-324 K beside a ratio of 0.5 makes |β| pass the largest double; a field of
 * 1e-320 T makes the Zeeman spacing underflow to 0), nothing upstream has a
 * fault to name, and without this the status rules would fall through to a
 * `non-thermal` (or, for a signal, a `saturated`) that nothing explains.
 */
import type { BlockInput } from '../block/input';
import type { Problem, Span } from '../types';

/** The span of what was measured, for the diagnostic: the value that meets the spacing in β. */
function measuredSpan(input: BlockInput): Span {
  return (
    input.polarization?.span ??
    input.ratio?.span ??
    input.signal?.span ??
    input.lines?.lines[0]?.span ??
    input.levels.find((l) => l.populationSpan)?.populationSpan ??
    input.levels.find((l) => l.span)?.span ?? { start: 0, end: 1 }
  );
}

/** The spread of the energies β is taken over, in K: the spin's spacing, the gap, or highest less lowest. */
function energySpread(input: BlockInput): number {
  if (input.spin) return input.spin.spacing;
  const energies = input.lines ? input.lines.lines.map((l) => l.upper) : input.levels.map((l) => l.energy);
  if (energies.length === 0) return NaN;
  // A loop, not Math.max(...energies): spreading passes every energy as an argument and overflows the stack
  // for a block of a few hundred thousand levels.
  let [low, high] = [Infinity, -Infinity];
  for (const e of energies) [low, high] = [Math.min(low, e), Math.max(high, e)];
  return high - low;
}

/**
 * The `beta-out-of-range` error for a block whose measurement gives no β although
 * nothing was reported about it; null when β is there or a problem already says why.
 */
export function betaOutOfRange(input: BlockInput, problems: readonly Problem[]): Problem | null {
  if (problems.some((p) => p.severity === 'error')) return null;
  const spread = energySpread(input);
  const shown = Number.isFinite(spread) ? `${spread.toPrecision(3)} K` : 'not a finite number';
  return {
    severity: 'error',
    code: 'beta-out-of-range',
    message:
      `No temperature can be computed from these numbers in double precision: the energies are ${shown} apart, ` +
      'and beside what was measured β would be infinite, 0/0, or set by the rounding of their last digits. ' +
      'Check the units of the gap, field, frequency or energies.',
    span: measuredSpan(input),
  };
}
