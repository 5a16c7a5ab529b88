/**
 * The workspace run log: every `levels` block of a set of notes, kept up to
 * date note by note (an edit re-reads one note, and the analyzer's per-block
 * cache re-analyses only the blocks that changed). Pure data; the editor's
 * tree view and the CSV export are hosts of it.
 */
import type { Externals } from '../block/externals';
import { Analyzer, type BlockReport } from '../analyzer/analyzer';
import { RunBook } from '../runs/runBook';
import {
  cellAtLine,
  cellStarts,
  isNotebookPath,
  joinCells,
  notebookCells,
  type CellLine,
  type NotebookCell,
} from '../text/jupyter';
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
  /**
   * The runs this one takes values from by reference (`thermal: { run: … }`, `decay: { run: … }`): each one's
   * note and the line of its opening fence, as in its own entry. Absent or empty when it refers to none.
   */
  readonly uses?: readonly { readonly uri: string; readonly line: number; readonly cell?: number }[];
}

/** A group of runs under one heading (a note, or a date). */
export interface RunGroup {
  readonly label: string;
  readonly entries: readonly RunEntry[];
}

/**
 * The runs of many notes. References between runs (`{ run: … }`) are followed among the notes the log holds;
 * when a note changes, the notes whose runs use one of its runs are read again.
 */
export class RunLog {
  private readonly notes = new Map<string, readonly RunEntry[]>();
  /** The Markdown notes the log holds, with their names, for reading again a note that uses a changed run. */
  private readonly texts = new Map<string, { readonly name: string; readonly text: string }>();
  private readonly book: RunBook;
  /** How many references of the held notes name each id: a note none of whose ids is named has no users. */
  private readonly named = new Map<string, number>();

  /** Each note's other sources of values by reference (spectrum files), as its host last gave them. */
  private readonly sources = new Map<string, Externals>();
  /**
   * Each notebook's Markdown cells (read once per update, for the book and for each reading of the notebook), and
   * where each starts in the joined text the book reads (one note, joined as the command line joins them).
   */
  private readonly notebooks = new Map<
    string,
    { readonly cells: readonly NotebookCell[]; readonly starts: readonly CellLine[] }
  >();

  constructor(private readonly analyzer: Analyzer = new Analyzer()) {
    this.book = new RunBook({
      analyzer,
      sources: (note) => this.sources.get(note) ?? null,
      cellStarts: (note) => this.notebooks.get(note)?.starts ?? null,
    });
  }

  /**
   * Reads (or re-reads) one note; returns true when its runs changed. A URI ending in `.ipynb` is read as a
   * Jupyter notebook: its Markdown cells, each read on its own, whose runs other notes refer to and which refer
   * to runs as a note's do (a file that is not a notebook has no runs). `externals` are the note's sources of
   * values by reference (spectrum files), when the host has them.
   */
  update(uri: string, name: string, text: string, externals: Externals | null = null): boolean {
    if (externals) this.sources.set(uri, externals);
    else this.sources.delete(uri);
    // The notes that used this note's runs before the change, and those that use them after it.
    const before = this.usersOfNote(uri);
    this.count(uri, -1);
    this.texts.set(uri, { name, text });
    this.book.setNote(uri, isNotebookPath(uri) ? this.joined(uri, text) : text);
    this.count(uri, 1);
    return this.readAgain(uri, before);
  }

  /** A notebook's Markdown cells as one note, the cells and where each starts kept for the readings. */
  private joined(uri: string, text: string): string {
    const cells = notebookCells(text).cells;
    this.notebooks.set(uri, { cells, starts: cellStarts(cells) });
    return joinCells(cells);
  }

  /** A block's place as the log names it: in a notebook, its cell and the line in that cell. */
  private placeOf(uri: string, line: number): { uri: string; line: number; cell?: number } {
    const at = this.cellAt(uri, line);
    return at ? { uri, line: at.line, cell: at.index } : { uri, line };
  }

  /** The cell and line in it of a line of a notebook the log holds; null for a Markdown note. */
  private cellAt(uri: string, line: number): CellLine | null {
    const starts = this.notebooks.get(uri)?.starts;
    return starts ? cellAtLine(starts, line) : null;
  }

  /** Adds (or takes away) the ids a note's references name. */
  private count(uri: string, sign: 1 | -1): void {
    for (const b of this.book.blocksOf(uri))
      for (const ref of b.refs) {
        const n = (this.named.get(ref.id) ?? 0) + sign;
        if (n > 0) this.named.set(ref.id, n);
        else this.named.delete(ref.id);
      }
  }

  /** The notes whose runs use a run of `uri` (none, without a walk of the book, when no reference names its ids). */
  private usersOfNote(uri: string): readonly string[] {
    const named = this.book.blocksOf(uri).some((b) => b.id !== null && this.named.has(b.id));
    return named ? this.book.dependents(uri) : [];
  }

  /**
   * The runs that take values from the run at `uri` whose block opens at `line` (of notebook cell `cell`), by
   * note name then line.
   */
  users(uri: string, line: number, cell: number | null = null): RunEntry[] {
    return this.entries().filter((e) =>
      (e.uses ?? []).some((u) => u.uri === uri && u.line === line && (cell === null || u.cell === cell)),
    );
  }

  /** Reads the note, then every note whose runs use its runs (before or now); true when any of them changed. */
  private readAgain(uri: string, before: readonly string[]): boolean {
    const t = this.texts.get(uri);
    let changed = t ? this.read(uri, t.name, t.text) : false;
    for (const n of new Set([...before, ...this.usersOfNote(uri)])) {
      const d = this.texts.get(n);
      if (d && this.read(n, d.name, d.text)) changed = true;
    }
    return changed;
  }

  private read(uri: string, name: string, text: string): boolean {
    const uses = (b: BlockReport): RunEntry['uses'] => {
      const out: { uri: string; line: number }[] = [];
      for (const ref of b.meta.refs ?? []) {
        const t = this.book.target(uri, ref);
        if (t) out.push(this.placeOf(t.note, t.block.openLine));
      }
      return out;
    };
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
      uses: uses(b),
    });
    const notebook = this.notebooks.get(uri);
    const entries: RunEntry[] = notebook
      ? notebook.cells.flatMap((c) =>
          this.analyzer.analyzeText(c.text, this.book.externalsFor(uri)).blocks.map((b) => entry(b, c.index)),
        )
      : this.analyzer.analyzeText(text, this.book.externalsFor(uri)).blocks.map((b) => entry(b, null));
    const before = this.notes.get(uri);
    if (before && JSON.stringify(before) === JSON.stringify(entries)) return false;
    if (entries.length === 0 && !before) return false;
    if (entries.length === 0) this.notes.delete(uri);
    else this.notes.set(uri, entries);
    return true;
  }

  /**
   * A note's sources for values by reference as the log sees them: the runs of every note it holds and the
   * note's spectrum files as its host last gave them (for a host's other readers of the note, such as the
   * Markdown preview).
   */
  externalsFor(uri: string): Externals {
    return this.book.externalsFor(uri);
  }

  /** Forgets a deleted note; returns true when it or a note using its runs changed. */
  remove(uri: string): boolean {
    const before = this.usersOfNote(uri);
    this.count(uri, -1);
    this.texts.delete(uri);
    this.sources.delete(uri);
    this.notebooks.delete(uri);
    this.book.deleteNote(uri);
    const had = this.notes.delete(uri);
    return this.readAgain(uri, before) || had;
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
