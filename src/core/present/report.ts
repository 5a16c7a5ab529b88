/**
 * The machine contract of `boltzmark report --format json`: one object per
 * block with the contract's fields, unknown quantities `null` (never missing),
 * lines 1-based. The v1.1 fields (`timeConstant`, `gainCoefficient`,
 * `singlePassGain`, `aboveThreshold`) follow the contract's measurement inputs;
 * the v1.2 `interval` of `beta`, `temperature` and `polarization` its "Honest
 * intervals" section; `form`, `fit`, `invertedPairs`, `birge`,
 * `thermalPolarizationUncertainty`, `enhancementUncertainty` and the gain's
 * `inversionDensity`, `thresholdInversion` and `singlePassGainDb` are
 * Boltzmark's own extensions (added fields only: nothing is renamed or removed).
 */
import { spectraEntries, type SpectrumEntry } from './spectraReport';
import type { BlockReport } from '../analyzer/analyzer';
import type { LineIndex } from '../text/lineIndex';
import { KELVIN_PER_EV } from '../quantities/constants';
import type { Measured, Severity, Status } from '../types';

/** One diagnostic as the report prints it. */
export interface ReportDiagnostic {
  readonly severity: Severity;
  readonly code: string;
  readonly message: string;
  /** 1-based line in the note. */
  readonly line: number;
  /** 1-based column (UTF-16 units), an extension for editors and CI annotations. */
  readonly column: number;
}

/** A result with its standard uncertainty and its k = 2 coverage interval (null without an uncertainty). */
export interface IntervalMeasured extends Measured {
  readonly interval: readonly [number, number] | null;
}

/** One block as the JSON report prints it. */
export interface ReportEntry {
  readonly file: string;
  /** 1-based line of the opening fence; in a notebook, within its cell. */
  readonly line: number;
  /** 1-based number of the notebook cell holding the block (among all cells), or null in a Markdown note. */
  readonly cell: number | null;
  readonly id: string | null;
  readonly status: Status;
  readonly beta: IntervalMeasured | null;
  readonly temperature: IntervalMeasured | null;
  readonly polarization: IntervalMeasured | null;
  readonly thermalPolarization: number | null;
  readonly enhancement: number | null;
  readonly entropy: number | null;
  readonly diagnostics: readonly ReportDiagnostic[];
  /** T₁ or τ of a time series, s (v1.1). */
  readonly timeConstant: Measured | null;
  /** Small-signal gain coefficient g₀, cm⁻¹ (v1.1). */
  readonly gainCoefficient: number | null;
  /** Standard uncertainty of g₀ from the densities' uncertainties, cm⁻¹. */
  readonly gainCoefficientUncertainty: number | null;
  readonly singlePassGain: number | null;
  readonly singlePassGainUncertainty: number | null;
  /** Threshold gain coefficient g_th, cm⁻¹ (needs length and mirrors). */
  readonly thresholdGain: number | null;
  readonly aboveThreshold: boolean | null;
  readonly form: string | null;
  readonly fit: { readonly chi2: number; readonly dof: number; readonly consistent: boolean } | null;
  readonly invertedPairs: readonly [number, number][];
  /** The block's trade (`spin`, `emission`, `radio`, `optical`, `levels`), or null for an invalid block. */
  readonly trade: string | null;
  /** `spin temperature` or `excitation temperature`: what `temperature` is called in the block's trade. */
  readonly temperatureName: string | null;
  /** kT in eV beside the temperature, for emission (plasma) blocks. */
  readonly temperatureEv: Measured | null;
  /** For a saturated radio block, |T| ≥ this many K at about 95 % (1/(|β| + 2u(β))). */
  readonly temperatureAbove: number | null;
  /** The per-line plot data and intercept of a block of lines, or null. */
  readonly plot: {
    readonly ordinate: string;
    readonly intercept: Measured;
    readonly slope: Measured;
    readonly birgeRatio: number | null;
    readonly points: readonly {
      readonly label: string | null;
      readonly upperEnergy: number;
      readonly upperEnergyEv: number;
      readonly y: number;
      readonly uncertainty: number | null;
      readonly residual: number;
      readonly flag: 'above' | 'below' | null;
      readonly poisson: boolean;
    }[];
  } | null;
  /** β and T refitted without the flagged lines (`without`: level indices), or null. */
  readonly refit: {
    readonly beta: Measured;
    readonly temperature: Measured | null;
    readonly without: readonly number[];
  } | null;
  /** Column densities in cm⁻², or null: the sum of the given levels, Q(T), and the total Q(T)·e^a. */
  readonly columnDensity: {
    readonly sum: number | null;
    readonly partitionFunction: number | null;
    readonly total: Measured | null;
  } | null;
  /** `air` or `vacuum` for blocks with optical wavelengths, and whether the block stated it. */
  readonly wavelengths: { readonly medium: 'air' | 'vacuum'; readonly stated: boolean } | null;
  /** The block's spectrum references in text order, empty when none (v1.2). */
  readonly spectra: readonly SpectrumEntry[];
  /** Standard uncertainty of P_th from u(lattice) and u(field/frequency/gap), or null. */
  readonly thermalPolarizationUncertainty: number | null;
  /** Standard uncertainty of ε from every stated input uncertainty, or null. */
  readonly enhancementUncertainty: number | null;
  /** Weighted fits with χ²/dof > 1: the Birge ratio and u(β) scaled by it; otherwise null. */
  readonly birge: { readonly ratio: number; readonly betaUncertainty: number } | null;
  /** Gain form: N_u − (g_u/g_l)·N_l, cm⁻³. */
  readonly inversionDensity: number | null;
  /** Gain form with length and mirrors: g_th/σ, cm⁻³. */
  readonly thresholdInversion: number | null;
  /** Gain form with a length: 10 log₁₀ of the single-pass gain. */
  readonly singlePassGainDb: number | null;
  /**
   * `extrapolate:` (v1.2): P at `time` (s) with its standard uncertainty; Boltzmark adds `from` (s) and the
   * `decay` time constant T₁ used (s, with the id of the decay run it came from, or null when typed).
   */
  readonly polarizationAt: {
    readonly time: number;
    readonly value: number;
    readonly uncertainty: number | null;
    readonly from: number;
    readonly decay: { readonly value: number; readonly uncertainty: number | null; readonly run: string | null };
  } | null;
  /** The run a thermal reference was taken from (`thermal: { run: … }`), with its date, or null. */
  readonly thermalReference: { readonly id: string; readonly date: string | null } | null;
}

const finite = (x: number | null | undefined): number | null =>
  x !== null && x !== undefined && Number.isFinite(x) ? x : null;
const measured = (m: Measured | null): Measured | null =>
  m && Number.isFinite(m.value) ? { value: m.value, uncertainty: finite(m.uncertainty) } : null;

const withInterval = (m: Measured | null, interval: readonly [number, number] | null): IntervalMeasured | null => {
  const base = measured(m);
  if (!base) return null;
  const usable = base.uncertainty !== null && interval !== null && interval.every(Number.isFinite);
  return { ...base, interval: usable ? [interval[0], interval[1]] : null };
};

/** Converts one analysed block to its report entry. */
export function reportEntry(file: string, b: BlockReport, lines: LineIndex, cell: number | null = null): ReportEntry {
  const r = b.results;
  return {
    file,
    line: b.block.openLine + 1,
    cell,
    spectra: spectraEntries(b.meta),
    id: b.meta.id,
    status: b.status,
    beta: r ? withInterval(r.beta, r.intervals.beta) : null,
    temperature: r ? withInterval(r.temperature, r.intervals.temperature) : null,
    polarization: r ? withInterval(r.polarization, r.intervals.polarization) : null,
    thermalPolarization: finite(r?.thermalPolarization),
    enhancement: finite(r?.enhancement),
    entropy: finite(r?.entropy),
    diagnostics: b.problems.map((p) => {
      const pos = lines.positionAt(p.span.start);
      return { severity: p.severity, code: p.code, message: p.message, line: pos.line + 1, column: pos.character + 1 };
    }),
    timeConstant: r?.series ? measured(r.series.timeConstant) : null,
    gainCoefficient: finite(r?.gain?.coefficient),
    gainCoefficientUncertainty: finite(r?.gain?.uCoefficient),
    singlePassGain: finite(r?.gain?.singlePass),
    singlePassGainUncertainty: finite(r?.gain?.uSinglePass),
    thresholdGain: finite(r?.gain?.threshold),
    aboveThreshold: r?.gain?.aboveThreshold ?? null,
    form: b.input?.form ?? null,
    fit: r?.fit ? { chi2: r.fit.chi2, dof: r.fit.dof, consistent: r.fit.consistent } : null,
    invertedPairs: r ? r.invertedPairs.map((p) => [p.lower, p.upper] as [number, number]) : [],
    ...uncertaintyEntry(r),
    ...tradeEntry(r),
    ...runEntry(r),
  };
}

/** The fields of values taken from other runs and of `extrapolate:` (null where they do not apply). */
function runEntry(r: BlockReport['results']): Pick<ReportEntry, 'polarizationAt' | 'thermalReference'> {
  const at = r?.polarizationAt;
  const run = r?.signal?.thermalRun;
  return {
    polarizationAt:
      at && Number.isFinite(at.value)
        ? {
            time: at.time,
            value: at.value,
            uncertainty: finite(at.uncertainty),
            from: at.from,
            decay: { value: at.decay.value, uncertainty: finite(at.decay.uncertainty), run: at.decay.run },
          }
        : null,
    thermalReference: run ? { id: run.id, date: run.date } : null,
  };
}

/** The fields the block's trade adds to its entry (all null for an invalid block). */
function tradeEntry(
  r: BlockReport['results'],
): Pick<
  ReportEntry,
  | 'trade'
  | 'temperatureName'
  | 'temperatureEv'
  | 'temperatureAbove'
  | 'plot'
  | 'refit'
  | 'columnDensity'
  | 'wavelengths'
> {
  const t = r?.trade;
  const p = t?.plot;
  return {
    trade: t?.trade ?? null,
    temperatureName: t?.temperatureName ?? null,
    temperatureEv: t ? measured(t.temperatureEv) : null,
    temperatureAbove: finite(t?.temperatureLimit),
    plot: p
      ? {
          ordinate: p.ordinate,
          intercept: measured(p.intercept)!,
          slope: measured(p.slope)!,
          birgeRatio: finite(p.birgeRatio),
          points: p.points.map((q) => ({
            label: q.label,
            upperEnergy: q.energy,
            upperEnergyEv: q.energy / KELVIN_PER_EV,
            y: q.y,
            uncertainty: finite(q.uY),
            residual: q.residual,
            flag: q.flag,
            poisson: q.poisson,
          })),
        }
      : null,
    refit: t?.refit
      ? { beta: measured(t.refit.beta)!, temperature: measured(t.refit.temperature), without: [...t.refit.without] }
      : null,
    columnDensity: t?.column
      ? {
          sum: finite(t.column.sum),
          partitionFunction: finite(t.column.partition),
          total: measured(t.column.total),
        }
      : null,
    wavelengths: t?.medium ? { medium: t.medium.kind, stated: t.medium.stated } : null,
  };
}

/** The uncertainty fields of an entry: u(P_th), u(ε), the Birge-scaled u(β), and the gain's inversion figures. */
function uncertaintyEntry(
  r: BlockReport['results'],
): Pick<
  ReportEntry,
  | 'thermalPolarizationUncertainty'
  | 'enhancementUncertainty'
  | 'birge'
  | 'inversionDensity'
  | 'thresholdInversion'
  | 'singlePassGainDb'
> {
  return {
    thermalPolarizationUncertainty: finite(r?.uThermalPolarization),
    enhancementUncertainty: finite(r?.enhancementUncertainty),
    birge:
      r?.birge && r.birge.beta.uncertainty !== null
        ? { ratio: r.birge.ratio, betaUncertainty: r.birge.beta.uncertainty }
        : null,
    inversionDensity: finite(r?.gain?.inversion),
    thresholdInversion: finite(r?.gain?.thresholdInversion),
    singlePassGainDb: finite(r?.gain?.singlePassDb),
  };
}

/**
 * The entry of a file the command line could not read: it stands where the
 * file's blocks would, so no result is silently missing. `line` is 1, every
 * quantity null, the status `invalid`, and one `file-unreadable` error says
 * why (the reason is the host's: the core reads no files).
 */
export function unreadableEntry(file: string, reason: string): ReportEntry {
  return {
    file,
    line: 1,
    cell: null,
    id: null,
    status: 'invalid',
    beta: null,
    temperature: null,
    polarization: null,
    thermalPolarization: null,
    enhancement: null,
    entropy: null,
    diagnostics: [{ severity: 'error', code: 'file-unreadable', message: reason, line: 1, column: 1 }],
    timeConstant: null,
    gainCoefficient: null,
    gainCoefficientUncertainty: null,
    singlePassGain: null,
    singlePassGainUncertainty: null,
    thresholdGain: null,
    aboveThreshold: null,
    form: null,
    fit: null,
    invertedPairs: [],
    spectra: [],
    ...uncertaintyEntry(null),
    ...tradeEntry(null),
    ...runEntry(null),
  };
}

/**
 * The warning for a byte sequence that is not UTF-8, at its place in the note
 * (where its U+FFFD now stands), naming the byte offset in the file.
 */
export function notUtf8Diagnostic(byte: number, offset: number, count: number, lines: LineIndex): ReportDiagnostic {
  const pos = lines.positionAt(offset);
  const more = count > 1 ? ` (and ${count - 1} more in this block)` : '';
  return {
    severity: 'warning',
    code: 'text-encoding-invalid',
    message: `The bytes at offset ${byte} of the file are not UTF-8${more}; each bad sequence is read as U+FFFD. Save the note as UTF-8.`,
    line: pos.line + 1,
    column: pos.character + 1,
  };
}

/**
 * The entry of a `.ipynb` file that is not a Jupyter notebook: it stands where
 * the notebook's blocks would, with one `notebook-invalid` error at the fault's
 * line and column in the file (1-based).
 */
export function notebookInvalidEntry(file: string, message: string, line: number, column: number): ReportEntry {
  return {
    ...unreadableEntry(file, message),
    line,
    diagnostics: [{ severity: 'error', code: 'notebook-invalid', message, line, column }],
  };
}
