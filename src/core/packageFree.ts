/**
 * The part of the core's public API that pulls in no package at all: the
 * curve view's messages and payload types with their validators, the status
 * words and the display defaults. Hosts whose bundle size matters import
 * from here: the extension's activation bundle (which must not carry the
 * YAML reader and the fits) and the curve view's page. Everything else
 * imports from `index.ts`, which re-exports all of this too.
 *
 * `npm run lint` checks that nothing reachable from this file imports a
 * package, so the promise above cannot quietly break.
 */
export { STATUSES, type Status } from './types';
export { hasLevelsBlock } from './text/fences';
export { COVERAGE_FACTOR } from './analysis/intervals';
export {
  DEFAULT_DISPLAY,
  measuredTemperatureText,
  temperatureWithInterval,
  type DisplayOptions,
} from './present/summary';
export {
  ENERGY_AXIS_UNITS,
  isHostToView,
  isRenderMessage,
  isViewState,
  isViewToHost,
  MAX_DATA_URL,
  pinsBesides,
  type CopyImageLinkMessage,
  type EnergyAxisUnit,
  type ExportCsvMessage,
  type ExportPngMessage,
  type ExportRunsCsvMessage,
  type ExportRunsPngMessage,
  type OpenRunMessage,
  type HostToView,
  type PinMessage,
  type PinnedPlot,
  type PinnedRun,
  type ReadyMessage,
  type RenderMessage,
  type UnpinMessage,
  type ViewState,
  type ViewToHost,
} from './view/messages';
export { isCurvePayload, isProblemPayload, isViewPayload } from './view/payloadCheck';
export { payloadTitle } from './view/payload';
export type {
  CurveColumns,
  CurvePayload,
  DisplayUnit,
  Fact,
  FiniteNColumns,
  MeasuredPoint,
  MeasurementPlot,
  PayloadSource,
  PlotPoint,
  ProblemPayload,
  ThermalMarker,
  ViewPayload,
} from './view/payload';
export {
  dayNumber,
  dayText,
  isRunChartPayload,
  RUN_QUANTITIES,
  type RunAxis,
  type RunChartPayload,
  type RunPoint,
  type RunQuantity,
  type RunValue,
} from './view/runChart';
export { SPECTRUM_MAX_BYTES } from './spectra/types';
export { baselineAt, type SpectrumTrace } from './view/spectrumPanel';
