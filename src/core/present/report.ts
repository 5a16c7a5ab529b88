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
  readonly entropy: number | null;
  readonly diagnostics: readonly ReportDiagnostic[];
  /** T₁ or τ of a time series, s (v1.1). */
  readonly timeConstant: Measured | null;
  /** Small-signal gain coefficient g₀, cm⁻¹ (v1.1). */
  readonly gainCoefficient: number | null;
  readonly singlePassGain: number | null;
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
    entropy: finite(r?.entropy),
    diagnostics: b.problems.map((p) => {
      const pos = lines.positionAt(p.span.start);
      return { severity: p.severity, code: p.code, message: p.message, line: pos.line + 1, column: pos.character + 1 };
    }),
    timeConstant: r?.series ? measured(r.series.timeConstant) : null,
    gainCoefficient: finite(r?.gain?.coefficient),
    singlePassGain: finite(r?.gain?.singlePass),
    aboveThreshold: r?.gain?.aboveThreshold ?? null,
    form: b.input?.form ?? null,
    fit: r?.fit ? { chi2: r.fit.chi2, dof: r.fit.dof, consistent: r.fit.consistent } : null,
    invertedPairs: r ? r.invertedPairs.map((p) => [p.lower, p.upper] as [number, number]) : [],
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
    singlePassGain: null,
    aboveThreshold: null,
    form: null,
    fit: null,
    invertedPairs: [],
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
