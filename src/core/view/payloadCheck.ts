/**
 * Validators of the view payloads (see payload.ts), used on arrival in the
 * webview and when the extension restores a panel from saved state.
 */
import type {
  CurveColumns,
  CurvePayload,
  DisplayUnit,
  Fact,
  FiniteNColumns,
  MeasuredPoint,
  MeasurementPlot,
  PlotPoint,
  ProblemPayload,
  ThermalMarker,
  ViewPayload,
} from './payload';
import {
  isArrayOf,
  isCount,
  isFiniteNumber,
  isNumberArray,
  isNumberOrNull,
  isOneOf,
  isRecord,
  isText,
} from './validate';
import { isSpectrumTraces } from './spectrumPanel';

const STATUSES = ['normal', 'saturated', 'inverted', 'non-thermal'] as const;
const LIMITS = ['zero-positive', 'zero-negative'] as const;

function isColumns(x: unknown): x is CurveColumns {
  if (!isRecord(x) || !isNumberArray(x.energy) || !isNumberArray(x.entropy) || !isNumberArray(x.beta)) return false;
  return x.energy.length === x.entropy.length && x.energy.length === x.beta.length;
}

function isFiniteN(x: unknown): x is FiniteNColumns | null {
  return (
    x === null ||
    (isColumns(x) &&
      isRecord(x) &&
      isCount(x.n) &&
      x.n >= 1 &&
      isArrayOf(x.m, isCount, 1_000_000) &&
      x.m.length === x.energy.length)
  );
}

function isUnit(x: unknown): x is DisplayUnit {
  return (
    isRecord(x) && isText(x.name, 40) && isText(x.label, 40) && isFiniteNumber(x.kelvinPerUnit) && x.kelvinPerUnit > 0
  );
}

function isMeasured(x: unknown): x is MeasuredPoint | null {
  if (x === null) return true;
  if (!isRecord(x)) return false;
  const numbers = [x.energy, x.entropy];
  const nullable = [x.uEnergy, x.uEntropy, x.beta, x.uBeta, x.thermalEntropy, x.deficit, x.relativeEntropy];
  return (
    numbers.every(isFiniteNumber) && nullable.every(isNumberOrNull) && (x.limit === null || isOneOf(x.limit, LIMITS))
  );
}

function isThermal(x: unknown): x is ThermalMarker | null {
  return x === null || (isRecord(x) && [x.temperature, x.beta, x.energy, x.entropy].every(isFiniteNumber));
}

function isFact(x: unknown): x is Fact {
  return isRecord(x) && isText(x.label, 200) && isText(x.text, 1000);
}

function isSource(x: Record<string, unknown>): boolean {
  return isText(x.uri) && isCount(x.line) && typeof x.version === 'number' && Number.isSafeInteger(x.version);
}

function isScheme(x: unknown): boolean {
  return isRecord(x) && isNumberArray(x.energies) && isNumberArray(x.g) && x.energies.length === x.g.length;
}

function isPoint(x: unknown): x is PlotPoint {
  return (
    isRecord(x) &&
    isFiniteNumber(x.x) &&
    isFiniteNumber(x.y) &&
    isNumberOrNull(x.u) &&
    typeof x.flagged === 'boolean' &&
    (x.label === null || isText(x.label, 200))
  );
}

function isXY(x: unknown): x is { x: number; y: number } {
  return isRecord(x) && isFiniteNumber(x.x) && isFiniteNumber(x.y);
}

/** True when `x` is a well-formed {@link MeasurementPlot}, null, or absent (a state saved before plots existed). */
export function isPlot(x: unknown): x is MeasurementPlot | null | undefined {
  if (x === null || x === undefined) return true;
  if (!isRecord(x) || !isOneOf(x.kind, ['boltzmann', 'series'] as const)) return false;
  const fit = x.fit;
  return (
    isText(x.title, 200) &&
    isText(x.xTitle, 200) &&
    isText(x.yTitle, 200) &&
    isArrayOf(x.points, isPoint, 100_000) &&
    isRecord(fit) &&
    isNumberArray(fit.x) &&
    isNumberArray(fit.y) &&
    fit.x.length === fit.y.length &&
    isArrayOf(x.residuals, isXY, 100_000)
  );
}

/** True when `x` is a well-formed {@link CurvePayload}. */
export function isCurvePayload(x: unknown): x is CurvePayload {
  if (!isRecord(x) || x.kind !== 'curve' || !isSource(x)) return false;
  return (
    isText(x.id) &&
    isOneOf(x.status, STATUSES) &&
    isUnit(x.unit) &&
    isScheme(x.scheme) &&
    isFiniteNumber(x.saturationEnergy) &&
    isFiniteNumber(x.maxEntropy) &&
    isColumns(x.curve) &&
    isFiniteN(x.finiteN) &&
    isMeasured(x.measured) &&
    isThermal(x.thermal) &&
    isArrayOf(x.facts, isFact, 100) &&
    isArrayOf(x.notes, (n): n is string => isText(n), 100) &&
    isPlot(x.plot) &&
    isSpectrumTraces(x.spectra)
  );
}

/** True when `x` is a well-formed {@link ProblemPayload}. */
export function isProblemPayload(x: unknown): x is ProblemPayload {
  if (!isRecord(x) || x.kind !== 'problem' || !isSource(x)) return false;
  return (
    (x.id === null || isText(x.id)) &&
    (x.code === null || isText(x.code, 200)) &&
    isText(x.message) &&
    isPlot(x.plot) &&
    isSpectrumTraces(x.spectra)
  );
}

/** True when `x` is a well-formed {@link ViewPayload}. */
export function isViewPayload(x: unknown): x is ViewPayload {
  return isCurvePayload(x) || isProblemPayload(x);
}
