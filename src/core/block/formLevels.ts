/**
 * Form 1 of the contract: explicit levels, a list of
 * `{ label, energy, g, population, uncertainty }` items in any order.
 */
import type { TreeNode } from './tree';
import { chooseUnits, siblingsOf, type PlausibleRange, type UnitChoice } from './unitChoice';
import { unknownKey } from './unknownKey';
import type { Span } from '../types';
import type { FormRead, LevelInput } from './input';
import { readPopulation, withSiblingUncertainty } from './populations';
import { LEVEL_KEY_NAMES } from './schema';
import { nonEmpty, readInteger, readList, readQuantity, readText, report, type ReadContext } from './values';
import { entries, isMap, spanOf, type Entry } from './yamlTree';

/** Reads the `levels` list; levels come back sorted by energy, lowest first. */
export function readLevelsForm(ctx: ReadContext, byKey: ReadonlyMap<string, Entry>): FormRead | null {
  const e = byKey.get('levels')!;
  if (byKey.has('populations')) {
    report(
      ctx,
      'error',
      'populations-misplaced',
      'With explicit `levels`, give each level its own `population:` instead of a `populations` list.',
      byKey.get('populations')!.keySpan,
    );
  }
  const items = readList(ctx, e.value, 'levels', e.valueSpan);
  if (!items) return null;
  if (items.length < 2) {
    report(
      ctx,
      'error',
      'levels-too-few',
      `levels: at least two levels are needed; ${items.length} given.`,
      nonEmpty(e.valueSpan),
    );
    return null;
  }
  const unit = firstEnergyUnit(ctx, items) ?? 'cm-1';
  // A bare energy is offered the units of the other levels that give it a magnitude near theirs (within 10³);
  // the siblings are read only then, as a bare energy is rare.
  const choose = (v: number): UnitChoice => {
    const siblings = siblingsOf(
      items.map((it) => {
        const x = isMap(it) ? entries(it).find((y) => y.key === 'energy') : undefined;
        return x ? (readText(ctx, x.value)?.text ?? '') : '';
      }),
      'energy',
    );
    return chooseUnits(v, 'energy', siblings, LEVEL_RANGE, [unit]);
  };
  const levels: LevelInput[] = [];
  let ok = true;
  items.forEach((item, i) => {
    const level = readLevel(ctx, item, i, choose);
    if (level) levels.push(level);
    else ok = false;
  });
  if (!ok) return null;
  descendingNote(ctx, e, items, levels);
  // Levels written lowest first (the usual order) need no sort (it is stable, so it would change nothing), only
  // a copy at the final length: the list grown by push keeps spare room, and this one stays cached with the block.
  const sorted = ascendingEnergies(levels) ? levels.slice() : [...levels].sort((a, b) => a.energy - b.energy);
  if (sorted[0].energy === sorted[sorted.length - 1].energy) {
    report(
      ctx,
      'error',
      'energy-equal',
      'levels: all levels have the same energy, so no temperature can be defined.',
      nonEmpty(e.valueSpan),
    );
    return null;
  }
  if (sorted.every((l) => l.population === 0)) {
    report(
      ctx,
      'error',
      'populations-zero',
      'levels: all populations are zero, so nothing can be computed.',
      nonEmpty(e.valueSpan),
    );
    return null;
  }
  // Two levels: the energies' uncertainties are the gap's, u(ΔE) = √(u_l² + u_u²), which the analysis carries into β and P_th.
  const uGap = sorted.length === 2 ? gapUncertainty(sorted[0].uEnergy ?? null, sorted[1].uEnergy ?? null) : null;
  return { form: 'levels', levels: sorted, energyUnit: unit, spin: null, polarization: null, ratio: null, uGap };
}

/** √(a² + b²) of the stated ones, or null when neither is stated. */
function gapUncertainty(a: number | null, b: number | null): number | null {
  if (a === null && b === null) return null;
  return Math.hypot(a ?? 0, b ?? 0);
}

function ascendingEnergies(levels: readonly LevelInput[]): boolean {
  for (let i = 1; i < levels.length; i++) if (!(levels[i - 1]!.energy <= levels[i]!.energy)) return false;
  return true;
}

/** The unit of the first level energy written with one, offered by the "add a unit" fix. */
function firstEnergyUnit(ctx: ReadContext, items: readonly (TreeNode | null)[]): string | null {
  for (const item of items) {
    const energy = entries(item).find((x) => x.key === 'energy');
    const t = energy ? readText(ctx, energy.value) : null;
    const m = t
      ? /^\s*[-+]?[\d.]+(?:[eE][-+]?\d+)?\s*(?:(?:±|\+-)\s*[\d.]+(?:[eE][-+]?\d+)?\s*)?([^\s\d].*?)\s*$/.exec(t.text)
      : null;
    if (m) return m[1];
  }
  return null;
}

/** Level energies may lie anywhere; only the siblings' spread (a factor 10³ either way) judges a bare number. */
const LEVEL_RANGE: PlausibleRange = { low: 0, high: Infinity, spread: 1e3 };

function readLevel(
  ctx: ReadContext,
  item: TreeNode | null,
  i: number,
  choose: (v: number) => UnitChoice,
): LevelInput | null {
  const span = spanOf(item);
  const subject = `levels[${i}]`;
  if (!isMap(item)) {
    report(
      ctx,
      'error',
      'level-not-mapping',
      `${subject}: each level is a mapping such as \`{ energy: 120 cm-1, g: 3, population: 0.25 }\`.`,
      nonEmpty(span ?? { start: 0, end: 0 }),
    );
    return null;
  }
  const byKey = new Map(entries(item).map((x) => [x.key, x] as const));
  for (const x of byKey.values()) if (!LEVEL_KEY_NAMES.has(x.key)) unknownKey(ctx, x, LEVEL_KEY_NAMES, byKey);
  const ee = byKey.get('energy');
  const pe = byKey.get('population');
  if (!ee) report(ctx, 'error', 'energy-missing', `${subject}: \`energy\` is required.`, nonEmpty(span!));
  if (!pe) report(ctx, 'error', 'population-missing', `${subject}: \`population\` is required.`, nonEmpty(span!));
  const energy = ee ? readQuantity(ctx, ee.value, 'energy', `${subject}.energy`, { unitChoice: choose }) : null;
  const g = byKey.get('g') ? readInteger(ctx, byKey.get('g')!.value, `${subject}.g`, 'degeneracy-invalid', 1) : null;
  const p0 = pe ? readPopulation(ctx, pe.value, `${subject}.population`) : null;
  const p = p0 ? withSiblingUncertainty(ctx, p0, byKey.get('uncertainty'), `${subject}.population`) : null;
  const label = byKey.get('label') ? readText(ctx, byKey.get('label')!.value) : null;
  if (!energy || !p || (byKey.get('g') && !g)) return null;
  return {
    label: label?.text ?? null,
    energy: energy.value,
    uEnergy: energy.uncertainty,
    g: g ? g.value : 1,
    population: p.value,
    uPopulation: p.uncertainty,
    span: span!,
    populationSpan: p.span,
  };
}

/**
 * Levels written from the top down are read correctly (they are sorted), but
 * a note reads better lowest first, as the format's other lists are; offer to
 * reverse them. The fix keeps every item's text and the separators between
 * items, so comments and layout survive.
 */
function descendingNote(ctx: ReadContext, e: Entry, items: readonly (TreeNode | null)[], levels: LevelInput[]): void {
  if (levels.length < 2 || levels.length !== items.length) return;
  for (let i = 1; i < levels.length; i++) if (!(levels[i].energy < levels[i - 1].energy)) return;
  const spans = items.map((it) => spanOf(it));
  if (spans.some((x) => x === null)) return;
  const s = spans as Span[];
  const texts = s.map((x) => ctx.body.slice(x.start, x.end));
  const seps = s.slice(1).map((x, i) => ctx.body.slice(s[i].end, x.start));
  let newText = texts[texts.length - 1];
  for (let i = 0; i < seps.length; i++) newText += seps[i] + texts[texts.length - 2 - i];
  report(
    ctx,
    'info',
    'levels-descending',
    'These levels are listed from the top (highest energy) down. The results are right either way, since the levels are sorted by energy; the fix lists them from the bottom up, as every other list of levels here is written.',
    e.keySpan,
    [{ title: 'List the levels lowest energy first', span: { start: s[0].start, end: s[s.length - 1].end }, newText }],
  );
}
