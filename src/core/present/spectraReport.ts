/** The `spectra` list of a block's JSON entry and the table's lines for values taken from spectrum files. */
import type { BlockMeta } from '../block/input';
import { formatMeasured } from './numbers';
import type { SpectrumUse } from '../spectra/types';

/** One spectrum reference as the JSON report prints it (docs/format.md, "The JSON report"). */
export interface SpectrumEntry {
  /** Dotted path of the value it gives: `signal.hyperpolarized`, `series.signal[3]`, `lines[2].intensity`. */
  readonly key: string;
  /** The file as written. */
  readonly file: string;
  /** The region low to high in `unit`, or null when the reference could not be followed. */
  readonly region: readonly [number, number] | null;
  /** The x unit of the file (or of the region, for a text file without one). */
  readonly unit: string | null;
  readonly integral: { readonly value: number; readonly uncertainty: number | null } | null;
  readonly points: number | null;
}

/** Every spectrum reference of a block, in text order; one that could not be followed has null numbers. */
export function spectraEntries(meta: BlockMeta): SpectrumEntry[] {
  return (meta.spectra ?? []).map((u) => ({
    key: u.key,
    file: u.file,
    region: u.result ? [u.result.region[0], u.result.region[1]] : null,
    unit: u.result?.unit ?? null,
    // An integral past the double range (the block then has an error) is no number: null, as an unknown is.
    integral:
      u.result && Number.isFinite(u.result.value)
        ? {
            value: u.result.value,
            uncertainty:
              u.result.uncertainty !== null && Number.isFinite(u.result.uncertainty) ? u.result.uncertainty : null,
          }
        : null,
    points: u.result?.points ?? null,
  }));
}

/** The mark the table puts before a value taken from a spectrum file. */
export const FROM_FILE_MARK = '⌁';

/**
 * One line per spectrum reference for the table: `⌁ signal.thermal = 1.234(5)e4 from spectra/t.csv, 168 … 174 ppm, 61 points`,
 * or `⌁ signal.thermal: spectra/t.csv not read` for one that could not be followed.
 */
export function spectraLines(meta: BlockMeta): string[] {
  return (meta.spectra ?? []).map((u) => {
    const r = u.result;
    if (!r) return `${FROM_FILE_MARK} ${u.key}: ${u.file} not read (see the diagnostic)`;
    const unit = r.unit ? ` ${r.unit}` : '';
    return `${FROM_FILE_MARK} ${u.key} = ${formatMeasured(r.value, r.uncertainty)} from ${u.file}, ${num(r.region[0])} … ${num(r.region[1])}${unit}, ${r.points} points`;
  });
}

/** The integral's u with the baseline's own noise, said beside the format's. */
export function baselineNote(u: number): string {
  return `with the linear baseline's own noise, u = ${formatMeasured(u, null, { digits: 2 })}; the u above, the format's, counts the region's points only`;
}

function num(v: number): string {
  return Number(v.toPrecision(6)).toString();
}

/**
 * What a host shows for one reference (a hover, a tooltip), as plain lines:
 * the integral with its uncertainty and unit, the points and region, the
 * baseline, the noise, and the file. A reference not followed gives its file only.
 */
export function spectrumUseLines(u: SpectrumUse): string[] {
  const r = u.result;
  if (!r) return [`${u.key} from ${u.file}: not read (see the diagnostic)`];
  const unit = r.unit ?? 'the x unit';
  const lines = [
    `${u.key} = ${formatMeasured(r.value, r.uncertainty)} (y × ${unit})${r.uncertainty === null ? ', no noise region given' : ''}`,
    `${r.points} points in ${num(r.region[0])} … ${num(r.region[1])}${r.unit ? ` ${r.unit}` : ''}, ${r.baseline === 'linear' ? 'linear baseline' : 'no baseline'}`,
  ];
  if (r.noise && r.sigma !== null)
    lines.push(
      `noise σ = ${formatMeasured(r.sigma, null)} from ${r.noisePoints} points in ${num(r.noise[0])} … ${num(r.noise[1])}${r.unit ? ` ${r.unit}` : ''}`,
    );
  if (r.uncertaintyWithBaseline !== null) lines.push(baselineNote(r.uncertaintyWithBaseline));
  lines.push(`file: ${u.file}`);
  return lines;
}
