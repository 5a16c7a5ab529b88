/**
 * Builds the curve view's payload for one block: the large-N S(E) and β(E)
 * curve of its level scheme, the exact finite-N staircase when `count` is
 * given, the measured point, the thermal state at the lattice temperature and
 * the formatted facts; or, for a block with errors, its first diagnostic.
 */
import type { BlockReport } from '../analyzer/analyzer';
import { finiteNCurve } from '../physics/finiteN';
import { gibbsEntropy, meanEnergy, thermalDistribution } from '../physics/entropy';
import { schemeCurve } from '../physics/curves';
import { DEFAULT_DISPLAY, type DisplayOptions } from '../present/summary';
import { displayUnitFor } from './displayUnit';
import { blockFacts } from './facts';
import { measuredPoint } from './measuredPoint';
import { measurementPlot } from './measurementPlot';
import type { CurveColumns, FiniteNColumns, ProblemPayload, ThermalMarker, ViewPayload } from './payload';

/** The note a block belongs to. */
export interface NoteSource {
  readonly uri: string;
  readonly version: number;
}

/** Options of {@link curveData}. */
export interface CurveDataOptions {
  readonly display: DisplayOptions;
  /** Points of the large-N curve (see `schemeCurve`; default 400). */
  readonly points: number;
}

/** Defaults: the editor's default display, 400 curve points. */
export const DEFAULT_CURVE_DATA_OPTIONS: CurveDataOptions = { display: DEFAULT_DISPLAY, points: 400 };

function columns(points: readonly { energy: number; entropy: number; beta: number }[]): CurveColumns {
  return {
    energy: points.map((p) => p.energy),
    entropy: points.map((p) => p.entropy),
    beta: points.map((p) => p.beta),
  };
}

/**
 * The exact finite-N curve of two levels (lower E₀, g₀; upper E₁, g₁; gap ε):
 * S/(Nk) = [ln C(N, m) + m ln g₁ + (N − m) ln g₀]/N at E = E₀ + mε/N, and
 * β = β_C + ln(g₁/g₀)/ε, where ln C(N, m)/N and β_C come from `finiteNCurve`.
 * The degeneracy terms count the states within each level, so the staircase
 * approaches the large-N curve; with g₀ = g₁ = 1 it is ln C(N, m)/N itself.
 */
function twoLevelFiniteN(n: number, energies: readonly number[], g: readonly number[]): FiniteNColumns | null {
  const gap = energies[1]! - energies[0]!;
  const steps = finiteNCurve(n, gap);
  if (!steps) return null;
  const lnG0 = Math.log(g[0]!);
  const lnG1 = Math.log(g[1]!);
  const shift = (lnG1 - lnG0) / gap;
  return {
    n,
    m: steps.map((p) => p.m),
    energy: steps.map((p) => energies[0]! + p.energy),
    entropy: steps.map((p) => p.entropy + (p.m * lnG1 + (n - p.m) * lnG0) / n),
    beta: steps.map((p) => p.beta + shift),
  };
}

/** The thermal state at the lattice temperature T_L (K), or null. */
function thermalAt(temperature: number, energies: readonly number[], g: readonly number[]): ThermalMarker | null {
  const beta = 1 / temperature;
  const q = thermalDistribution(energies, g, beta);
  const energy = q ? meanEnergy(q, energies) : null;
  const entropy = q ? gibbsEntropy(q, g) : null;
  return energy !== null && entropy !== null ? { temperature, beta, energy, entropy } : null;
}

/** The payload for a block with an error: its first error (by position), or its first problem. */
function problemPayload(report: BlockReport, source: NoteSource): ProblemPayload {
  const first = report.problems.find((p) => p.severity === 'error') ?? report.problems[0];
  return {
    kind: 'problem',
    ...source,
    line: report.block.openLine,
    id: report.meta.id,
    code: first ? first.code : null,
    message: first ? first.message : 'This block has no results to draw.',
    plot: null,
  };
}

/**
 * The view payload of one block. Never throws: a block with errors gives its
 * first error, a scheme the curve cannot be computed for (fewer than two
 * levels, a time series only) a problem payload with `code` null.
 */
export function curveData(
  report: BlockReport,
  source: NoteSource,
  options: CurveDataOptions = DEFAULT_CURVE_DATA_OPTIONS,
): ViewPayload {
  const { input, results } = report;
  if (report.status === 'invalid' || !input || !results) return problemPayload(report, source);
  const line = report.block.openLine;
  const plot = measurementPlot(input, results);
  if (input.lines) {
    // The lines sample only the upper levels of the species: they are no distribution over a level scheme.
    const message =
      'Emission lines sample the upper levels only, so there is no S(E) curve of a level scheme; the Boltzmann plot shows the fit.';
    return { kind: 'problem', ...source, line, id: report.meta.id, code: null, message, plot };
  }
  const energies = input.levels.map((l) => l.energy);
  const g = input.levels.map((l) => l.g);
  const curve = schemeCurve(energies, g, { points: options.points });
  const saturationEnergy = meanEnergy(g, energies);
  if (!curve || saturationEnergy === null) {
    const message = plot
      ? 'A time series alone has no level scheme, so there is no S(E) curve; the fit and its residuals are drawn.'
      : 'This block has no level scheme with two or more levels, so there is no S(E) curve to draw.';
    return { kind: 'problem', ...source, line, id: report.meta.id, code: null, message, plot };
  }
  const notes: string[] = [];
  let finiteN: FiniteNColumns | null = null;
  if (input.count !== null && input.levels.length === 2) finiteN = twoLevelFiniteN(input.count, energies, g);
  else if (input.count !== null) {
    notes.push(
      `The exact finite-N curve is drawn for two-level schemes only; this scheme has ${input.levels.length} levels, so only the large-N curve is shown.`,
    );
  }
  const measured = measuredPoint(input, results);
  if (!measured) notes.push('The block gives no distribution over its levels, so no measured point is drawn.');
  else if (measured.uEnergy === null)
    notes.push('E has no error bar: the inputs carry no complete set of uncertainties to propagate.');
  const thermal = input.lattice ? thermalAt(input.lattice.value, energies, g) : null;
  return {
    kind: 'curve',
    ...source,
    line,
    id: report.meta.id ?? `block at line ${line + 1}`,
    status: results.status,
    unit: displayUnitFor(input.energyUnit),
    scheme: { energies, g },
    saturationEnergy,
    maxEntropy: Math.log(g.reduce((a, b) => a + b, 0)),
    curve: columns(curve),
    finiteN,
    measured,
    thermal,
    facts: blockFacts(results, measured, thermal, input.count, options.display),
    notes,
    plot,
  };
}
