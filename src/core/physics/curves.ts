/**
 * Entropy S(E) and inverse temperature β(E) of N independent copies of a level
 * scheme in the large-N limit, where the microcanonical entropy per system equals
 * the Gibbs entropy of the thermal distribution with the same mean energy:
 * S/(Nk) = ln Z + β⟨E⟩, dS/dE = β, with β of either sign (negative above the
 * β = 0 midpoint, where S is largest, S = ln Σg).
 *
 * Sources: D. V. Schroeder, An Introduction to Thermal Physics, Addison Wesley
 * Longman 2000, ch. 3 and 6; C. Kittel, H. Kroemer, Thermal Physics, 2nd ed.,
 * Freeman 1980, ch. 2–3 and Appendix E (negative temperature).
 *
 * Units: energies E/k in K, β in K⁻¹, S in k per system. Nothing here throws.
 */

/** A checked level scheme in typed arrays (ln g precomputed) for the O(levels) loops. */
interface Scheme {
  readonly e: Float64Array;
  readonly lnG: Float64Array;
  readonly min: number;
  readonly max: number;
}

/** Thermal state at one β: mean energy (K per system) and entropy (k per system). */
interface Moments {
  readonly energy: number;
  readonly entropy: number;
}

/** Validates (≥ 2 levels, finite energies with a non-zero span, g finite and > 0; g null = all 1). */
function prepare(energiesK: readonly number[], g: readonly number[] | null | undefined): Scheme | null {
  const n = energiesK.length;
  if (n < 2 || (g && g.length !== n)) return null;
  const e = new Float64Array(n);
  const lnG = new Float64Array(n);
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < n; i++) {
    const ei = energiesK[i]!;
    const gi = g ? g[i]! : 1;
    if (!Number.isFinite(ei) || !Number.isFinite(gi) || gi <= 0) return null;
    e[i] = ei;
    lnG[i] = Math.log(gi);
    min = Math.min(min, ei);
    max = Math.max(max, ei);
  }
  const span = max - min;
  return span > 0 && Number.isFinite(span) && Number.isFinite(1 / span) ? { e, lnG, min, max } : null;
}

/**
 * Mean energy and Gibbs entropy of the thermal distribution at finite β, in one
 * O(levels) pass: log-sum-exp with energies measured from the lowest level for
 * β ≥ 0 and from the highest for β < 0, so no exponent is positive;
 * S = ln Z′ + w_max + β(⟨E⟩ − E_ref).
 */
function moments(s: Scheme, beta: number): Moments {
  const ref = beta >= 0 ? s.min : s.max;
  let wMax = -Infinity;
  for (let i = 0; i < s.e.length; i++) wMax = Math.max(wMax, s.lnG[i]! - beta * (s.e[i]! - ref));
  let z = 0;
  let first = 0;
  for (let i = 0; i < s.e.length; i++) {
    const w = Math.exp(s.lnG[i]! - beta * (s.e[i]! - ref) - wMax);
    z += w;
    first += w * (s.e[i]! - ref);
  }
  const shift = first / z;
  return { energy: ref + shift, entropy: Math.log(z) + wMax + beta * shift };
}

/** One point of an S(E), β(E) curve. */
export interface CurvePoint {
  /** Inverse temperature, K⁻¹. */
  readonly beta: number;
  /** Mean energy per system, K (E/k). */
  readonly energy: number;
  /** Entropy S/(Nk). */
  readonly entropy: number;
}

/** Upper bound on the number of points of one curve, so that a setting cannot ask for unbounded work. */
export const MAX_CURVE_POINTS = 100000;

/** Relative distance from the ground or top energy at which the curve stops. */
const END_TOLERANCE = 1e-6;

/** Smallest β > 0 (by doubling from 1/span) whose mean energy lies within END_TOLERANCE·span of an end; sign picks the end. */
function endBeta(s: Scheme, sign: 1 | -1): number {
  const span = s.max - s.min;
  let b = 1 / span;
  for (let i = 0; i < 1100; i++) {
    const m = moments(s, sign * b).energy;
    if ((sign > 0 ? m - s.min : s.max - m) <= END_TOLERANCE * span || !Number.isFinite(2 * b)) break;
    b *= 2;
  }
  return b;
}

/** Binary max-heap of intervals keyed by chord length (refinement queue). */
class Queue {
  private readonly items: Array<{ key: number; lo: number; hi: number }> = [];
  get size(): number {
    return this.items.length;
  }
  push(item: { key: number; lo: number; hi: number }): void {
    const a = this.items;
    a.push(item);
    for (let i = a.length - 1; i > 0;) {
      const p = (i - 1) >> 1;
      if (a[p]!.key >= a[i]!.key) break;
      [a[p], a[i]] = [a[i]!, a[p]!];
      i = p;
    }
  }
  pop(): { key: number; lo: number; hi: number } {
    const a = this.items;
    const top = a[0]!;
    const last = a.pop()!;
    if (a.length > 0) {
      a[0] = last;
      for (let i = 0; ;) {
        const l = 2 * i + 1;
        const r = l + 1;
        let m = i;
        if (l < a.length && a[l]!.key > a[m]!.key) m = l;
        if (r < a.length && a[r]!.key > a[m]!.key) m = r;
        if (m === i) break;
        [a[m], a[i]] = [a[i]!, a[m]!];
        i = m;
      }
    }
    return top;
  }
}

/**
 * The S(E) and β(E) curve of a level scheme for N independent systems in the
 * large-N limit, from near the ground state (β large and positive) through β = 0
 * to near the top state (β large and negative), ordered by increasing energy.
 *
 * Range: the end values of β are the first powers of two (times 1/span) whose mean
 * energy lies within 1e-6 of the span from the ground or top energy.
 * Sampling: β is parametrised by t ∈ [−1, 1] on a logarithmic scale
 * (β = ±expm1(|t|·ln(1 + β_end·span))/span), 17 even steps in t to start, then the
 * interval with the longest chord in the normalised coordinates
 * ((E − E_min)/span, S/ln Σg, (2/π)·atan(β·span/4)) is halved until `points` are
 * placed, so points crowd where S or β changes fast.
 * Cost O(points × levels + points log points).
 *
 * Domain: ≥ 2 levels with finite energies and a non-zero span, g (null = all 1)
 * finite and > 0; `points` between 3 and {@link MAX_CURVE_POINTS} (default 400, clamped).
 * Returns null otherwise.
 */
export function schemeCurve(
  energiesK: readonly number[],
  g: readonly number[] | null | undefined,
  opts?: { readonly points?: number },
): CurvePoint[] | null {
  const s = prepare(energiesK, g);
  if (s === null) return null;
  const requested = opts?.points;
  const points =
    requested !== undefined && Number.isFinite(requested)
      ? Math.min(MAX_CURVE_POINTS, Math.max(3, Math.floor(requested)))
      : 400;
  const span = s.max - s.min;
  const logHi = Math.log1p(endBeta(s, 1) * span);
  const logLo = Math.log1p(endBeta(s, -1) * span);
  const betaOf = (t: number): number => (t >= 0 ? Math.expm1(t * logHi) : -Math.expm1(-t * logLo)) / span;
  let sMax = 0;
  for (let i = 0; i < s.e.length; i++) sMax += Math.exp(s.lnG[i]!);
  const sScale = Math.log(sMax) > 0 ? Math.log(sMax) : 1;
  const byT = new Map<number, CurvePoint>();
  const at = (t: number): CurvePoint => {
    let p = byT.get(t);
    if (!p) {
      const beta = betaOf(t) + 0;
      const m = moments(s, beta);
      p = { beta, energy: m.energy, entropy: m.entropy };
      byT.set(t, p);
    }
    return p;
  };
  const chord = (lo: number, hi: number): number => {
    const a = at(lo);
    const b = at(hi);
    const db = (2 / Math.PI) * (Math.atan((a.beta * span) / 4) - Math.atan((b.beta * span) / 4));
    return Math.hypot((a.energy - b.energy) / span, (a.entropy - b.entropy) / sScale, db);
  };
  const start = Math.min(points, 17) - 1;
  const queue = new Queue();
  for (let i = 0; i < start; i++) {
    const lo = -1 + (2 * i) / start;
    const hi = i + 1 === start ? 1 : -1 + (2 * (i + 1)) / start;
    queue.push({ key: chord(lo, hi), lo, hi });
  }
  while (byT.size < points && queue.size > 0) {
    const { lo, hi } = queue.pop();
    const mid = lo + (hi - lo) / 2;
    if (mid === lo || mid === hi) continue;
    queue.push({ key: chord(lo, mid), lo, hi: mid });
    queue.push({ key: chord(mid, hi), lo: mid, hi });
  }
  // Decreasing β is increasing energy. Schemes at the edge of the double range may still overflow: no curve then.
  const curve = [...byT.values()].sort((a, b) => b.beta - a.beta);
  return curve.every((p) => Number.isFinite(p.beta) && Number.isFinite(p.energy) && Number.isFinite(p.entropy))
    ? curve
    : null;
}

/**
 * Inverse temperature β of the thermal state whose mean energy is E: solves
 * ⟨E⟩(β) = E by bisection (⟨E⟩ decreases strictly with β), after bracketing by
 * doubling |β| from 1/span; stops when the bracket is a few ulps wide
 * (about 55 + log₂(β·span) evaluations of O(levels) each).
 *
 * Units: E and energies E/k in K, β in K⁻¹. Domain: as {@link schemeCurve}, and
 * E_min < E < E_max (the end values need β = ±∞); otherwise null.
 */
export function betaAtEnergy(
  energiesK: readonly number[],
  g: readonly number[] | null | undefined,
  energyK: number,
): number | null {
  const s = prepare(energiesK, g);
  if (s === null || !(energyK > s.min && energyK < s.max)) return null;
  return solveBeta(s, energyK);
}

/** Bisection behind {@link betaAtEnergy}; E strictly inside the span. */
function solveBeta(s: Scheme, energyK: number): number {
  const mid = moments(s, 0).energy;
  if (energyK === mid) return 0;
  const sign = energyK < mid ? 1 : -1; // below the β = 0 energy, β > 0
  let lo = 0;
  let hi = 1 / (s.max - s.min);
  for (let i = 0; i < 2100 && Number.isFinite(2 * hi) && sign * (moments(s, sign * hi).energy - energyK) > 0; i++) {
    lo = hi;
    hi *= 2;
  }
  // Stop at double-precision resolution of the bracket, relative to its upper end.
  for (let i = 0; i < 2200 && hi - lo > 2 * Number.EPSILON * hi; i++) {
    const m = lo + (hi - lo) / 2;
    const d = sign * (moments(s, sign * m).energy - energyK);
    if (d === 0) return sign * m + 0;
    if (d > 0) lo = m;
    else hi = m;
  }
  return sign * (lo + (hi - lo) / 2) + 0;
}

/**
 * The thermal state with the same mean energy as a given (possibly non-thermal)
 * distribution: its β (via {@link betaAtEnergy}) and its Gibbs entropy S/(Nk),
 * the largest entropy any distribution over these levels can have at that energy.
 *
 * Units: E/k in K, β in K⁻¹, entropy in k per system. Domain: as
 * {@link betaAtEnergy}; otherwise null.
 */
export function thermalStateAtEnergy(
  energiesK: readonly number[],
  g: readonly number[] | null | undefined,
  energyK: number,
): CurvePoint | null {
  const s = prepare(energiesK, g);
  if (s === null || !(energyK > s.min && energyK < s.max)) return null;
  const beta = solveBeta(s, energyK);
  return { beta, energy: energyK, entropy: moments(s, beta).entropy };
}
