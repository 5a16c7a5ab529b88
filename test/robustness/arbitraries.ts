/**
 * Generators (fast-check arbitraries) of what a note may contain: numbers as
 * people and machines write them (−0, subnormals, 1e308, overflow, NaN and
 * infinity spellings, the Unicode minus, decimal commas), quantities with
 * good and bad units, YAML bodies of every block form with random values and
 * random damage, and whole Markdown notes with random fences and line ends.
 */
import fc from 'fast-check';
import { BLOCK_KEYS, LEVEL_KEYS, unitsFor, type Dimension } from '../../src/core';

/** Numbers as text: edge cases first, then any double in several spellings. */
export const numberText: fc.Arbitrary<string> = fc.oneof(
  fc.constantFrom(
    '0',
    '-0',
    '+0',
    '0.0',
    '-0.0',
    '5e-324',
    '-5e-324',
    '2.2250738585072014e-308',
    '1e-320',
    '1e308',
    '-1e308',
    '1.7976931348623157e308',
    '1.8e308',
    '1e309',
    '-1e400',
    'NaN',
    'nan',
    '.nan',
    '.NaN',
    'Infinity',
    '-Infinity',
    'inf',
    '.inf',
    '-.inf',
    '−3.5',
    '3.5e−4',
    '1,5',
    '0x1F',
    '0o17',
    '1_000',
    '',
    '+',
    '-',
    '.',
    '.5',
    '-.5e-3',
    '1e',
    '1e+',
    '9007199254740993',
    '1.0000000000000002',
    '0.1',
    '1',
    '2',
    '100',
    '1e-9',
    '3.14159',
  ),
  fc.double().map((x) => (Object.is(x, -0) ? '-0' : String(x))),
  fc.double({ noNaN: true, noDefaultInfinity: true }).map((x) => x.toExponential()),
  fc.double({ min: -1e6, max: 1e6, noNaN: true }).map((x) => x.toFixed(3)),
  fc.integer({ min: -1000, max: 1000 }).map(String),
);

/** Positive everyday numbers as text (for values a block needs to read at all). */
export const plainPositive: fc.Arbitrary<string> = fc.oneof(
  fc.double({ min: 1e-6, max: 1e6, noNaN: true }).map((x) => x.toPrecision(6)),
  fc.integer({ min: 1, max: 10000 }).map(String),
);

const DIMENSIONS: readonly Dimension[] = ['energy', 'field', 'temperature', 'time', 'angle', 'density', 'length'];

/** A unit: valid in some dimension, valid in the wrong case, aliases, or junk. */
export const unitText: fc.Arbitrary<string> = fc.oneof(
  fc.constantFrom(...DIMENSIONS.flatMap((d) => unitsFor(d))),
  fc.constantFrom(
    'MT',
    'k',
    'KELVIN',
    'cm^-1',
    '1/cm',
    'cm⁻¹',
    'ueV',
    'µK',
    'μK',
    '°C',
    'degC',
    'deg',
    'rad',
    'sec',
    'nm',
    'T T',
    '%',
    '∞',
    '🙂',
    'K\u0000',
  ),
  fc.string({ maxLength: 6 }),
);

/** A quantity as written: number, optional ± uncertainty, optional unit, random spacing. */
export const quantityText: fc.Arbitrary<string> = fc
  .tuple(
    numberText,
    fc.option(fc.tuple(fc.constantFrom('±', '+-', '+/-', ' ± '), numberText), { nil: undefined }),
    fc.option(unitText, { nil: undefined }),
    fc.constantFrom(' ', '', '  ', '\t'),
  )
  .map(([n, u, unit, sp]) => `${n}${u ? `${sp}${u[0]}${sp}${u[1]}` : ''}${unit !== undefined ? `${sp}${unit}` : ''}`);

/** A YAML scalar that may be quoted (and then may hold anything). */
const scalar: fc.Arbitrary<string> = fc.oneof(
  quantityText,
  numberText,
  quantityText.map((q) => JSON.stringify(q)),
  fc.string({ maxLength: 12 }).map((s) => JSON.stringify(s)),
  fc.constantFrom(
    'null',
    '~',
    'true',
    'false',
    '[]',
    '{}',
    '""',
    "''",
    '*a',
    '&a 1',
    '!!str 5',
    '!!float .nan',
    '|',
    '>-',
  ),
);

/** A flow list of scalars, e.g. `[0.7, 0.3]`. */
const flowList: fc.Arbitrary<string> = fc
  .array(fc.oneof(numberText, quantityText), { maxLength: 6 })
  .map((xs) => `[${xs.join(', ')}]`);

/** One explicit level as a flow mapping, sometimes missing keys or with unknown ones. */
const levelItem: fc.Arbitrary<string> = fc
  .subarray([...LEVEL_KEYS.map((k) => k.key), 'energie', 'n'], { minLength: 0 })
  .chain((keys) =>
    fc.tuple(
      ...keys.map((k) =>
        (k === 'energy'
          ? quantityText
          : k === 'label'
            ? fc.string({ maxLength: 5 }).map((s) => JSON.stringify(s))
            : numberText
        ).map((v) => `${k}: ${v}`),
      ),
    ),
  )
  .map((pairs) => `  - { ${pairs.join(', ')} }`);

/** A value for a top-level key: scalars, lists, level lists, nested maps, or damage. */
const value: fc.Arbitrary<string> = fc.oneof(
  { weight: 4, arbitrary: scalar.map((s) => ` ${s}`) },
  { weight: 2, arbitrary: flowList.map((s) => ` ${s}`) },
  { weight: 2, arbitrary: fc.array(levelItem, { minLength: 0, maxLength: 5 }).map((items) => `\n${items.join('\n')}`) },
  {
    weight: 1,
    arbitrary: fc
      .array(
        fc.tuple(
          fc.constantFrom('model', 'time', 'signal', 'flip', 'hyperpolarized', 'thermal', 'scans'),
          fc.oneof(scalar, flowList),
        ),
        { maxLength: 4 },
      )
      .map((kv) => `\n${kv.map(([k, v]) => `  ${k}: ${v}`).join('\n')}`),
  },
  {
    weight: 1,
    arbitrary: fc.constantFrom(
      '',
      ' &anchor [1, 2]',
      ' *anchor',
      ' [',
      ' {a: ',
      '\n\t- tab',
      '\n  -',
      ' "unterminated',
      ' a: b: c',
    ),
  },
);

const keys = [...BLOCK_KEYS.map((k) => k.key), 'polarisation', 'Field', 'levls', 'x', '? complex', '- item', ''];

/** A block body: key lines in random order, sometimes with junk lines, tabs or CR line ends. */
export const yamlBody: fc.Arbitrary<string> = fc
  .array(
    fc.oneof(
      { weight: 8, arbitrary: fc.tuple(fc.constantFrom(...keys), value).map(([k, v]) => `${k}:${v}`) },
      { weight: 1, arbitrary: fc.string({ maxLength: 20 }) },
    ),
    { maxLength: 10 },
  )
  .chain((lines) => fc.constantFrom('\n', '\r\n', '\r').map((eol) => lines.join(eol)));

/** A level scheme description in one of the block forms, with random (often sensible) numbers. */
export const formBody: fc.Arbitrary<string> = fc.oneof(
  fc
    .tuple(
      fc.constantFrom('1H', '13C', '7Li', '129Xe', 'electron', 'C13', '2H'),
      quantityText,
      fc.oneof(numberText, flowList),
      fc.option(quantityText, { nil: undefined }),
    )
    .map(([sys, field, m, lattice]) =>
      [
        `system: ${sys}`,
        `field: ${field}`,
        m.startsWith('[') ? `populations: ${m}` : `polarization: ${m}`,
        ...(lattice ? [`lattice: ${lattice}`] : []),
      ].join('\n'),
    ),
  fc
    .tuple(
      quantityText,
      fc.oneof(
        flowList.map((l) => `populations: ${l}`),
        quantityText.map((r) => `ratio: ${r}`),
      ),
      fc.option(flowList, { nil: undefined }),
    )
    .map(([gap, m, g]) => [`gap: ${gap}`, m, ...(g ? [`g: ${g}`] : [])].join('\n')),
  fc
    .array(fc.tuple(plainPositive, fc.oneof(plainPositive, numberText), fc.integer({ min: 0, max: 5 })), {
      minLength: 0,
      maxLength: 6,
    })
    .map((ls) => ['levels:', ...ls.map(([e, n, g]) => `  - { energy: ${e} K, g: ${g}, population: ${n} }`)].join('\n')),
  fc
    .tuple(
      fc.constantFrom('decay', 'buildup', 'growth'),
      fc.array(plainPositive, { maxLength: 8 }),
      fc.array(numberText, { maxLength: 8 }),
    )
    .map(([model, t, s]) =>
      [
        'system: 13C',
        'field: 9.4 T',
        'series:',
        `  model: ${model}`,
        `  time: [${t.map((x) => `${x} s`).join(', ')}]`,
        `  signal: [${s.join(', ')}]`,
      ].join('\n'),
    ),
  fc
    .array(fc.tuple(plainPositive, plainPositive, plainPositive, numberText), { maxLength: 5 })
    .map((ls) =>
      [
        'lines:',
        ...ls.map(([w, u, a, i]) => `  - { wavelength: ${w} nm, upper: ${u} cm-1, g: 3, A: ${a}e6, intensity: ${i} }`),
      ].join('\n'),
    ),
);

/** A Markdown line that is not a fence. */
const prose = fc.oneof(
  fc.constantFrom(
    '# Lab note',
    '',
    'Some text.',
    '- [x] item',
    '> quote',
    '    indented code',
    '\t tab',
    '\u00A0nbsp',
    '<!-- comment -->',
    '`inline` code',
  ),
  fc.string({ maxLength: 30 }),
);

/** A fence line: backticks or tildes, 2 to 5 long, indented 0 to 4, with an info string. */
const fenceLine = fc
  .tuple(
    fc.integer({ min: 0, max: 4 }),
    fc.constantFrom('`', '~'),
    fc.integer({ min: 2, max: 5 }),
    fc.constantFrom('levels', ' levels', 'levels extra', 'yaml', '', 'levels `x`', 'populations'),
  )
  .map(([indent, ch, n, info]) => `${' '.repeat(indent)}${ch.repeat(n)}${info}`);

/** A note of prose, fences (balanced or not) and block bodies, with random line ends and sometimes a BOM. */
export const markdownNote: fc.Arbitrary<string> = fc
  .tuple(
    fc.boolean(),
    fc.array(
      fc.oneof(
        { weight: 3, arbitrary: prose },
        { weight: 2, arbitrary: fenceLine },
        { weight: 2, arbitrary: yamlBody },
        { weight: 3, arbitrary: formBody.map((b) => `\`\`\`levels\n${b}\n\`\`\``) },
      ),
      { maxLength: 14 },
    ),
    fc.constantFrom('\n', '\r\n', '\r', 'mixed'),
  )
  .map(([bom, parts, eol]) => {
    const text = eol === 'mixed' ? parts.map((p, i) => p + ['\n', '\r\n', '\r'][i % 3]).join('') : parts.join(eol);
    const withEol = eol === 'mixed' ? text : text.replace(/\r\n|\r|\n/g, eol);
    return (bom ? '\uFEFF' : '') + withEol;
  });

/** A finite double in [min, max] as text, often one of the awkward ones (±0, subnormals, the largest doubles). */
export function finiteText(min: number, max: number): fc.Arbitrary<string> {
  const edges = [
    0,
    -0,
    5e-324,
    -5e-324,
    2.2250738585072014e-308,
    1e-300,
    1e-12,
    1,
    1 - 2 ** -53,
    1 + 2 ** -52,
    1e12,
    1e300,
    1e308,
    1.7976931348623157e308,
  ]
    .flatMap((x) => [x, -x])
    .filter((x) => x >= min && x <= max);
  return fc
    .oneof(
      fc.constantFrom(...edges),
      fc.double({ min, max, noNaN: true, noDefaultInfinity: true }),
      fc.double({ min: Math.max(min, -1e3), max: Math.min(max, 1e3), noNaN: true }),
    )
    .map((x) => (Object.is(x, -0) ? '-0' : String(x)));
}

const nonNegative = finiteText(0, Number.MAX_VALUE);
const positive = finiteText(Number.MIN_VALUE, Number.MAX_VALUE);
const fraction = finiteText(-1, 1);
const ENERGY_UNITS = ['K', 'mK', 'cm-1', 'GHz', 'MHz', 'eV', 'meV', 'J'];
const uncertainty = fc.option(
  fc.tuple(fc.constantFrom(' ± ', ' +- '), nonNegative).map(([pm, u]) => `${pm}${u}`),
  { nil: '' },
);

/**
 * A block of any form that reads without syntax errors most of the time, with
 * values drawn from the whole double range, so the analysis itself meets
 * overflow, underflow, saturation and complete inversion.
 */
export const numericBlock: fc.Arbitrary<string> = fc.oneof(
  fc
    .tuple(
      fc.constantFrom('1H', '13C', '129Xe', 'electron'),
      positive,
      fraction,
      uncertainty,
      fc.option(positive, { nil: undefined }),
    )
    .map(([sys, field, p, u, lattice]) =>
      [
        `system: ${sys}`,
        `field: ${field} T`,
        `polarization: ${p}${u}`,
        ...(lattice ? [`lattice: ${lattice} K`] : []),
      ].join('\n'),
    ),
  fc
    .tuple(fc.constantFrom('7Li', '2H', '1H'), positive, fc.array(nonNegative, { minLength: 2, maxLength: 4 }))
    .map(([sys, field, pops]) =>
      [`system: ${sys}`, `field: ${field} mT`, `populations: [${pops.join(', ')}]`].join('\n'),
    ),
  fc
    .tuple(
      positive,
      fc.constantFrom(...ENERGY_UNITS, 'nm'),
      fc.oneof(
        fc.array(nonNegative, { minLength: 2, maxLength: 2 }).map((p) => `populations: [${p.join(', ')}]`),
        nonNegative.map((r) => `ratio: ${r}`),
      ),
      fc.option(fc.tuple(fc.integer({ min: 1, max: 9 }), fc.integer({ min: 1, max: 9 })), { nil: undefined }),
      uncertainty,
    )
    .map(([gap, unit, m, g, u]) => [`gap: ${gap}${u} ${unit}`, m, ...(g ? [`g: [${g[0]}, ${g[1]}]`] : [])].join('\n')),
  fc
    .tuple(
      fc.constantFrom(...ENERGY_UNITS),
      fc.array(
        fc.tuple(
          finiteText(-Number.MAX_VALUE, Number.MAX_VALUE),
          fc.integer({ min: 1, max: 6 }),
          nonNegative,
          fc.option(nonNegative, { nil: undefined }),
        ),
        { minLength: 2, maxLength: 8 },
      ),
    )
    .map(([unit, ls]) =>
      [
        'levels:',
        ...ls.map(
          ([e, g, n, u]) =>
            `  - { energy: ${e} ${unit}, g: ${g}, population: ${n}${u !== undefined ? `, uncertainty: ${u}` : ''} }`,
        ),
      ].join('\n'),
    ),
  fc
    .tuple(
      fc.constantFrom('decay', 'buildup'),
      fc.array(positive, { minLength: 2, maxLength: 8 }),
      fc.array(finiteText(-1e6, 1e6), { minLength: 8, maxLength: 8 }),
      fc.option(finiteText(0, 89), { nil: undefined }),
    )
    .map(([model, t, s, flip]) => {
      const times = [...t].sort((a, b) => Number(a) - Number(b));
      return [
        'series:',
        `  model: ${model}`,
        `  time: [${times.map((x) => `${x} s`).join(', ')}]`,
        `  signal: [${s.slice(0, times.length).join(', ')}]`,
        ...(flip !== undefined ? [`  flip: ${flip} deg`] : []),
      ].join('\n');
    }),
  fc
    .array(fc.tuple(positive, finiteText(-1e6, 1e6), positive, positive), { minLength: 2, maxLength: 6 })
    .map((ls) =>
      [
        'lines:',
        ...ls.map(
          ([w, u, a, i], k) => `  - { wavelength: ${w} nm, upper: ${u} cm-1, g: ${k + 1}, A: ${a}, intensity: ${i} }`,
        ),
      ].join('\n'),
    ),
);

/** A note of numeric blocks between prose lines. */
export const numericNote: fc.Arbitrary<string> = fc
  .array(fc.tuple(fc.constantFrom('## Run', 'Notes.', ''), numericBlock), { minLength: 1, maxLength: 5 })
  .map((parts) => parts.map(([p, b]) => `${p}\n\n\`\`\`levels\n${b}\n\`\`\`\n`).join('\n'));
