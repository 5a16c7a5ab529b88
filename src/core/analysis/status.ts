/**
 * The status rules of the contract (docs/format.md#status), in order:
 * `non-thermal` when three or more levels do not fit one temperature (the
 * fit's consistency, which takes in the judgement of empty levels, beta.ts);
 * `saturated` when β is zero, or within `saturationSigma` standard
 * uncertainties of zero; `inverted` when β < 0; otherwise `normal`.
 * (`invalid` is decided earlier: a block with an error never gets here.)
 */
import type { Measured, Status } from '../types';
import type { BetaFinding } from './beta';

/** Status word of a block that read without errors. */
export function statusOf(beta: Measured | null, f: BetaFinding, saturationSigma: number): Exclude<Status, 'invalid'> {
  if (f.fit && !f.fit.consistent) return 'non-thermal';
  if (f.limit === 'zero-positive') return 'normal';
  if (f.limit === 'zero-negative') return 'inverted';
  if (!beta) return 'non-thermal';
  if (beta.value === 0) return 'saturated';
  if (beta.uncertainty !== null && Math.abs(beta.value) <= saturationSigma * beta.uncertainty) return 'saturated';
  return beta.value < 0 ? 'inverted' : 'normal';
}
