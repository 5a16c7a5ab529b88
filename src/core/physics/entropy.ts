/**
 * Entropy and the thermal (Boltzmann) distribution over a set of levels with
 * degeneracies.
 *
 * Units: energies as E/k in K, β in K⁻¹, entropies in units of k per system
 * (nats). Populations may be on any common scale; they are normalised here.
 * Sources: Gibbs entropy S = −k Σ p_i ln p_i over microstates, grouped into levels
 * of degeneracy g_i (D. V. Schroeder, An Introduction to Thermal Physics, Addison
 * Wesley Longman 2000, ch. 6; C. Kittel, H. Kroemer, Thermal Physics, 2nd ed.,
 * Freeman 1980, ch. 2–3).
 *
 * Nothing here throws: invalid input gives `null`.
 */

/**
 * Checks a population-like list (finite, ≥ 0, not all zero) and returns its sum
 * after dividing by its largest entry, with that scale; null when invalid.
 */
function scaled(
  values: readonly number[],
): { readonly scale: number; readonly sum: number; readonly lnSum: number } | null {
  let scale = 0;
  let top = -1;
  for (let i = 0; i < values.length; i++) {
    const v = values[i]!;
    if (!Number.isFinite(v) || v < 0) return null;
    if (v > scale) [scale, top] = [v, i];
  }
  if (scale === 0) return null;
  // The sum is 1 (the largest entry) plus the rest; ln of it as log1p(rest), so that a rest below 1e-16
  // (a ground level holding all but 4e-18) still counts in ln Σ, and in the entropy, whose size it sets.
  let rest = 0;
  for (let i = 0; i < values.length; i++) if (i !== top) rest += values[i]! / scale;
  return { scale, sum: 1 + rest, lnSum: Math.log1p(rest) };
}

/**
 * ln(v/scale) for 0 < v ≤ scale: the quotient first (accurate, no cancellation of
 * large logarithms), the difference of logarithms only if the quotient underflows.
 */
function lnRatio(v: number, scale: number): number {
  const r = v / scale;
  return r > 0 ? Math.log(r) : Math.log(v) - Math.log(scale);
}

/** True when g is null, or has the given length and only finite entries > 0. */
function validDegeneracies(g: readonly number[] | null | undefined, length: number): boolean {
  if (g === null || g === undefined) return true;
  return g.length === length && g.every((x) => Number.isFinite(x) && x > 0);
}

/**
 * Gibbs entropy per system of a distribution over levels with degeneracies,
 * S/k = −Σ p_i ln(p_i/g_i), where p_i are the normalised level populations and
 * each of the g_i states of a level is equally populated; 0·ln 0 = 0.
 *
 * Units: k per system (nats); ln(Σ g_i) at most. `g` null means all 1.
 * Domain: populations finite and ≥ 0, not all 0; degeneracies finite and > 0,
 * same length. Returns null otherwise.
 */
export function gibbsEntropy(populations: readonly number[], g?: readonly number[] | null): number | null {
  const s = scaled(populations);
  if (s === null || !validDegeneracies(g, populations.length)) return null;
  const lnSum = s.lnSum;
  let entropy = 0;
  for (let i = 0; i < populations.length; i++) {
    const p = populations[i]! / s.scale / s.sum;
    if (p === 0) continue;
    entropy -= p * (lnRatio(populations[i]!, s.scale) - lnSum - Math.log(g ? g[i]! : 1));
  }
  return entropy + 0;
}

/**
 * Normalised Boltzmann populations p_i = g_i e^(−β E_i) / Z at inverse temperature β.
 *
 * Method: log-sum-exp with energies measured from the ground level for β ≥ 0 and
 * from the top level for β < 0, so that no exponent is positive: stable for any
 * sign and magnitude of β. β = +∞ puts everything in the lowest level(s) and
 * β = −∞ in the highest, shared in proportion to g.
 *
 * Units: energies E/k in K, β in K⁻¹. `g` null means all 1. Domain: at least one
 * level, finite energies, degeneracies finite and > 0, β not NaN; otherwise null.
 */
export function thermalDistribution(
  energiesK: readonly number[],
  g: readonly number[] | null | undefined,
  beta: number,
): number[] | null {
  const n = energiesK.length;
  if (n === 0 || Number.isNaN(beta) || !validDegeneracies(g, n)) return null;
  if (!energiesK.every(Number.isFinite)) return null;
  let ref = energiesK[0]!;
  for (const e of energiesK) if (beta >= 0 ? e < ref : e > ref) ref = e;
  const logWeights = energiesK.map((e, i) => {
    const lg = Math.log(g ? g[i]! : 1);
    if (e === ref || beta === 0) return lg; // β = 0: weights g alone, even if E − E_ref overflows
    // Infinite β: every level but the reference one gets weight 0.
    return Number.isFinite(beta) ? lg - beta * (e - ref) : -Infinity;
  });
  let max = -Infinity;
  for (const w of logWeights) if (w > max) max = w;
  const weights = logWeights.map((w) => Math.exp(w - max));
  const z = weights.reduce((a, b) => a + b, 0);
  return weights.map((w) => w / z);
}

/**
 * Mean energy ⟨E⟩ = Σ p_i E_i / Σ p_i of a distribution (populations on any scale).
 *
 * Units: K (E/k) per system. Domain: same length, finite energies, populations
 * finite and ≥ 0, not all 0; otherwise null.
 */
export function meanEnergy(populations: readonly number[], energiesK: readonly number[]): number | null {
  const s = scaled(populations);
  if (s === null || energiesK.length !== populations.length || !energiesK.every(Number.isFinite)) return null;
  let mean = 0;
  for (let i = 0; i < populations.length; i++) mean += (populations[i]! / s.scale / s.sum) * energiesK[i]!;
  return Number.isFinite(mean) ? mean + 0 : null;
}

/**
 * Relative entropy (Kullback–Leibler divergence) D(p‖q) = Σ p_i ln(p_i/q_i) in nats,
 * both distributions normalised first; terms with p_i = 0 contribute 0.
 *
 * Used as the entropy deficit of a measured distribution p against the thermal
 * distribution q at the same mean energy (≥ 0, 0 only when p = q).
 *
 * Domain: same length, entries finite and ≥ 0, neither all 0; otherwise null.
 * Returns +∞ when some q_i = 0 where p_i > 0 (p is not absolutely continuous on q).
 */
export function relativeEntropy(p: readonly number[], q: readonly number[]): number | null {
  const sp = scaled(p);
  const sq = scaled(q);
  if (sp === null || sq === null || p.length !== q.length) return null;
  const lnSumP = sp.lnSum;
  const lnSumQ = sq.lnSum;
  let d = 0;
  for (let i = 0; i < p.length; i++) {
    if (p[i] === 0) continue;
    if (q[i] === 0) return Infinity;
    const pi = p[i]! / sp.scale / sp.sum;
    d += pi * (lnRatio(p[i]!, sp.scale) - lnSumP - lnRatio(q[i]!, sq.scale) + lnSumQ);
  }
  // Rounding may leave a tiny negative value for p = q; the divergence is ≥ 0.
  return Math.max(0, d);
}
