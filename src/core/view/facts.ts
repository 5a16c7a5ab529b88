/**
 * The short list of formatted values shown beside the charts, with the same
 * strings (GUM rounding, SI prefixes) as the hovers and the report table.
 */
import type { BlockResults } from '../analysis/results';
import { formatMeasured, formatNumber, formatTemperature } from '../present/numbers';
import {
  betaText,
  polarizationText,
  statusWords,
  temperatureIntervalText,
  type DisplayOptions,
} from '../present/summary';
import type { Fact, MeasuredPoint, ThermalMarker } from './payload';
import { polarizationAtText, thermalReferenceText } from '../present/runSummary';

/** Entropy in k per system with its uncertainty when known. */
function entropyText(s: number, u: number | null, digits: number): string {
  return `${u === null ? formatNumber(s, digits) : formatMeasured(s, u, { digits })} k`;
}

/**
 * Facts of a drawable block: status, T, β, P, the measured entropy, the
 * thermal entropy at the same energy, the deficit and relative entropy, the
 * lattice temperature and N when given.
 */
export function blockFacts(
  results: BlockResults,
  point: MeasuredPoint | null,
  thermal: ThermalMarker | null,
  count: number | null,
  o: DisplayOptions,
): Fact[] {
  const facts: Fact[] = [
    { label: 'status', text: statusWords(results.status, results) },
    { label: results.trade.temperatureName, text: temperatureIntervalText(results, o) },
    { label: 'inverse temperature', text: betaText(results, o) },
  ];
  if (results.polarization) facts.push({ label: 'polarization', text: `P = ${polarizationText(results, o)}` });
  const at = polarizationAtText(results, o);
  if (at) facts.push({ label: 'polarization, extrapolated', text: at });
  const ref = thermalReferenceText(results);
  if (ref) facts.push({ label: 'thermal reference', text: ref.replace(/^thermal reference: /, '') });
  if (point) {
    facts.push({ label: 'entropy (measured)', text: `S/N = ${entropyText(point.entropy, point.uEntropy, o.digits)}` });
    if (point.thermalEntropy !== null) {
      facts.push({
        label: 'entropy (thermal, same E)',
        text: `S/N = ${entropyText(point.thermalEntropy, null, o.digits)}`,
      });
    }
    if (point.deficit !== null)
      facts.push({ label: 'entropy deficit', text: `ΔS/N = ${entropyText(point.deficit, null, o.digits)}` });
    if (point.relativeEntropy !== null) {
      facts.push({
        label: 'relative entropy to thermal',
        text: `D = ${formatNumber(point.relativeEntropy, o.digits)} nat`,
      });
    }
  }
  if (thermal)
    facts.push({
      label: 'lattice',
      text: `T_L = ${formatTemperature(thermal.temperature, null, { digits: o.digits })}`,
    });
  if (count !== null) facts.push({ label: 'systems', text: `N = ${count}` });
  return facts;
}
