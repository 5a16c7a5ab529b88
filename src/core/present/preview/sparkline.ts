/**
 * A small inline SVG of a level scheme's entropy curve S(E)/(Nk) with the
 * measured state as a dot: no script, no styles beyond presentation
 * attributes, so it survives the Markdown preview's security settings and an
 * HTML export. Colours follow the surrounding text (`currentColor`).
 */
import { schemeCurve } from '../../physics/curves';

/** Where the measured state sits: mean energy per system (K) and entropy S/(Nk). */
export interface SparkPoint {
  readonly energy: number;
  readonly entropy: number;
}

const W = 160;
const H = 48;
const PAD = 4;

/** The SVG text, or null when the scheme has no curve (fewer than two distinct energies). */
export function sparklineSvg(
  energiesK: readonly number[],
  g: readonly number[],
  point: SparkPoint | null,
  label: string,
): string | null {
  const curve = schemeCurve(energiesK, g, { points: 120 });
  if (!curve || curve.length < 2) return null;
  // Loops rather than Math.min(...values): a spread of a few hundred thousand levels overflows the stack.
  const eMin = energiesK.reduce((m, e) => Math.min(m, e), Infinity);
  const eMax = energiesK.reduce((m, e) => Math.max(m, e), -Infinity);
  const sMax = curve.reduce((m, p) => Math.max(m, p.entropy), -Infinity);
  if (!(eMax > eMin) || !(sMax > 0)) return null;
  const x = (e: number): number => PAD + ((e - eMin) / (eMax - eMin)) * (W - 2 * PAD);
  const y = (s: number): number => H - PAD - (s / sMax) * (H - 2 * PAD);
  const path = curve
    .map((p, i) => `${i === 0 ? 'M' : 'L'}${x(p.energy).toFixed(1)},${y(p.entropy).toFixed(1)}`)
    .join(' ');
  // β = 0 sits at the maximum of S: the region to its right is the inverted half.
  const top = curve.reduce((a, b) => (b.entropy > a.entropy ? b : a));
  const parts = [
    `<svg xmlns="http://www.w3.org/2000/svg" class="boltzmark-sparkline" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}" role="img" aria-label="${escapeAttr(label)}">`,
    `<title>${escapeText(label)}</title>`,
    `<rect x="${x(top.energy).toFixed(1)}" y="${PAD}" width="${(W - PAD - x(top.energy)).toFixed(1)}" height="${H - 2 * PAD}" fill="currentColor" fill-opacity="0.08"/>`,
    `<path d="${path}" fill="none" stroke="currentColor" stroke-width="1.5"/>`,
  ];
  if (point && Number.isFinite(point.energy) && Number.isFinite(point.entropy)) {
    parts.push(
      `<circle cx="${x(point.energy).toFixed(1)}" cy="${y(point.entropy).toFixed(1)}" r="3.5" fill="currentColor" stroke="none"/>`,
    );
  }
  parts.push('</svg>');
  return parts.join('');
}

/** Escapes text for an HTML/SVG text node. */
export function escapeText(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}

/** Escapes text for a double-quoted attribute. */
export function escapeAttr(s: string): string {
  return escapeText(s).replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}
