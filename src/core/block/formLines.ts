/**
 * Emission lines of one species (a Boltzmann plot). For an optically thin line
 * in local thermodynamic equilibrium, I ∝ (hc/λ) g A N exp(−E_u/kT)/Z, so
 * ln(I λ/(g A)) (energy-calibrated detector) or ln(I/(g A)) (photon counting)
 * falls on a line of slope −β against the upper-level energy. Each line is
 * carried as an upper level with "population" n = I λ / A (or I / A), so the
 * Boltzmann fit of ln(n/g) against E serves emission data too.
 */
import { readNumberOrSpectrum } from './spectrumRef';
import type { TreeNode } from './tree';
import { BOLTZMANN, KELVIN_PER_EV, KELVIN_PER_HERTZ, PLANCK, SPEED_OF_LIGHT } from '../quantities/constants';
import { parseQuantity } from '../quantities/units';
import { opticalDepthCorrection } from '../physics/radio';
import type { FormRead, LevelInput, LineInput } from './input';
import { mediumFor, opticalNm, readMedium, readOpticalDepth, vacuumNm } from './tradeKeys';
import { chooseUnits, siblingsOf, type PlausibleRange, type Sibling } from './unitChoice';
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
  const e = byKey.get('lines')!;
  const detector = readDetector(ctx, byKey.get('detector'), e);
  const stated = readMedium(ctx, byKey.get('wavelengths'));
  const items = readList(ctx, e.value, 'lines', e.valueSpan);
  if (!items || !detector || stated === undefined) return null;
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
  // The other lines' upper energies judge a bare one; read only when a line has one (rare).
  let known: Sibling[] | null = null;
  const uppers = (): readonly Sibling[] =>
    (known ??= siblingsOf(
      items.map((it) => {
        const x = isMap(it) ? entries(it).find((y) => y.key === 'upper') : undefined;
        return x ? (readText(ctx, x.value)?.text ?? '') : '';
      }),
      'energy',
    ));
  const how: LineReading = { detector: detector.kind, stated, uppers, media: [] };
  items.forEach((item, i) => {
    const line = readLine(ctx, item, i, how);
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
      const scale = populationScale(l, detector.kind);
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
    lines: { detector: detector.kind, detectorAssumed: detector.assumed, lines },
    trade: { medium: how.media[0] ?? null },
  };
}

/**
 * The factor that turns a line's intensity into the plotted "population" n,
 * so that ln(n/g) against E_u has slope −β:
 * - `energy`: n = Iλ/A (I ∝ (hc/λ) g A e^(−E/kT));
 * - `photon`: n = I/A (counts carry no hc/λ);
 * - `radiometer`: the upper-level column density, N_u = 8πkν²W/(hc³A) in cm⁻²
 *   for an integrated brightness W (K km/s) under the Rayleigh–Jeans
 *   approximation, times τ/(1 − e^(−τ)) for a line of optical depth τ
 *   (P. F. Goldsmith, W. D. Langer, ApJ 517, 209 (1999), the rotation diagram
 *   and its optical-depth correction).
 */
function populationScale(l: LineInput, detector: 'energy' | 'photon' | 'radiometer'): number {
  if (detector === 'energy') return l.wavelength! / l.A;
  if (detector === 'photon') return 1 / l.A;
  const nu = l.frequency!;
  // W in K km/s → K m/s (×10³); N_u in m⁻² → cm⁻² (×10⁻⁴).
  const perW = (8 * Math.PI * BOLTZMANN * nu * nu * 1e3 * 1e-4) / (PLANCK * SPEED_OF_LIGHT ** 3 * l.A);
  return perW * opticalDepthCorrection(l.opticalDepth ?? null);
}

type Detector = 'energy' | 'photon' | 'radiometer';

/** Reads `detector:`; without it `energy` is assumed and an information note (with a fix that states it) says so. */
function readDetector(
  ctx: ReadContext,
  e: Entry | undefined,
  lines: Entry,
): { kind: Detector; assumed: boolean } | null {
  if (!e) {
    // The fix writes the key on its own line before `lines:`, only where that key starts a line.
    const at = lines.keySpan.start;
    const lineStart = at === 0 || ctx.body[at - 1] === '\n';
    report(
      ctx,
      'info',
      'detector-assumed',
      'No `detector:` given: intensities are read as energy-calibrated, plotting ln(Iλ/(gA)). Say `detector: energy`, `photon` (photon counts, plotting ln(I/(gA))) or `radiometer` (integrated brightness temperatures in K km/s, a rotation diagram).',
      lines.keySpan,
      lineStart
        ? [{ title: 'State `detector: energy`', span: { start: at, end: at }, newText: 'detector: energy\n' }]
        : [],
    );
    return { kind: 'energy', assumed: true };
  }
  const t = readText(ctx, e.value);
  if (t && (t.text === 'energy' || t.text === 'photon' || t.text === 'radiometer'))
    return { kind: t.text, assumed: false };
  report(
    ctx,
    'error',
    'detector-unknown',
    'detector: use `energy` (energy-calibrated intensities), `photon` (photon counting) or `radiometer` (integrated brightness temperatures, K km/s).',
    t?.span ?? e.keySpan,
  );
  return null;
}

/** What every line of a block is read with. */
interface LineReading {
  readonly detector: Detector;
  readonly stated: { kind: 'air' | 'vacuum' } | null;
  readonly uppers: () => readonly Sibling[];
  /** The medium each optical wavelength was taken in, in reading order. */
  readonly media: { kind: 'air' | 'vacuum'; stated: boolean }[];
}

/** Atomic and ionic levels that a Boltzmann plot uses lie below about 100 eV (common practice, no source). */
const UPPER_RANGE: PlausibleRange = { low: 1e-3, high: 1.2e6, spread: 10 };

function readLine(
  ctx: ReadContext,
  item: TreeNode | null,
  i: number,
  how: LineReading,
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
  for (const x of byKey.values()) if (!KEYS.has(x.key)) unknownKey(ctx, x, KEYS, byKey);
  const need = (key: string, why: string): Entry | undefined => {
    const x = byKey.get(key);
    if (!x)
      report(ctx, 'error', `line-${key.toLowerCase()}-missing`, `${subject}: \`${key}\` is missing (${why}).`, span);
    return x;
  };
  const detector = how.detector;
  const we =
    detector === 'energy'
      ? need('wavelength', 'energy-calibrated intensities need λ; use `detector: photon` for photon counts')
      : byKey.get('wavelength');
  const fe =
    detector === 'radiometer'
      ? need('frequency', 'a rotation diagram needs the line frequency ν, as N_u ∝ ν²W/A')
      : byKey.get('frequency');
  const ue = need('upper', 'the upper-level energy');
  const ge = need('g', 'the upper level’s degeneracy');
  const ae = need('A', 'the transition probability in s⁻¹');
  const ie = need('intensity', 'the measured intensity');
  const te = byKey.get('optical-depth');
  const wavelength = we ? readQuantity(ctx, we.value, 'length', `${subject}.wavelength`, { suggestUnit: 'nm' }) : null;
  const frequency = fe ? readQuantity(ctx, fe.value, 'energy', `${subject}.frequency`, { suggestUnit: 'GHz' }) : null;
  const upper = ue
    ? readQuantity(ctx, ue.value, 'energy', `${subject}.upper`, {
        unitChoice: (v) => chooseUnits(v, 'energy', how.uppers(), UPPER_RANGE, ['eV', 'cm-1']),
      })
    : null;
  const g = ge ? readInteger(ctx, ge.value, `${subject}.g`, 'degeneracy-invalid', 1) : null;
  const A = ae ? readQuantity(ctx, ae.value, 'rate', `${subject}.A`, { defaultUnit: 's-1' }) : null;
  const intensity = ie ? readIntensity(ctx, ie.value, byKey.get('uncertainty'), subject, detector) : null;
  const tau = te ? readOpticalDepth(ctx, te.value, `${subject}.optical-depth`) : null;
  if (upper && detector !== 'radiometer' && upper.value > UPPER_RANGE.high)
    report(
      ctx,
      'warning',
      'energy-implausible',
      `${subject}.upper: E/k = ${upper.value.toPrecision(3)} K (${(upper.value / KELVIN_PER_EV).toPrecision(3)} eV) lies far above the levels of atoms and ions seen in emission (below about 100 eV); check the unit.`,
      upper.span,
    );
  const label = byKey.get('label') ? readText(ctx, byKey.get('label')!.value) : null;
  const species = byKey.get('species') ? readText(ctx, byKey.get('species')!.value) : null;
  if (A && !(A.value > 0))
    report(ctx, 'error', 'line-a-invalid', `${subject}.A: a transition probability must be positive.`, A.span);
  if (wavelength && !(wavelength.value > 0))
    report(ctx, 'error', 'line-wavelength-invalid', `${subject}.wavelength must be positive.`, wavelength.span);
  if (frequency && !(frequency.value > 0))
    report(ctx, 'error', 'line-frequency-invalid', `${subject}.frequency must be positive.`, frequency.span);
  if (
    (we && !wavelength) ||
    (fe && !(frequency && frequency.value > 0)) ||
    (te && !tau) ||
    !upper ||
    !g ||
    !A ||
    !(A.value > 0) ||
    !intensity ||
    (wavelength && !(wavelength.value > 0))
  )
    return null;
  // Lengths arrive in cm; λ is kept in nm, as a vacuum wavelength (an air one converted, IAU convention).
  let nm = wavelength ? wavelength.value * 1e7 : null;
  const optical = wavelength ? opticalNm(1, wavelength.unit) : null;
  if (nm !== null && optical !== null) {
    const medium = mediumFor(how.stated, nm);
    how.media.push(medium);
    nm = vacuumNm(nm, medium.kind);
  }
  return {
    line: {
      label: label?.text ?? null,
      wavelength: nm,
      frequency: frequency ? frequency.value / KELVIN_PER_HERTZ : null,
      opticalDepth: tau ? tau.value : null,
      poisson: intensity.poisson,
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

/** Units an integrated brightness may carry: K km/s, the radio astronomer's W = ∫T_B dv. */
const INTEGRATED = new Set(['K km/s', 'K km s-1', 'K km s^-1', 'K.km/s', 'K·km/s']);

function readIntensity(
  ctx: ReadContext,
  node: TreeNode | null,
  sibling: Entry | undefined,
  subject: string,
  detector: Detector,
): (ReadValue & { poisson: boolean }) | null {
  const v =
    detector === 'radiometer'
      ? readIntegrated(ctx, node, `${subject}.intensity`)
      : readNumberOrSpectrum(ctx, node, `${subject}.intensity`);
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
  if (!sibling) {
    // Photon counts follow Poisson statistics: without a stated uncertainty, u(N) = √N.
    // Not for a spectrum's integral: counts × an x unit are no count.
    if (detector === 'photon' && v.uncertainty === null && !v.fromSpectrum)
      return { ...v, uncertainty: Math.sqrt(v.value), poisson: true };
    return { ...v, poisson: false };
  }
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
  return { ...v, uncertainty: u.value, poisson: false };
}

/** An integrated brightness, bare (K km/s understood) or with the unit `K km/s`. */
function readIntegrated(ctx: ReadContext, node: TreeNode | null, subject: string): ReadValue | null {
  const t = readText(ctx, node);
  const q = t ? parseQuantity(t.text) : null;
  if (!t || !q || 'problem' in q || q.quantity.unit === null) return readNumber(ctx, node, subject);
  if (INTEGRATED.has(q.quantity.unit.replace(/\s+/g, ' ')))
    return { value: q.quantity.value, uncertainty: q.quantity.uncertainty, span: t.span, unit: 'K km/s' };
  report(
    ctx,
    'error',
    'intensity-unit',
    `${subject}: an integrated brightness is written in K km/s (\`12.3 K km/s\` or a bare number); \`${q.quantity.unit}\` is not that.`,
    t.span,
  );
  return null;
}
