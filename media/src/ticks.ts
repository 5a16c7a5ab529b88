/**
 * Round tick steps for the charts: axis labels at round numbers (1, 2, 2.5
 * or 5 times a power of ten, or whole calendar steps for dates) rather than
 * wherever the range happens to start.
 */

/** The smallest step of the form {1, 2, 2.5, 5} × 10ⁿ that is at least `raw` (> 0); or of `steps` when given. */
export function niceStep(raw: number, steps?: readonly number[]): number {
  if (!(raw > 0) || !Number.isFinite(raw)) return 1;
  if (steps) return steps.find((s) => s >= raw) ?? steps[steps.length - 1]!;
  const power = 10 ** Math.floor(Math.log10(raw));
  for (const m of [1, 2, 2.5, 5, 10]) if (m * power >= raw * (1 - 1e-12)) return m * power;
  return 10 * power;
}

/** Tick values at multiples of a round step inside [min, max], about `count` of them. */
export function roundTicks(min: number, max: number, count = 6): number[] {
  if (!(max > min)) return [min];
  const step = niceStep((max - min) / Math.max(1, count));
  const first = Math.ceil(min / step - 1e-9) * step;
  const ticks: number[] = [];
  for (let v = first; v <= max + step * 1e-9 && ticks.length < 100; v += step)
    ticks.push(Math.abs(v) < step * 1e-9 ? 0 : Number(v.toPrecision(12)));
  return ticks;
}

/**
 * β values (K⁻¹) of round temperatures for the T axis beside a β axis over [min, max] (min < 0 < max
 * or one sign): T = ±{1, 2, 5} × 10ⁿ K, from the largest |β| inwards, each kept only when it lies at
 * least a tenth of the axis from the ticks already kept (so labels never pile up near β = 0, where
 * round T crowd together), and β = 0 (T = ±∞) when it is on the axis.
 */
export function temperatureTicks(min: number, max: number): number[] {
  const span = max - min;
  if (!(span > 0)) return [];
  const gap = span / 10;
  const biggest = Math.max(Math.abs(min), Math.abs(max));
  const kept: number[] = min <= 0 && max >= 0 ? [0] : [];
  const lowT = 1 / biggest;
  const first = Math.floor(Math.log10(lowT));
  for (let n = first; n <= first + 12; n++) {
    for (const m of [1, 2, 5]) {
      const t = m * 10 ** n;
      for (const beta of [1 / t, -1 / t]) {
        if (beta < min || beta > max) continue;
        if (kept.every((k) => Math.abs(k - beta) >= gap)) kept.push(beta);
      }
    }
  }
  return kept.sort((x, y) => x - y);
}
