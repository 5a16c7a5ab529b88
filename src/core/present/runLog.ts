/**
 * The workspace run log: every `levels` block of a set of notes, kept up to
 * date note by note (an edit re-reads one note, and the analyzer's per-block
 * cache re-analyses only the blocks that changed). Pure data; the editor's
 * tree view and the CSV export are hosts of it.
 */
import { Analyzer, type BlockReport } from '../analyzer/analyzer';
import { isNotebookPath, notebookCells } from '../text/jupyter';
import type { Measured, Status } from '../types';
import { csvText } from './csv';

/** One run: a block of a note. */
export interface RunEntry {
  /** The note's URI (or path), as the host names it. */
  readonly uri: string;
  /** A short name of the note for display (e.g. its workspace-relative path). */
  readonly name: string;
  /** 0-based line of the opening fence (in its cell, for a notebook). */
  readonly line: number;
  /** 0-based index of the notebook cell that holds the block (among all cells), or null in a Markdown note. */
  readonly cell: number | null;
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
  /** The k = 2 intervals (analysis/intervals.ts); null without an uncertainty. */
  readonly betaInterval: readonly [number, number] | null;
  readonly temperatureInterval: readonly [number, number] | null;
  /** When β's interval holds 0: the bound |T| ≥ this, K. */
  readonly temperatureBound: number | null;
  readonly polarizationInterval: readonly [number, number] | null;
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

  /**
   * Reads (or re-reads) one note; returns true when its runs changed. A URI ending in `.ipynb` is read as a
   * Jupyter notebook: each Markdown cell is a note of its own (a file that is not a notebook has no runs).
   */
  update(uri: string, name: string, text: string): boolean {
    const entry = (b: BlockReport, cell: number | null): RunEntry => ({
      uri,
      name,
      line: b.block.openLine,
      cell,
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
      betaInterval: b.results?.intervals.beta ?? null,
      temperatureInterval: b.results?.intervals.temperature ?? null,
      temperatureBound: b.results?.intervals.temperatureBound ?? null,
      polarizationInterval: b.results?.intervals.polarization ?? null,
    });
    const entries: RunEntry[] = isNotebookPath(uri)
      ? notebookCells(text).cells.flatMap((c) => this.analyzer.analyzeText(c.text).blocks.map((b) => entry(b, c.index)))
      : this.analyzer.analyzeText(text).blocks.map((b) => entry(b, null));
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
    // Each note's runs are in cell then line order already (the analysis returns them so): only the notes are
    // sorted, by name, which costs the number of notes, not of runs. Notes of one name (two folders) are merged.
    const byName = new Map<string, (readonly RunEntry[])[]>();
    for (const runs of this.notes.values()) {
      const name = runs[0]!.name;
      const list = byName.get(name);
      if (list) list.push(runs);
      else byName.set(name, [runs]);
    }
    const names = [...byName.keys()].sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
    const out: RunEntry[] = [];
    for (const name of names) {
      const lists = byName.get(name)!;
      const runs =
        lists.length === 1 ? lists[0]! : lists.flat().sort((a, b) => (a.cell ?? 0) - (b.cell ?? 0) || a.line - b.line);
      for (const e of runs) if (!statuses || statuses.includes(e.status)) out.push(e);
    }
    return out;
  }

  /** Runs grouped by note, or by `date` (runs without a date last, under "no date"). */
  groups(by: 'file' | 'date', statuses: readonly Status[] | null = null): RunGroup[] {
    const map = new Map<string, RunEntry[]>();
    for (const e of this.entries(statuses)) {
      const key = by === 'file' ? e.name : (e.date ?? '');
      const group = map.get(key);
      if (group) group.push(e);
      else map.set(key, [e]);
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
  'temperature_low_95_K',
  'temperature_high_95_K',
  'beta_low_95_per_K',
  'beta_high_95_per_K',
  'polarization_low_95',
  'polarization_high_95',
  'cell',
];

/** The run log as CSV (RFC 4180, formula-guarded: `csv.ts`), 1-based lines and notebook cells, full-precision numbers. */
export function runLogCsv(entries: readonly RunEntry[]): string {
  return csvText([
    CSV_HEAD,
    ...entries.map((e) => [
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
      e.temperatureInterval?.[0] ?? null,
      e.temperatureInterval?.[1] ?? null,
      e.betaInterval?.[0] ?? null,
      e.betaInterval?.[1] ?? null,
      e.polarizationInterval?.[0] ?? null,
      e.polarizationInterval?.[1] ?? null,
      e.cell === null ? null : e.cell + 1,
    ]),
  ]);
}
