/**
 * The results that depend on the trade a block belongs to: which words it is
 * shown in (spin temperature for spins, excitation temperature elsewhere),
 * the temperature in eV for plasmas, the limit quoted for a saturated radio
 * line, the per-line plot data of a Boltzmann plot or rotation diagram with
 * robust outlier flags and the refit without them, the warnings on a narrow
 * energy span and on a temperature below the background, and column
 * densities with a partition-function total.
 */
import type { BlockInput } from '../block/input';
import { partlyStatedLineFit, weightedLineFit, type LineFit } from '../physics/lineFit';
import { linearRotorPartition, totalColumn } from '../physics/radio';
import { KELVIN_PER_EV, KELVIN_PER_HERTZ } from '../quantities/constants';
import type { Measured, Problem } from '../types';
import { clipLine, CLIP_SIGMA, columnDigits, roundingFloor, roundingUncertainty } from './lineClipping';

/** The trade a block speaks to, decided by what it measures. */
export type Trade = 'spin' | 'emission' | 'radio' | 'optical' | 'levels';

/** Transitions below this frequency are radio (centimetre to submillimetre); common practice, no source. */
export const RADIO_BELOW_HZ = 3e12;

/** One point of a Boltzmann plot or rotation diagram. */
export interface PlotPointResult {
  /** Index in the block's levels (sorted by energy). */
  readonly index: number;
  readonly label: string | null;
  /** Upper-level energy E_u/k in K. */
  readonly energy: number;
  /** The ordinate ln(n/g) (see {@link LinePlot.ordinate}). */
  readonly y: number;
  readonly uY: number | null;
  /** y minus the fit through every point. */
  readonly residual: number;
  /** Whether the point was flagged, and on which side of the line refitted without the flagged points. */
  readonly flag: 'above' | 'below' | null;
  /** True when u(y) came from √N (photon counts written without ±). */
  readonly poisson: boolean;
}

/** The plot data of a block of lines. */
export interface LinePlot {
  /** What y is, e.g. `ln(Iλ/(gA))`. */
  readonly ordinate: string;
  /** Intercept of y at E_u = 0 and slope (= −β, K⁻¹) of the fit through every point. */
  readonly intercept: Measured;
  readonly slope: Measured;
  /** √(χ²/dof) of a weighted fit (Birge ratio), or null. */
  readonly birgeRatio: number | null;
  readonly points: readonly PlotPointResult[];
}

/** The trade's results of one block. */
export interface TradeResults {
  readonly trade: Trade;
  readonly temperatureName: 'spin temperature' | 'excitation temperature';
  /** kT in eV, for emission (plasma) blocks. */
  readonly temperatureEv: Measured | null;
  /** For a saturated radio block: |T| ≥ 1/(|β| + 2u(β)) at about 95 %, in K. */
  readonly temperatureLimit: number | null;
  readonly plot: LinePlot | null;
  /** β and T refitted without the flagged lines. */
  readonly refit: {
    readonly beta: Measured;
    readonly temperature: Measured | null;
    readonly without: readonly number[];
  } | null;
  /** Column densities (cm⁻²): the sum of the given levels, Q(T) and the total N = Q(T)·e^a. */
  readonly column: {
    readonly sum: number | null;
    readonly partition: number | null;
    readonly total: Measured | null;
  } | null;
  /** The medium the block's optical wavelengths were taken in, and whether it was stated. */
  readonly medium: { readonly kind: 'air' | 'vacuum'; readonly stated: boolean } | null;
  /** True when T came from T_B, τ and T_bg. */
  readonly fromBrightness: boolean;
}

/** The trade of a block. */
export function tradeOf(input: BlockInput): Trade {
  if (input.spin || input.form === 'spin' || input.form === 'series') return 'spin';
  if (input.lines) return input.lines.detector === 'radiometer' ? 'radio' : 'emission';
  const t = input.trade;
  if (t?.line || t?.columns || t?.rotor) return 'radio';
  if (input.form === 'transition') {
    // The unit says the trade where it can: a centimetre/millimetre wavelength below 3 THz is how radio
    // astronomers write a line, an optical wavelength (or a gain medium) is optical. A frequency alone does
    // not tell: 94 GHz is as much an electron-spin (DNP, ESR) gap as a millimetre line, so a pair given by
    // frequency is radio only with a radio key (brightness, optical depth, background, columns, rotor) and
    // otherwise stays a plain pair of levels, whose polarization per degeneracy the contract defines.
    const unit = input.energyUnit ?? '';
    const gap = input.levels[1]!.energy - input.levels[0]!.energy;
    if (RADIO_UNITS.has(unit) && gap / KELVIN_PER_HERTZ < RADIO_BELOW_HZ) return 'radio';
    if (input.gain || OPTICAL_UNITS.has(unit)) return 'optical';
  }
  return t?.background ? 'radio' : 'levels';
}

/** Units in which only radio astronomers write a gap (radio wavelengths). */
const RADIO_UNITS = new Set(['mm', 'cm']);
/** Units of an optical wavelength. */
const OPTICAL_UNITS = new Set(['nm', 'µm', 'um', 'μm', 'Å', '\u212B']);

/** What the trade step needs from the rest of the analysis. */
export interface TradeContext {
  readonly beta: Measured | null;
  readonly temperature: Measured | null;
  readonly saturated: boolean;
}

/**
 * The plot data, the flags and the refit of a block of lines; null for other blocks.
 *
 * The fit is weighted by u(y) = u(I)/I when every line states one; when only
 * some do, it is the unweighted line with u(slope) and u(intercept) from the
 * stated ones and the scatter they leave unexplained (physics/lineFit.ts,
 * partlyStatedLineFit), as the β of the block. Outliers are judged with σ of
 * each line at least its stated u(y) and the scatter the rounding of its
 * written intensity and A alone gives it (analysis/lineClipping.ts).
 */
export function linePlot(
  input: BlockInput,
  problems: Problem[],
): { plot: LinePlot; refit: TradeResults['refit']; outliers: number[] } | null {
  const lines = input.lines;
  if (!lines) return null;
  const used = input.levels.map((l, i) => ({ l, i })).filter(({ l }) => (l.population ?? 0) > 0);
  const x = used.map(({ l }) => l.energy);
  const y = used.map(({ l }) => Math.log(l.population!) - Math.log(l.g));
  const stated = used.map(({ l }) => {
    const s = l.uPopulation !== null && l.uPopulation > 0 ? l.uPopulation / l.population! : NaN;
    return Number.isFinite(s) ? s : null;
  });
  const weighted = stated.length > 0 && stated.every((s) => s !== null);
  const partial = !weighted && stated.some((s) => s !== null);
  const sig = weighted ? stated.map((s) => s!) : null;
  const fitOf = (idx: readonly number[]): LineFit | null => {
    const xs = idx.map((k) => x[k]!);
    const ys = idx.map((k) => y[k]!);
    if (partial)
      return partlyStatedLineFit(
        xs,
        ys,
        idx.map((k) => stated[k]!),
      );
    return weightedLineFit(xs, ys, sig ? idx.map((k) => sig[k]!) : null);
  };
  const all = used.map((_, k) => k);
  const full = fitOf(all);
  if (!full) return null;
  // Each point's line (levels carry their line's span), for its written numbers and its Poisson flag.
  const byspan = new Map(lines.lines.map((li) => [`${li.span.start}:${li.span.end}`, li] as const));
  const source = used.map(({ l }) => (l.span ? byspan.get(`${l.span.start}:${l.span.end}`) : undefined));
  const digitsI = columnDigits(lines.lines.map((li) => li.intensity));
  const digitsA = columnDigits(lines.lines.map((li) => li.A));
  const rounding = roundingFloor(
    x,
    source.map((li) =>
      li ? Math.hypot(roundingUncertainty(li.intensity, digitsI), roundingUncertainty(li.A, digitsA)) : 0,
    ),
  );
  const floor = partial ? rounding.map((f, k) => Math.max(f, stated[k] ?? 0)) : rounding;
  const clip = clipLine(x, y, sig, floor);
  const side = new Map<number, number>();
  clip.flagged.forEach((k, j) => side.set(used[k]!.i, clip.deviations[j]!));
  const points: PlotPointResult[] = used.map(({ l, i }, k) => ({
    index: i,
    label: l.label,
    energy: l.energy,
    y: y[k]!,
    uY: stated[k] ?? null,
    residual: full.residuals[k]!,
    flag: side.has(i) ? (side.get(i)! > 0 ? 'above' : 'below') : null,
    poisson: source[k]?.poisson === true,
  }));
  for (const [i, d] of side) {
    const l = input.levels[i]!;
    problems.push({
      severity: 'warning',
      code: 'line-outlier',
      // Each side's reading is a whole sentence of its own, its full stop or question mark included.
      message: `This line lies ${Math.abs(d).toFixed(1)} σ ${d > 0 ? 'above' : 'below'} the line refitted without the flagged lines (more than ${CLIP_SIGMA} σ): ${d < 0 ? 'self-absorption pulls a line below, and so can a wrong A or g.' : 'a blend, or a wrong A or g?'}`,
      span: l.span!,
    });
  }
  const c = clip.flagged.length > 0 ? fitOf(all.filter((k) => !clip.flagged.includes(k))) : null;
  let refit: TradeResults['refit'] = null;
  if (c) {
    const beta: Measured = { value: -c.slope + 0, uncertainty: c.uSlope };
    const t = beta.value !== 0 ? 1 / beta.value : null;
    refit = {
      beta,
      temperature:
        t === null
          ? null
          : { value: t, uncertainty: beta.uncertainty === null ? null : beta.uncertainty / (beta.value * beta.value) },
      without: [...side.keys()].sort((a, b) => a - b),
    };
  }
  const ordinate =
    lines.detector === 'energy'
      ? 'ln(Iλ/(gA))'
      : lines.detector === 'photon'
        ? 'ln(I/(gA))'
        : 'ln(N_u/g_u), N_u in cm⁻²';
  return {
    plot: {
      ordinate,
      intercept: { value: full.intercept, uncertainty: full.uIntercept },
      slope: { value: full.slope, uncertainty: full.uSlope },
      birgeRatio: full.weighted && full.dof > 0 ? Math.sqrt(full.chi2 / full.dof) : null,
      points,
    },
    refit,
    outliers: [...side.keys()].sort((a, b) => a - b),
  };
}

/**
 * The trade's results once β and T are known: names, eV, the saturated
 * radio limit, column densities, and the span and background warnings.
 */
export function tradeResults(
  input: BlockInput,
  ctx: TradeContext,
  lines: ReturnType<typeof linePlot>,
  problems: Problem[],
): TradeResults {
  const trade = tradeOf(input);
  const t = ctx.temperature;
  const beta = ctx.beta;
  const temperatureEv =
    trade === 'emission' && t && t.value !== 0
      ? { value: t.value / KELVIN_PER_EV, uncertainty: t.uncertainty === null ? null : t.uncertainty / KELVIN_PER_EV }
      : null;
  // GUM k = 2 (about 95 %): where β's interval holds 0, all that is known is |T| ≥ 1/(|β| + 2u(β)).
  const temperatureLimit =
    trade === 'radio' && ctx.saturated && beta && beta.uncertainty !== null && beta.uncertainty > 0
      ? 1 / (Math.abs(beta.value) + 2 * beta.uncertainty)
      : null;
  spanWarning(input, beta, problems);
  backgroundWarning(input, t, ctx.saturated, problems);
  const column = columnOf(input, t, lines?.plot ?? null);
  const medium = input.trade?.medium ?? null;
  // Most blocks add nothing but their words: they share one frozen result per trade (results stay cached per block).
  if (!lines && !column && !medium && temperatureEv === null && temperatureLimit === null && !input.trade?.line)
    return PLAIN[trade];
  return {
    trade,
    temperatureName: trade === 'spin' ? 'spin temperature' : 'excitation temperature',
    temperatureEv,
    temperatureLimit,
    plot: lines?.plot ?? null,
    refit: lines?.refit ?? null,
    column,
    medium,
    fromBrightness: !!input.trade?.line,
  };
}

/** The result of a block whose trade adds nothing but its words. */
function plain(trade: Trade): TradeResults {
  return Object.freeze({
    trade,
    temperatureName: trade === 'spin' ? 'spin temperature' : 'excitation temperature',
    temperatureEv: null,
    temperatureLimit: null,
    plot: null,
    refit: null,
    column: null,
    medium: null,
    fromBrightness: false,
  });
}

const PLAIN: Readonly<Record<Trade, TradeResults>> = {
  spin: plain('spin'),
  emission: plain('emission'),
  radio: plain('radio'),
  optical: plain('optical'),
  levels: plain('levels'),
};

/**
 * A Boltzmann plot whose upper levels span less than kT defines its slope
 * poorly: the lines differ in e^(−E/kT) by less than a factor e. Common
 * practice, no source for the factor (Aguilera & Aragón, Spectrochim. Acta B
 * 63, 893 (2008) discuss why a wide span matters).
 */
function spanWarning(input: BlockInput, beta: Measured | null, problems: Problem[]): void {
  const lines = input.lines;
  if (!lines || !beta || !(beta.value > 0)) return;
  const energies = input.levels.map((l) => l.energy);
  // Loops, not spreads: a ladder of a few hundred thousand levels would overflow the stack.
  const span =
    energies.reduce((m, x) => Math.max(m, x), -Infinity) - energies.reduce((m, x) => Math.min(m, x), Infinity);
  const kT = 1 / beta.value;
  if (!(span < kT)) return;
  const first = lines.lines[0]!.span;
  problems.push({
    severity: 'warning',
    code: 'energy-span-small',
    message: `The upper-level energies span ${(span / KELVIN_PER_EV).toPrecision(3)} eV, less than kT = ${(kT / KELVIN_PER_EV).toPrecision(3)} eV: the slope, and so the temperature, is poorly defined. Add lines from higher or lower levels.`,
    span: first,
  });
}

/** A positive excitation temperature below the radiation background it sits in is suspicious (a ratio upside down?). */
function backgroundWarning(input: BlockInput, t: Measured | null, saturated: boolean, problems: Problem[]): void {
  const bg = input.trade?.background;
  if (!bg || !t || saturated || !(t.value > 0) || !(t.value < bg.value)) return;
  problems.push({
    severity: 'warning',
    code: 'temperature-below-background',
    message: `The excitation temperature ${t.value.toPrecision(3)} K is below the background of ${bg.value.toPrecision(4)} K: radiation alone would hold the levels at least that warm. Is a ratio written upside down (n_upper / n_lower is asked for), or the levels swapped?`,
    span: bg.span,
  });
}

/** Column densities: the sum of the levels given in cm⁻², and with a rotor the partition-function total. */
function columnOf(input: BlockInput, t: Measured | null, plot: LinePlot | null): TradeResults['column'] {
  const columns = input.trade?.columns || input.lines?.detector === 'radiometer';
  if (!columns) return null;
  const sum = input.trade?.columns ? input.levels.reduce((acc, l) => acc + (l.population ?? 0), 0) : null;
  const rotor = input.trade?.rotor;
  const q = rotor && t && t.value > 0 ? linearRotorPartition(t.value, rotor.value) : null;
  let total: Measured | null = null;
  if (q !== null && t) {
    if (plot) total = totalColumn(plot.intercept.value, plot.intercept.uncertainty, q);
    else {
      // Levels given directly: a = ln(N_i/g_i) + E_i/T from the lowest measured level (energies from the ground).
      const l = input.levels.find((x) => (x.population ?? 0) > 0);
      if (l) total = totalColumn(Math.log(l.population! / l.g) + l.energy / t.value, null, q);
    }
  }
  return { sum, partition: q, total };
}
