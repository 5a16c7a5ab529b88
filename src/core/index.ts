/**
 * The whole public API of the core. The language server, the CLI, the
 * curve view and the tests are hosts of what is exported here; nothing
 * below imports `vscode`, the LSP packages or Node built-ins.
 */
export {
  Analyzer,
  DEFAULT_ANALYZER_OPTIONS,
  UNBOUNDED,
  type AnalyzerLimits,
  type AnalyzerOptions,
  type BlockReport,
  type Bounded,
  type DocumentReport,
} from './analyzer/analyzer';
export { movedBlock, type TextChange } from './analyzer/rescanPlan';
export { spanToNote } from './analyzer/report';
export { SERVER_BLOCK_CHARS, MAX_BLOCK_PROBLEMS } from './analyzer/blockBounds';
export type { BlockResults, FitSummary } from './analysis/results';
export type { BlockInput, BlockMeta, LevelInput, SpinInput } from './block/input';
export {
  RUN_KEY_PREFIX,
  runRefKey,
  runCopiesKey,
  parseRunKey,
  type RunUse,
  type RunRef,
  type RunPlace,
  type RunError,
  type RunFacts,
  type RunAnswer,
  type RunCopies,
  type RunResolver,
  type PolarizationAt,
} from './runs/types';
export {
  RunBook,
  MAX_CHAIN,
  type RunBookOptions,
  type RunExternals,
  type BookBlock,
  type BookReference,
} from './runs/runBook';
export { needRunBook, plainFacts, type PlainFacts } from './runs/plainIds';
export { splitReference, resolveNotePath, isInside } from './runs/paths';
export { EXTRAPOLATE_KEYS } from './block/extrapolate';
export { runLabel, runPlaceText, thermalReferenceText, polarizationAtText } from './present/runSummary';
export {
  dependenciesHold,
  mayHaveChanged,
  NO_DEPENDENCIES,
  type Dependency,
  type Externals,
  type KeyChanges,
} from './block/externals';
export {
  SPECTRUM_MAX_BYTES,
  type BaselineKind,
  type Spectrum,
  type SpectrumAnswer,
  type SpectrumIntegral,
  type SpectrumRead,
  type SpectrumSource,
  type SpectrumUse,
} from './spectra/types';
export { readSpectrum, spectrumBytes, SPECTRUM_EXTENSIONS, JCAMP_EXTENSIONS, TEXT_EXTENSIONS } from './spectra/read';
export { convertX, parseXUnit, X_UNITS, type XUnit } from './spectra/axis';
export {
  DEFAULT_SHELF_BYTES,
  fileStamp,
  shelfSource,
  SpectrumShelf,
  type FileStat,
  type Located,
  type SyncFileAccess,
} from './spectra/shelf';
export { integrateRegion, noiseSigma, integralUncertainty, pointsIn, type RegionIntegral } from './spectra/integrate';
export {
  baselineNote,
  FROM_FILE_MARK,
  spectraEntries,
  spectraLines,
  spectrumUseLines,
  type SpectrumEntry,
} from './present/spectraReport';
export { SPECTRUM_REF_KEYS } from './block/spectrumRef';
export { BLOCK_KEYS, LEVEL_KEYS, keyFitsForm, type BlockForm, type KeyDoc } from './block/schema';
export { findFencedBlocks, scanFencedBlocks, bodyToDocument, hasLevelsBlock, type FencedBlock } from './text/fences';
export {
  isNotebookPath,
  cellAtLine,
  cellGap,
  cellStarts,
  joinCells,
  notebookCells,
  type CellLine,
  type NotebookCell,
  type NotebookCells,
  type NotebookProblem,
} from './text/jupyter';
export { LineIndex, type LineCol } from './text/lineIndex';
export { NoteText, type TextLines, type TextSource } from './text/noteText';
export { blockHoldingOffset, blocksMeeting, clipText, NAME_CHARS } from './text/common';
export {
  notebookInvalidEntry,
  notUtf8Diagnostic,
  reportEntry,
  unreadableEntry,
  type IntervalMeasured,
  type ReportEntry,
  type ReportDiagnostic,
} from './present/report';
export { decodeUtf8, type DecodedText, type InvalidUtf8 } from './text/utf8';
export {
  DEFAULT_DISPLAY,
  STATUS_WORDS,
  statusWords,
  betaText,
  enhancementText,
  fractionText,
  measuredTemperatureText,
  polarizationText,
  shortSummary,
  statusText,
  temperatureSymbol,
  temperatureIntervalText,
  temperatureText,
  temperatureWithInterval,
  withoutSymbol,
  type DisplayOptions,
} from './present/summary';
export type { LinePlot, PlotPointResult, Trade, TradeResults } from './analysis/trade';
export { tradeRows, linePointRows, linesCsv } from './present/tradeSummary';
export { airToVacuum, vacuumToAir, airIndex } from './physics/airWavelength';
export { lineBeta, linearRotorPartition, opticalDepthCorrection, radiationTemperature } from './physics/radio';
export {
  COVERAGE_FACTOR,
  resultIntervals,
  temperatureSkewed,
  type Interval,
  type ResultIntervals,
} from './analysis/intervals';
export type { BudgetLine, BudgetSource } from './analysis/budget';
export * from './present/numbers';
export * from './quantities/constants';
export {
  lookupSpecies,
  speciesSymbols,
  larmorFrequencyHz,
  zeemanSpacingKelvin,
  type SpinSpecies,
} from './quantities/isotopes';
export { parseQuantity, convert, unitsFor, type Dimension, type Quantity } from './quantities/units';
export {
  STATUSES,
  type Measured,
  type Problem,
  type Replacement,
  type Severity,
  type Span,
  type Status,
} from './types';
export { schemeCurve, betaAtEnergy, thermalStateAtEnergy, type CurvePoint } from './physics/curves';
export { finiteNCurve, lnBinomial, type FiniteNPoint } from './physics/finiteN';
export { gibbsEntropy, thermalDistribution, meanEnergy, relativeEntropy } from './physics/entropy';
export { betaFromPopulations } from './physics/twoLevel';
export { CODES, codeDocAnchor, type CodeDoc } from './codes';
export { pairTemperature, type PairLevel, type PairTemperature } from './physics/pairs';
export { RESIDUAL_TOLERANCE } from './physics/fit';
export { CANONICAL_UNITS } from './quantities/units';
export { curveData, DEFAULT_CURVE_DATA_OPTIONS, type CurveDataOptions, type NoteSource } from './view/curveData';
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
export { payloadTitle } from './view/payload';
export { measurementPlot } from './view/measurementPlot';
export { displayUnitFor, KELVIN_UNIT } from './view/displayUnit';
export { measuredPoint } from './view/measuredPoint';
export { isCurvePayload, isProblemPayload, isViewPayload } from './view/payloadCheck';
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
export { curveCsv, runChartCsv } from './view/csv';
export {
  baselineAt,
  decimateMinMax,
  isSpectrumTrace,
  spectrumCsv,
  spectrumTraces,
  SPECTRUM_DISPLAY_POINTS,
  type SpectrumTrace,
} from './view/spectrumPanel';
export {
  dayNumber,
  dayText,
  isRunChartPayload,
  RUN_QUANTITIES,
  runChartData,
  runChartRows,
  runCsvColumn,
  type RunAxis,
  type RunChartPayload,
  type RunPoint,
  type RunQuantity,
  type RunSource,
  type RunValue,
} from './view/runChart';
export { measurementRows, measurementShort, type Row } from './present/measurementSummary';
export type { SeriesFit } from './physics/relaxation';
export type { GainResult, SignalResult } from './analysis/results';
export type { SeriesInput, SignalInput, LinesInput, LineInput, GainInput } from './block/input';
export { LINE_KEYS, SIGNAL_KEYS, SERIES_KEYS } from './block/schema';
export { resultsHtml, type PreviewBlock } from './present/preview/resultsHtml';
export { sparklineSvg, escapeText, escapeAttr, type SparkPoint } from './present/preview/sparkline';
export { RunLog, runLogCsv, type RunEntry, type RunGroup } from './present/runLog';
export { csvText, csvField, guardFormula, type CsvField } from './present/csv';
export { markdownCode, markdownText, terminalText } from './present/literal';
