/**
 * The uncertainty budget of a block: how much each input's stated standard
 * uncertainty adds to u(β), u(P), u(P_th) and u(ε).
 *
 * Method: the law of propagation of uncertainty for uncorrelated inputs
 * (GUM, JCGM 100:2008, §5.1.2, eq. (10)), one line per input, each line the
 * contribution |c_i|·u(x_i) (§5.1.3). The measured populations (or the given
 * polarization, ratio, signals or line intensities) are propagated
 * analytically where the results are computed, and form one line. The
 * scalar inputs that reach the results along several paths (the lattice
 * temperature through P_th; the level spacing from `field`, `frequency` or
 * `gap` through both β and P_th) get their sensitivity coefficients
 * numerically, by a central difference with a relative step of 10⁻⁶
 * (JCGM 100:2008 §5.1.3, note 2, allows sensitivity coefficients found
 * numerically), so that every path and the correlation between paths is
 * counted once: the spacing's share of a thermal-reference β largely cancels,
 * as it should, since β ∝ P_th/ΔE does not depend on ΔE to first order at high temperature.
 */
import type { BlockInput } from '../block/input';
import type { Measured } from '../types';

/**
 * Which input a budget line stands for: the measurement itself, the level
 * spacing (`field`, `frequency`, `gap`, or two levels' energies), `lattice`,
 * the energies of three or more levels, or the level spacing (its `field` or
 * `frequency`) of a thermal reference taken from another run.
 */
export type BudgetSource = 'measurement' | 'spacing' | 'lattice' | 'energies' | 'reference-spacing';

/** One input's contributions |c_i|·u(x_i) to each result; null where the result does not exist. */
export interface BudgetLine {
  readonly source: BudgetSource;
  readonly beta: number | null;
  readonly polarization: number | null;
  readonly thermalPolarization: number | null;
  readonly enhancement: number | null;
}

/** The values a perturbed evaluation returns (no uncertainties). */
export interface CoreValues {
  readonly beta: number | null;
  readonly polarization: number | null;
  readonly thermalPolarization: number | null;
  readonly enhancement: number | null;
}

/** Relative step of the central differences. */
const STEP = 1e-6;

/** The input with the stated uncertainties of `lattice` and the level spacing removed: what the analytic propagation sees. */
export function withoutScalarUncertainties(input: BlockInput): BlockInput {
  const lattice =
    input.lattice && input.lattice.uncertainty !== null ? { ...input.lattice, uncertainty: null } : input.lattice;
  const spin = input.spin && input.spin.uSpacing !== null ? { ...input.spin, uSpacing: null } : input.spin;
  if (lattice === input.lattice && spin === input.spin && input.uGap === null) return input;
  return { ...input, lattice, spin, uGap: null };
}

/** The input with its lattice temperature set to T (K). */
function withLattice(input: BlockInput, t: number): BlockInput {
  return { ...input, lattice: input.lattice ? { ...input.lattice, value: t } : null };
}

/** The input with every level spacing scaled by `factor` (energies, the spin's spacing, frequency and field). */
function withSpacingScaled(input: BlockInput, factor: number): BlockInput {
  const levels = input.levels.map((l) => ({ ...l, energy: l.energy * factor }));
  const spin = input.spin
    ? {
        ...input.spin,
        spacing: input.spin.spacing * factor,
        frequency: input.spin.frequency * factor,
        field: input.spin.field === null ? null : input.spin.field * factor,
      }
    : null;
  return { ...input, levels, spin };
}

/** The input with the spacing of its thermal reference run (`thermal: { run: … }`) scaled by `factor`. */
function withReferenceSpacingScaled(input: BlockInput, factor: number): BlockInput {
  const signal = input.signal;
  const ref = signal?.thermalRun;
  if (!signal || !ref) return input;
  const spin = {
    ...ref.spin,
    spacing: ref.spin.spacing * factor,
    frequency: ref.spin.frequency * factor,
    field: ref.spin.field === null ? null : ref.spin.field * factor,
  };
  return { ...input, signal: { ...signal, thermalRun: { ...ref, spin } } };
}

/** The level spacing of a two-level or spin block, K, with its stated standard uncertainty; null when none is stated. */
function spacingOf(input: BlockInput): { value: number; u: number } | null {
  if (input.spin) {
    const u = input.spin.uSpacing;
    return u !== null && u > 0 ? { value: input.spin.spacing, u } : null;
  }
  if (input.uGap === null || !(input.uGap > 0) || input.levels.length !== 2) return null;
  return { value: input.levels[1].energy - input.levels[0].energy, u: input.uGap };
}

/** |∂f/∂x|·u from f at x(1 ± STEP): null where either side is undefined. */
function share(plus: number | null, minus: number | null, x: number, u: number): number | null {
  if (plus === null || minus === null) return null;
  const c = (plus - minus) / (2 * STEP * x);
  const v = Math.abs(c) * u;
  return Number.isFinite(v) ? v : null;
}

function lineFrom(source: BudgetSource, plus: CoreValues, minus: CoreValues, x: number, u: number): BudgetLine {
  return {
    source,
    beta: share(plus.beta, minus.beta, x, u),
    polarization: share(plus.polarization, minus.polarization, x, u),
    thermalPolarization: share(plus.thermalPolarization, minus.thermalPolarization, x, u),
    enhancement: share(plus.enhancement, minus.enhancement, x, u),
  };
}

/**
 * The lines of the scalar inputs that carry a stated uncertainty (`lattice`,
 * the spacing), each from two evaluations of the block at x(1 ± 10⁻⁶).
 */
export function scalarLines(input: BlockInput, evaluate: (input: BlockInput) => CoreValues): BudgetLine[] {
  const lines: BudgetLine[] = [];
  const exact = withoutScalarUncertainties(input);
  const spacing = spacingOf(input);
  if (spacing) {
    const plus = evaluate(withSpacingScaled(exact, 1 + STEP));
    const minus = evaluate(withSpacingScaled(exact, 1 - STEP));
    lines.push(lineFrom('spacing', plus, minus, spacing.value, spacing.u));
  }
  // A thermal reference by run: P_th is the reference's, at its own field, whose stated uncertainty enters too.
  const ref = input.signal?.thermalRun?.spin;
  if (ref && ref.uSpacing !== null && ref.uSpacing > 0) {
    const plus = evaluate(withReferenceSpacingScaled(exact, 1 + STEP));
    const minus = evaluate(withReferenceSpacingScaled(exact, 1 - STEP));
    lines.push(lineFrom('reference-spacing', plus, minus, ref.spacing, ref.uSpacing));
  }
  const lattice = input.lattice;
  if (lattice && lattice.uncertainty !== null && lattice.uncertainty > 0 && lattice.value > 0) {
    const plus = evaluate(withLattice(exact, lattice.value * (1 + STEP)));
    const minus = evaluate(withLattice(exact, lattice.value * (1 - STEP)));
    lines.push(lineFrom('lattice', plus, minus, lattice.value, lattice.uncertainty));
  }
  return lines;
}

/**
 * The share of the level energies' stated uncertainties in u(β) of a
 * Boltzmann fit of three or more levels, analytically: the fit's slope
 * b = S_xy/S_xx of y = ln(n/g) against x = E, weighted by w = (n/u(n))² when
 * every used level has u(n) > 0 (else w = 1, as the fit does), has
 * ∂b/∂x_i = w_i[(y_i − ȳ) − 2b(x_i − x̄)]/S_xx (the x̄ and ȳ terms cancel
 * because Σw(x − x̄) = Σw(y − ȳ) = 0); β = −b. One O(n) pass, so any number of
 * levels is safe. Null when no used level states an energy uncertainty.
 */
export function energiesLine(input: BlockInput): BudgetLine | null {
  const levels = input.levels;
  if (levels.length < 3 || !levels.some((l) => (l.uEnergy ?? 0) > 0)) return null;
  const used = levels.filter((l) => l.population !== null && l.population > 0);
  if (used.length < 3) return null;
  const weighted = used.every((l) => l.uPopulation !== null && l.uPopulation > 0);
  const w = used.map((l) => (weighted ? (l.population! / l.uPopulation!) ** 2 : 1));
  const x = used.map((l) => l.energy);
  const y = used.map((l) => Math.log(l.population! / l.g));
  let sw = 0;
  let sx = 0;
  let sy = 0;
  for (let i = 0; i < used.length; i++) {
    sw += w[i];
    sx += w[i] * x[i];
    sy += w[i] * y[i];
  }
  const xm = sx / sw;
  const ym = sy / sw;
  let sxx = 0;
  let sxy = 0;
  for (let i = 0; i < used.length; i++) {
    sxx += w[i] * (x[i] - xm) ** 2;
    sxy += w[i] * (x[i] - xm) * (y[i] - ym);
  }
  if (!(sxx > 0)) return null;
  const b = sxy / sxx;
  const parts: number[] = [];
  for (let i = 0; i < used.length; i++) {
    const u = used[i].uEnergy ?? 0;
    if (u > 0) parts.push(Math.abs((w[i] * (y[i] - ym - 2 * b * (x[i] - xm))) / sxx) * u);
  }
  const beta = Math.hypot(...parts);
  return Number.isFinite(beta)
    ? { source: 'energies', beta, polarization: null, thermalPolarization: null, enhancement: null }
    : null;
}

type Quantity = 'beta' | 'polarization' | 'thermalPolarization' | 'enhancement';

/**
 * The combined standard uncertainty of one result, √Σ line² (GUM §5.1.2);
 * null when no line carries a contribution, or when the only contributions
 * are exact zeros of inputs that do not reach the result and the measurement gave none.
 */
export function combined(lines: readonly BudgetLine[], q: Quantity): number | null {
  const parts: number[] = [];
  for (const l of lines) {
    const v = l[q];
    if (v !== null) parts.push(v);
  }
  if (parts.length === 0) return null;
  const total = Math.hypot(...parts);
  if (total === 0 && !lines.some((l) => l.source === 'measurement' && l[q] !== null)) return null;
  return Number.isFinite(total) ? total : null;
}

/** A value with the budget's combined uncertainty (null value stays null). */
export function withBudget(value: number | null, lines: readonly BudgetLine[], q: Quantity): Measured | null {
  return value === null ? null : { value, uncertainty: combined(lines, q) };
}
