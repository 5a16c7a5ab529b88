/**
 * The workspace run log: every `levels` block of a set of notes, kept up to
 * date note by note (an edit re-reads one note, and the analyzer's per-block
 * cache re-analyses only the blocks that changed). Pure data; the editor's
 * tree view and the CSV export are hosts of it.
 */
import { Analyzer } from '../analyzer/analyzer';
import type { Measured, Status } from '../types';

/** One run: a block of a note. */
export interface RunEntry {
  /** The note's URI (or path), as the host names it. */
  readonly uri: string;
  /** A short name of the note for display (e.g. its workspace-relative path). */
  readonly name: string;
  /** 0-based line of the opening fence. */
  readonly line: number;
  readonly id: string | null;
  readonly date: string | null;
  readonly status: Status;
  readonly temperature: Measured | null;
  readonly beta: Measured | null;
  readonly polarization: Measured | null;
  /** ε = P/P_th with its standard uncertainty. */
  readonly enhancement: Measured | null;
  /** T₁ or τ of a time series, s. */
  readonly timeConstant: Measured | null;
  /** Small-signal gain coefficient g₀, cm⁻¹. */
  readonly gain: Measured | null;
}

/** A group of runs under one heading (a note, or a date). */
export interface RunGroup {
  readonly label: string;
  readonly entries: readonly RunEntry[];
}

/** The runs of many notes. */
export class RunLog {
  private readonly notes = new Map<string, readonly RunEntry[]>();

  constructor(private readonly analyzer: Analyzer = new Analyzer()) {}

  /** Reads (or re-reads) one note; returns true when its runs changed. */
  update(uri: string, name: string, text: string): boolean {
    const entries: RunEntry[] = this.analyzer.analyzeText(text).blocks.map((b) => ({
      uri,
      name,
      line: b.block.openLine,
      id: b.meta.id,
      date: b.meta.date,
      status: b.status,
      temperature: b.results?.temperature ?? null,
      beta: b.results?.beta ?? null,
      polarization: b.results?.polarization ?? null,
      enhancement:
        b.results?.enhancement != null
          ? { value: b.results.enhancement, uncertainty: b.results.enhancementUncertainty }
          : null,
      timeConstant: b.results?.series?.timeConstant ?? null,
      gain: b.results?.gain ? { value: b.results.gain.coefficient, uncertainty: b.results.gain.uCoefficient } : null,
    }));
    const before = this.notes.get(uri);
    if (before && JSON.stringify(before) === JSON.stringify(entries)) return false;
    if (entries.length === 0 && !before) return false;
    if (entries.length === 0) this.notes.delete(uri);
    else this.notes.set(uri, entries);
    return true;
  }

  /** Forgets a deleted note; returns true when it had runs. */
  remove(uri: string): boolean {
    return this.notes.delete(uri);
  }

  /** How many notes hold runs. */
  get noteCount(): number {
    return this.notes.size;
  }

  /** All runs (optionally only some statuses), by note name then line. */
  entries(statuses: readonly Status[] | null = null): RunEntry[] {
    const all = [...this.notes.values()].flat().filter((e) => !statuses || statuses.includes(e.status));
    return all.sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : a.line - b.line));
  }

  /** Runs grouped by note, or by `date` (runs without a date last, under "no date"). */
  groups(by: 'file' | 'date', statuses: readonly Status[] | null = null): RunGroup[] {
    const map = new Map<string, RunEntry[]>();
    for (const e of this.entries(statuses)) {
      const key = by === 'file' ? e.name : (e.date ?? '');
      map.set(key, [...(map.get(key) ?? []), e]);
    }
    const keys = [...map.keys()].sort((a, b) =>
      by === 'date' ? (a === '' ? 1 : b === '' ? -1 : a < b ? 1 : a > b ? -1 : 0) : a < b ? -1 : 1,
    );
    return keys.map((k) => ({ label: k === '' ? 'no date' : k, entries: map.get(k)! }));
  }
}

const CSV_HEAD = [
  'note',
  'line',
  'id',
  'date',
  'status',
  'temperature_K',
  'temperature_uncertainty_K',
  'beta_per_K',
  'beta_uncertainty_per_K',
  'polarization',
  'polarization_uncertainty',
];

function cell(v: string | number | null): string {
  if (v === null) return '';
  const s = String(v);
  // A leading =, +, - or @ would make spreadsheets evaluate the cell; quote such text.
  const safe = typeof v === 'string' && /^[=+\-@]/.test(s) ? `'${s}` : s;
  return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

/** The run log as CSV (RFC 4180), 1-based lines, full-precision numbers. */
export function runLogCsv(entries: readonly RunEntry[]): string {
  const rows = [CSV_HEAD.join(',')];
  for (const e of entries) {
    rows.push(
      [
        e.name,
        e.line + 1,
        e.id,
        e.date,
        e.status,
        e.temperature?.value ?? null,
        e.temperature?.uncertainty ?? null,
        e.beta?.value ?? null,
        e.beta?.uncertainty ?? null,
        e.polarization?.value ?? null,
        e.polarization?.uncertainty ?? null,
      ]
        .map(cell)
        .join(','),
    );
  }
  return rows.join('\r\n') + '\r\n';
}
