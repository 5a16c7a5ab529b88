// Types of editorHost.cjs (the browser-hosted VS Code runner).
import type { ChildProcess } from 'node:child_process';

/** One run's private folders and the environment that keeps writes inside them. */
export interface Run {
  readonly dir: string;
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
export function hostDir(): string;
export function ensureHost(options?: { echo?: boolean }): void;
export function makeRun(prefix?: string): Run;
export function writeUserSettings(run: Run, extra?: Record<string, unknown>): void;
export function installVsix(run: Run, vsix: string): string;
export function freePort(): Promise<number>;
export function startServer(
  run: Run,
  options: { workspace: string; port?: number; logFile?: string; extraArgs?: string[] },
): Promise<Server>;
export const CHROMIUM: string;
export const CHROMIUM_ARGS: readonly string[];
