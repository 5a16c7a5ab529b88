/**
 * The messages between the extension (host) and the curve view (webview),
 * as readonly discriminated unions shared by both sides, with validators
 * that each side applies on arrival: a message that fails them is dropped.
 */
import type { CurvePayload, MeasurementPlot, ViewPayload } from './payload';
import { isCurvePayload, isPlot, isViewPayload } from './payloadCheck';
import { isArrayOf, isCount, isOneOf, isRecord, isText } from './validate';
import { isRunChartPayload, RUN_QUANTITIES, type RunChartPayload, type RunQuantity } from './runChart';

/** How the energy axis is shown: in the block's own unit or in kelvin. */
export type EnergyAxisUnit = 'block' | 'K';

/** The energy-axis choices. */
export const ENERGY_AXIS_UNITS: readonly EnergyAxisUnit[] = ['block', 'K'];

/** A run the user pinned: a snapshot of its payload under a key the host chose. */
export interface PinnedRun {
  readonly key: string;
  readonly payload: CurvePayload;
}

/** A measurement plot the user pinned (a series fit, a Boltzmann plot), drawn over the plot of the block shown. */
export interface PinnedPlot {
  readonly key: string;
  /** The block's id, or its place in the note. */
  readonly id: string;
  readonly uri: string;
  readonly line: number;
  readonly plot: MeasurementPlot;
}

/** Host → view: draw this (the block under the cursor, or null for none yet) with these pinned runs. */
export interface RenderMessage {
  readonly type: 'render';
  /** Increases with every render the host sends; the view ignores an older one. */
  readonly seq: number;
  readonly current: ViewPayload | null;
  readonly pinned: readonly PinnedRun[];
  /** Pinned measurement plots (series fits, Boltzmann plots); absent for none. */
  readonly pinnedPlots?: readonly PinnedPlot[];
  /** The runs compared (the note's blocks, or the run log's filter); absent or null for none. */
  readonly runs?: RunChartPayload | null;
}

/** Every host → view message. */
export type HostToView = RenderMessage;

/** View → host: the page has loaded and listens. */
/**
 * The pinned runs that are not the run shown: a pin taken of the shown block
 * at the same version is the same measurement, so it is drawn and exported
 * once, as the shown run (it stays in the pin list, to be unpinned).
 */
export function pinsBesides(shown: CurvePayload | null, pins: readonly PinnedRun[]): PinnedRun[] {
  if (!shown) return [...pins];
  return pins.filter(
    (r) => !(r.payload.uri === shown.uri && r.payload.line === shown.line && r.payload.version === shown.version),
  );
}

export interface ReadyMessage {
  readonly type: 'ready';
}
/** View → host: pin the block shown now. */
export interface PinMessage {
  readonly type: 'pin';
}
/** View → host: drop a pinned run. */
export interface UnpinMessage {
  readonly type: 'unpin';
  readonly key: string;
}
/** View → host: save the charts as a PNG (a `data:image/png;base64,` URL). */
export interface ExportPngMessage {
  readonly type: 'exportPng';
  readonly dataUrl: string;
}
/** View → host: save the curves and points as CSV, energies also in this unit. */
export interface ExportCsvMessage {
  readonly type: 'exportCsv';
  readonly unit: EnergyAxisUnit;
}
/** View → host: save the PNG and copy a Markdown image link to it. */
export interface CopyImageLinkMessage {
  readonly type: 'copyImageLink';
  readonly dataUrl: string;
}

/** View → host: open the note of a run of the comparison chart at its block. */
export interface OpenRunMessage {
  readonly type: 'openRun';
  readonly uri: string;
  /** 0-based line of the block's opening fence. */
  readonly line: number;
}
/** View → host: save the run comparison as CSV, for the quantity shown. */
export interface ExportRunsCsvMessage {
  readonly type: 'exportRunsCsv';
  readonly quantity: RunQuantity;
}
/** View → host: save the run comparison chart as a PNG. */
export interface ExportRunsPngMessage {
  readonly type: 'exportRunsPng';
  readonly dataUrl: string;
}

/** Every view → host message. */
/** Save the spectrum panel's chart (the reference `key` shown) as PNG. */
export interface ExportSpectrumPngMessage {
  readonly type: 'exportSpectrumPng';
  readonly key: string;
  readonly dataUrl: string;
}
/** Save the spectrum panel's points, baseline and integral (the reference `key` shown) as CSV. */
export interface ExportSpectrumCsvMessage {
  readonly type: 'exportSpectrumCsv';
  readonly key: string;
}

export type ViewToHost =
  | ReadyMessage
  | PinMessage
  | UnpinMessage
  | ExportPngMessage
  | ExportCsvMessage
  | CopyImageLinkMessage
  | OpenRunMessage
  | ExportRunsCsvMessage
  | ExportRunsPngMessage
  | ExportSpectrumPngMessage
  | ExportSpectrumCsvMessage;

/** What the webview keeps with `setState`, so a hidden or reloaded panel comes back as it was. */
export interface ViewState {
  readonly unit: EnergyAxisUnit;
  readonly last: RenderMessage | null;
  /** The quantity the run comparison shows. */
  readonly quantity?: RunQuantity;
}

/** Longest PNG data URL accepted (64 MiB of text): a bound, not a size anyone reaches. */
export const MAX_DATA_URL = 64 * 1024 * 1024;

const PNG_PREFIX = 'data:image/png;base64,';

function isPngDataUrl(x: unknown): x is string {
  return (
    isText(x, MAX_DATA_URL) && x.startsWith(PNG_PREFIX) && /^[A-Za-z0-9+/]*={0,2}$/.test(x.slice(PNG_PREFIX.length))
  );
}

function isPinnedPlot(x: unknown): x is PinnedPlot {
  return (
    isRecord(x) &&
    isText(x.key, 100) &&
    isText(x.id, 1000) &&
    isText(x.uri, 4000) &&
    isCount(x.line) &&
    x.plot !== null &&
    x.plot !== undefined &&
    isPlot(x.plot)
  );
}

function isPinned(x: unknown): x is PinnedRun {
  return isRecord(x) && isText(x.key, 100) && isCurvePayload(x.payload);
}

/** True when `x` is a well-formed {@link RenderMessage}. */
export function isRenderMessage(x: unknown): x is RenderMessage {
  return (
    isRecord(x) &&
    x.type === 'render' &&
    isCount(x.seq) &&
    (x.current === null || isViewPayload(x.current)) &&
    isArrayOf(x.pinned, isPinned, 100) &&
    (x.runs === undefined || x.runs === null || isRunChartPayload(x.runs)) &&
    (x.pinnedPlots === undefined || isArrayOf(x.pinnedPlots, isPinnedPlot, 100))
  );
}

/** True when `x` is a well-formed host → view message. */
export function isHostToView(x: unknown): x is HostToView {
  return isRenderMessage(x);
}

/** True when `x` is a well-formed view → host message. */
export function isViewToHost(x: unknown): x is ViewToHost {
  if (!isRecord(x)) return false;
  switch (x.type) {
    case 'ready':
    case 'pin':
      return true;
    case 'unpin':
      return isText(x.key, 100);
    case 'exportPng':
    case 'copyImageLink':
      return isPngDataUrl(x.dataUrl);
    case 'exportCsv':
      return isOneOf(x.unit, ENERGY_AXIS_UNITS);
    case 'openRun':
      return isText(x.uri, 4000) && isCount(x.line);
    case 'exportRunsCsv':
      return isOneOf(x.quantity, RUN_QUANTITIES);
    case 'exportRunsPng':
      return isPngDataUrl(x.dataUrl);
    case 'exportSpectrumPng':
      return isText(x.key, 200) && isPngDataUrl(x.dataUrl);
    case 'exportSpectrumCsv':
      return isText(x.key, 200);
    default:
      return false;
  }
}

/** True when `x` is a well-formed {@link ViewState}. */
export function isViewState(x: unknown): x is ViewState {
  return (
    isRecord(x) &&
    isOneOf(x.unit, ENERGY_AXIS_UNITS) &&
    (x.last === null || isRenderMessage(x.last)) &&
    (x.quantity === undefined || isOneOf(x.quantity, RUN_QUANTITIES))
  );
}
