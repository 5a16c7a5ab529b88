/**
 * The machine contract of `boltzmark report --format json`: one object per
 * block with the contract's fields, unknown quantities `null` (never missing),
 * lines 1-based. The v1.1 fields (`timeConstant`, `gainCoefficient`,
 * `singlePassGain`, `aboveThreshold`) follow the contract's measurement inputs;
 * `form`, `fit` and `invertedPairs` are Boltzmark's own extensions.
 */
import type { BlockReport } from '../analyzer/analyzer';
import type { LineIndex } from '../text/lineIndex';
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

/** One block as the JSON report prints it. */
export interface ReportEntry {
  readonly file: string;
  readonly line: number;
  readonly id: string | null;
  readonly status: Status;
  readonly beta: Measured | null;
  readonly temperature: Measured | null;
  readonly polarization: Measured | null;
  readonly thermalPolarization: number | null;
  readonly enhancement: number | null;
  /** Standard uncertainty of `enhancement` (from u(P) and u(lattice)), or null. */
  readonly enhancementUncertainty: number | null;
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
}

const finite = (x: number | null | undefined): number | null =>
  x !== null && x !== undefined && Number.isFinite(x) ? x : null;
const measured = (m: Measured | null): Measured | null =>
  m && Number.isFinite(m.value) ? { value: m.value, uncertainty: finite(m.uncertainty) } : null;

/** Converts one analysed block to its report entry. */
export function reportEntry(file: string, b: BlockReport, lines: LineIndex): ReportEntry {
  const r = b.results;
  return {
    file,
    line: b.block.openLine + 1,
    id: b.meta.id,
    status: b.status,
    beta: r ? measured(r.beta) : null,
    temperature: r ? measured(r.temperature) : null,
    polarization: r ? measured(r.polarization) : null,
    thermalPolarization: finite(r?.thermalPolarization),
    enhancement: finite(r?.enhancement),
    enhancementUncertainty: finite(r?.enhancementUncertainty),
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
  };
}
