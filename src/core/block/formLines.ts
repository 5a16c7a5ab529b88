/**
 * Emission lines of one species (a Boltzmann plot). For an optically thin line
 * in local thermodynamic equilibrium, I ∝ (hc/λ) g A N exp(−E_u/kT)/Z, so
 * ln(I λ/(g A)) (energy-calibrated detector) or ln(I/(g A)) (photon counting)
 * falls on a line of slope −β against the upper-level energy. Each line is
 * carried as an upper level with "population" n = I λ / A (or I / A), so the
 * Boltzmann fit of ln(n/g) against E serves emission data too.
 */
import type { TreeNode } from './tree';
import type { FormRead, LevelInput, LineInput } from './input';
import { LINE_KEYS } from './schema';
import { unknownKey } from './unknownKey';
import {
  nonEmpty,
  readInteger,
  readList,
  readNumber,
  readQuantity,
  readText,
  report,
  type ReadContext,
  type ReadValue,
} from './values';
import { entries, isMap, spanOf, type Entry } from './yamlTree';

const KEYS = new Set(LINE_KEYS.map((k) => k.key));

/** Reads `lines:` and `detector:`. */
export function readLinesForm(ctx: ReadContext, byKey: ReadonlyMap<string, Entry>): FormRead | null {
  const detector = readDetector(ctx, byKey.get('detector'));
  const e = byKey.get('lines')!;
  const items = readList(ctx, e.value, 'lines', e.valueSpan);
  if (!items || !detector) return null;
  if (items.length < 2) {
    report(
      ctx,
      'error',
      'lines-too-few',
      `lines: a Boltzmann plot needs at least two lines; ${items.length} given.`,
      nonEmpty(e.valueSpan),
    );
    return null;
  }
  const lines: LineInput[] = [];
  let ok = true;
  let species: { name: string } | null = null;
  items.forEach((item, i) => {
    const line = readLine(ctx, item, i, detector);
    if (!line) ok = false;
    else lines.push(line.line);
    if (line?.species) {
      if (species === null) species = { name: line.species.text };
      else if (line.species.text !== species.name) {
        report(
          ctx,
          'error',
          'lines-mixed-species',
          `lines[${i}]: species \`${line.species.text}\` differs from \`${species.name}\`; a Boltzmann plot takes the lines of one species only.`,
          line.species.span,
        );
        ok = false;
      }
    }
  });
  if (!ok) return null;
  if (new Set(lines.map((l) => l.upper)).size < 2) {
    report(
      ctx,
      'error',
      'energy-equal',
      'lines: all lines share one upper-level energy, so the plot has no slope.',
      nonEmpty(e.valueSpan),
    );
    return null;
  }
  const levels: LevelInput[] = lines
    .map((l) => {
      const scale = detector === 'energy' ? l.wavelength! / l.A : 1 / l.A;
      return {
        label: l.label,
        energy: l.upper,
        g: l.g,
        population: l.intensity * scale,
        uPopulation: l.uIntensity === null ? null : l.uIntensity * scale,
        span: l.span,
        populationSpan: l.span,
      };
    })
    .sort((a, b) => a.energy - b.energy);
  return {
    form: 'lines',
    levels,
    energyUnit: 'eV',
    spin: null,
    polarization: null,
    ratio: null,
    uGap: null,
    lines: { detector, lines },
  };
}

function readDetector(ctx: ReadContext, e: Entry | undefined): 'energy' | 'photon' | null {
  if (!e) return 'energy';
  const t = readText(ctx, e.value);
  if (t && (t.text === 'energy' || t.text === 'photon')) return t.text;
  report(
    ctx,
    'error',
    'detector-unknown',
    'detector: use `energy` (energy-calibrated intensities) or `photon` (photon counting).',
    t?.span ?? e.keySpan,
  );
  return null;
}

function readLine(
  ctx: ReadContext,
  item: TreeNode | null,
  i: number,
  detector: 'energy' | 'photon',
): { line: LineInput; species: { text: string; span: { start: number; end: number } } | null } | null {
  const subject = `lines[${i}]`;
  const span = nonEmpty(spanOf(item) ?? { start: 0, end: 0 });
  if (!isMap(item)) {
    report(
      ctx,
      'error',
      'line-not-mapping',
      `${subject}: each line is a mapping such as \`{ wavelength: 696.54 nm, upper: 13.328 eV, g: 3, A: 6.39e6, intensity: 1520 }\`.`,
      span,
    );
    return null;
  }
  const byKey = new Map(entries(item).map((x) => [x.key, x] as const));
  for (const x of byKey.values()) if (!KEYS.has(x.key)) unknownKey(ctx, x, KEYS);
  const need = (key: string, why: string): Entry | undefined => {
    const x = byKey.get(key);
    if (!x)
      report(ctx, 'error', `line-${key.toLowerCase()}-missing`, `${subject}: \`${key}\` is missing (${why}).`, span);
    return x;
  };
  const we =
    detector === 'energy'
      ? need('wavelength', 'energy-calibrated intensities need λ; use `detector: photon` for photon counts')
      : byKey.get('wavelength');
  const ue = need('upper', 'the upper-level energy');
  const ge = need('g', 'the upper level’s degeneracy');
  const ae = need('A', 'the transition probability in s⁻¹');
  const ie = need('intensity', 'the measured intensity');
  const wavelength = we ? readQuantity(ctx, we.value, 'length', `${subject}.wavelength`, { suggestUnit: 'nm' }) : null;
  const upper = ue ? readQuantity(ctx, ue.value, 'energy', `${subject}.upper`, { suggestUnit: 'eV' }) : null;
  const g = ge ? readInteger(ctx, ge.value, `${subject}.g`, 'degeneracy-invalid', 1) : null;
  const A = ae ? readQuantity(ctx, ae.value, 'rate', `${subject}.A`, { defaultUnit: 's-1' }) : null;
  const intensity = ie ? readIntensity(ctx, ie.value, byKey.get('uncertainty'), subject) : null;
  const label = byKey.get('label') ? readText(ctx, byKey.get('label')!.value) : null;
  const species = byKey.get('species') ? readText(ctx, byKey.get('species')!.value) : null;
  if (A && !(A.value > 0))
    report(ctx, 'error', 'line-a-invalid', `${subject}.A: a transition probability must be positive.`, A.span);
  if (wavelength && !(wavelength.value > 0))
    report(ctx, 'error', 'line-wavelength-invalid', `${subject}.wavelength must be positive.`, wavelength.span);
  if (
    (we && !wavelength) ||
    !upper ||
    !g ||
    !A ||
    !(A.value > 0) ||
    !intensity ||
    (wavelength && !(wavelength.value > 0))
  )
    return null;
  return {
    line: {
      label: label?.text ?? null,
      // Lengths arrive in cm; the plot only needs λ up to a constant, kept here in nm.
      wavelength: wavelength ? wavelength.value * 1e7 : null,
      upper: upper.value,
      g: g.value,
      A: A.value,
      intensity: intensity.value,
      uIntensity: intensity.uncertainty,
      span,
    },
    species: species && species.text !== '' ? species : null,
  };
}

function readIntensity(
  ctx: ReadContext,
  node: TreeNode | null,
  sibling: Entry | undefined,
  subject: string,
): ReadValue | null {
  const v = readNumber(ctx, node, `${subject}.intensity`);
  if (!v) return null;
  if (!(v.value > 0)) {
    report(
      ctx,
      'error',
      'line-intensity-invalid',
      `${subject}.intensity: must be positive (its logarithm is plotted).`,
      v.span,
    );
    return null;
  }
  if (!sibling) return v;
  const u = readNumber(ctx, sibling.value, `${subject}.uncertainty`);
  if (!u) return null;
  if (v.uncertainty !== null) {
    report(
      ctx,
      'error',
      'uncertainty-twice',
      `${subject}.intensity already carries ±; remove one of the two.`,
      sibling.keySpan,
    );
    return null;
  }
  if (u.value < 0) {
    report(ctx, 'error', 'uncertainty-negative', `${subject}.uncertainty: cannot be negative.`, u.span);
    return null;
  }
  return { ...v, uncertainty: u.value };
}
