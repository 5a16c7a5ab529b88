// Types of editorHost.cjs (the browser-hosted VS Code runner).
import type { ChildProcess } from 'node:child_process';

/** The two hosts scripts/editor-host.sh installs. */
export type Version = 'oldest' | 'newest';

/** One run's private folders and the environment that keeps writes inside them. */
export interface Run {
  readonly dir: string;
  /** The host this run uses. */
  readonly version: Version;
  readonly env: NodeJS.ProcessEnv;
  readonly extensions: string;
  readonly userData: string;
  remove(): void;
}

/** A started server. */
export interface Server {
  readonly port: number;
  /** `http://127.0.0.1:PORT` */
  readonly base: string;
  /** The workbench URL with the workspace folder open. */
  readonly open: string;
  readonly child: ChildProcess;
  /** Ends the server and its children (one process group). */
  stop(): Promise<void>;
}

export const ROOT: string;
export const VERSIONS: readonly Version[];
export const TITLES: Readonly<Record<Version, string>>;
/** The one host BOLTZMARK_VSCODE names (default: the oldest). */
export function chosenVersion(value?: string): Version;
/** The hosts the e2e suites run in: the one BOLTZMARK_VSCODE names, or both when it is unset or "both". */
export function versionsToTest(value?: string): Version[];
export function hostDir(version?: Version): string;
export function hostNode(version?: Version): string;
export function vscodeVersion(version?: Version): string | null;
export function ensureHost(options?: { echo?: boolean; version?: Version }): void;
export function makeRun(prefix?: string, version?: Version): Run;
export function writeUserSettings(run: Run, extra?: Record<string, unknown>): void;
export function installVsix(run: Run, vsix: string): string;
export function freePort(): Promise<number>;
export function startServer(
  run: Run,
  options: {
    workspace: string;
    port?: number;
    logFile?: string;
    /** The page will carry extensionDevelopmentPath/extensionTestsPath in its `payload`: let the workbench honour them. */
    extensionTests?: boolean;
    extraArgs?: string[];
  },
): Promise<Server>;
export const CHROMIUM: string;
export const CHROMIUM_ARGS: readonly string[];
