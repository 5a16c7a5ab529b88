/**
 * The settings of each note. The `boltzmark.*` settings are resource-scoped,
 * so two workspace folders may differ: the server asks the client for the
 * `boltzmark` section with the note's URI as `scopeUri`, once per workspace
 * folder (a note outside every folder is asked for on its own), and keeps
 * the answer until the client says the configuration changed.
 *
 * A client without `workspace/configuration`, or one that fails or does not
 * answer, gets the fallback: the `initializationOptions` or the settings
 * pushed with `workspace/didChangeConfiguration`, else the defaults.
 */
import { DEFAULT_SETTINGS, fromSection, type Settings } from '../shared/settings';

/** How long a settings request may stay unanswered before the note is served with the fallback. */
export const SETTINGS_WAIT_MS = 5_000;

/** Asks the client for the `boltzmark` section as seen from a resource. */
export type FetchSection = (scopeUri: string) => Promise<unknown>;

/** What a change of settings touched, so that only the affected results are recomputed and refreshed. */
export interface SettingsChange {
  /** Some value the analysis depends on changed (the blocks read, the saturation bound). */
  readonly analysis: boolean;
  /** Some value changed at all (display included). */
  readonly any: boolean;
}

/** The settings values that change the analysis itself; the rest only change how results are shown. */
export function analysisKey(s: Settings): string {
  return JSON.stringify([s.saturationSigma, s.extraInfoStrings]);
}

/** Compares two settings (or none) as a change. */
function compare(before: Settings | undefined, after: Settings): SettingsChange {
  if (!before) return { analysis: false, any: false };
  return {
    analysis: analysisKey(before) !== analysisKey(after),
    any: JSON.stringify(before) !== JSON.stringify(after),
  };
}

/** Folder URIs end with one `/`, so that `file:///a/b/` never claims `file:///a/bc/note.md`. */
function asFolder(uri: string): string {
  return uri.endsWith('/') ? uri : `${uri}/`;
}

/** Settings per folder, asked for lazily and kept until the next change. */
export class SettingsStore {
  private folders: string[] = [];
  private fallback: Settings = DEFAULT_SETTINGS;
  private readonly pending = new Map<string, Promise<Settings>>();
  private readonly known = new Map<string, Settings>();
  private generation = 0;

  /**
   * @param fetch asks the client (null when it cannot be asked)
   * @param log reports a failed or late request
   * @param onLate called with the change when an answer arrives after the note was served with the fallback
   * @param waitMs how long an answer may take before the fallback is used
   */
  constructor(
    private readonly fetch: FetchSection | null,
    private readonly log: (message: string) => void,
    private readonly onLate: (change: SettingsChange) => void,
    private readonly waitMs = SETTINGS_WAIT_MS,
  ) {}

  /** The workspace folders (from `initialize` and `workspace/didChangeWorkspaceFolders`), longest first. */
  setFolders(uris: readonly string[]): void {
    this.folders = [...new Set(uris.map(asFolder))].sort((a, b) => b.length - a.length);
    this.forgetAll();
  }

  /** The cache key of a note: its innermost workspace folder, or the note itself when it lies in none. */
  scopeOf(uri: string): string {
    return this.folders.find((f) => uri.startsWith(f)) ?? uri;
  }

  /** Settings to use when the client is not asked or does not answer. Returns what changed for notes using them. */
  setFallback(section: unknown): SettingsChange {
    const before = this.fallback;
    this.fallback = fromSection(section);
    if (this.fetch) return { analysis: false, any: false };
    this.forgetAll();
    return compare(before, this.fallback);
  }

  /** The settings of a note (asked for once per folder). Never rejects. */
  get(uri: string): Promise<Settings> {
    if (!this.fetch) return Promise.resolve(this.fallback);
    const key = this.scopeOf(uri);
    let p = this.pending.get(key);
    if (!p) {
      p = this.ask(key, uri);
      this.pending.set(key, p);
    }
    return p;
  }

  /**
   * The configuration (or, with `folders`, the set of workspace folders)
   * changed: forgets every answer, asks again for the folders of `openUris`,
   * and says what changed for those notes compared with what they were
   * served with.
   */
  async reload(openUris: readonly string[], folders?: readonly string[]): Promise<SettingsChange> {
    if (!this.fetch) {
      if (folders) this.setFolders(folders);
      return { analysis: false, any: false };
    }
    const before = new Map(openUris.map((u) => [u, this.known.get(this.scopeOf(u))]));
    if (folders) this.setFolders(folders);
    this.forgetAll();
    const changes = await Promise.all(openUris.map(async (u) => compare(before.get(u), await this.get(u))));
    return { analysis: changes.some((c) => c.analysis), any: changes.some((c) => c.any) };
  }

  private forgetAll(): void {
    this.generation++;
    this.pending.clear();
    this.known.clear();
  }

  /** Asks the client, falling back on failure or after SETTINGS_WAIT_MS; a late answer is kept and reported. */
  private ask(key: string, uri: string): Promise<Settings> {
    const generation = this.generation;
    const current = (): boolean => generation === this.generation;
    const answer = this.fetch!(uri).then(
      (section) => fromSection(section),
      (err: unknown) => {
        this.log(`boltzmark: the client did not give the settings (workspace/configuration): ${String(err)}`);
        return this.fallback;
      },
    );
    return new Promise<Settings>((resolve) => {
      let late = false;
      const timer = setTimeout(() => {
        late = true;
        this.log(
          `boltzmark: no settings after ${this.waitMs} ms for ${key}; using the initialization options or the defaults until they come`,
        );
        if (current()) this.known.set(key, this.fallback);
        resolve(this.fallback);
      }, this.waitMs);
      void answer
        .then((s) => {
          clearTimeout(timer);
          if (!current()) return resolve(s);
          const before = this.known.get(key);
          this.known.set(key, s);
          if (!late) return resolve(s);
          this.pending.set(key, Promise.resolve(s));
          const change = compare(before, s);
          if (change.any) this.onLate(change);
        })
        .catch((err: unknown) => this.log(`boltzmark: settings: ${String(err)}`));
    });
  }
}
