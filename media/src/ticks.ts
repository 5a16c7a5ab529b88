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
