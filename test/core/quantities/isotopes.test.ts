import { strict as assert } from 'node:assert';
import {
  ELECTRON_G_FACTOR,
  ELECTRON_GYROMAGNETIC_RATIO,
  KELVIN_PER_HERTZ,
} from '../../../src/core/quantities/constants';
import {
  ELECTRON,
  type SpinSpecies,
  electronWithGFactor,
  larmorFrequencyHz,
  lookupSpecies,
  speciesSymbols,
  zeemanSpacingKelvin,
} from '../../../src/core/quantities/isotopes';

function assertClose(actual: number, expected: number, rel: number, what: string): void {
  const delta = Math.abs(actual - expected) / Math.abs(expected);
  assert.ok(
    delta <= rel,
    `${what}: got ${actual}, expected ${expected}, relative Δ = ${delta.toExponential(2)} > ${rel}`,
  );
}

function species(symbol: string): SpinSpecies {
  const found = lookupSpecies(symbol);
  assert.ok('species' in found, `${symbol} should be in the table`);
  return found.species;
}

/**
 * Spin and γ/2π in MHz/T of the IUPAC 2001 table (Harris et al., Pure Appl. Chem. 73, 1795 (2001));
 * γ/2π derived from the tabulated γ (10⁷ rad s⁻¹ T⁻¹) as γ·10⁷/2π/10⁶, 30-digit arithmetic.
 */
const IUPAC: ReadonlyArray<readonly [string, number, number]> = [
  ['1H', 0.5, 42.5774691],
  ['2H', 1, 6.53590131],
  ['3He', 0.5, -32.43603],
  ['7Li', 1.5, 16.5484556],
  ['13C', 0.5, 10.7083966],
  ['15N', 0.5, -4.3172657],
  ['17O', 2.5, -5.7742687],
  ['19F', 0.5, 40.0775702],
  ['23Na', 1.5, 11.2695217],
  ['29Si', 0.5, -8.4654514],
  ['31P', 0.5, 17.2514409],
  ['129Xe', 0.5, -11.8603903],
];

describe('isotope table', () => {
  it('lists every nucleus the format requires, by mass number, then the electron', () => {
    const symbols = speciesSymbols();
    for (const [symbol] of IUPAC) assert.ok(symbols.includes(symbol), `${symbol} missing`);
    assert.equal(symbols[symbols.length - 1], 'electron');
    const masses = symbols.slice(0, -1).map((s) => Number.parseInt(s, 10));
    assert.deepEqual(
      masses,
      [...masses].sort((a, b) => a - b),
      'ordered by mass number',
    );
  });

  it('holds the 120 magnetic nuclei of the IUPAC 2001 table, each with an abundance or none in nature', () => {
    // Harris et al. 2001, Table 1: the stable nuclei with I > 0 and the long-lived ones in common use.
    const nuclei = speciesSymbols().filter((s) => s !== 'electron');
    assert.equal(nuclei.length, 120);
    for (const symbol of nuclei) {
      const s = species(symbol);
      assert.ok(Number.isInteger(2 * s.spin) && s.spin > 0, `${symbol} spin ${s.spin}`);
      assert.ok(s.abundance === null || (s.abundance > 0 && s.abundance <= 100), `${symbol} abundance`);
    }
    // Only nuclei not found in nature lack an abundance (3H and 99Tc are made, not mined).
    assert.deepEqual(
      nuclei.filter((s) => species(s).abundance === null),
      ['3H', '99Tc'],
    );
  });

  it('gives the spin-9/2 nuclei the issue names their IUPAC 2001 spin and signed gamma', () => {
    // Harris et al. 2001, Table 1 (γ in 10⁷ rad s⁻¹ T⁻¹, natural abundance in %).
    const nine: ReadonlyArray<readonly [string, number, number]> = [
      ['73Ge', -0.9360303, 7.73],
      ['83Kr', -1.0331, 11.49],
      ['87Sr', -1.1639376, 7.0],
      ['93Nb', 6.5674, 100],
      ['209Bi', 4.375, 100],
    ];
    for (const [symbol, gamma, abundance] of nine) {
      const s = species(symbol);
      assert.equal(s.spin, 4.5, `${symbol} spin`);
      assertClose(s.gamma, gamma * 1e7, 1e-12, `${symbol} γ`);
      assert.equal(s.abundance, abundance, `${symbol} abundance`);
    }
  });

  it('has abundances that add up to 100 % for elements whose two stable isotopes both carry a spin', () => {
    // An element's isotopic abundances add to 100 % (Harris et al. 2001 quote them to 0.01 %–0.001 %);
    // for these elements every stable isotope has I > 0, so the table holds the whole element.
    const pairs: ReadonlyArray<readonly [string, string]> = [
      ['6Li', '7Li'],
      ['10B', '11B'],
      ['14N', '15N'],
      ['35Cl', '37Cl'],
      ['63Cu', '65Cu'],
      ['69Ga', '71Ga'],
      ['79Br', '81Br'],
      ['85Rb', '87Rb'],
      ['107Ag', '109Ag'],
      ['113In', '115In'],
      ['121Sb', '123Sb'],
      ['138La', '139La'],
      ['151Eu', '153Eu'],
      ['175Lu', '176Lu'],
      ['185Re', '187Re'],
      ['191Ir', '193Ir'],
      ['203Tl', '205Tl'],
    ];
    for (const [a, b] of pairs) {
      const sum = species(a).abundance! + species(b).abundance!;
      assert.ok(Math.abs(sum - 100) < 0.01, `${a} + ${b} = ${sum} %`);
    }
  });

  for (const [symbol, spin, mhzPerT] of IUPAC) {
    it(`gives ${symbol} the IUPAC 2001 spin and signed gamma`, () => {
      const s = species(symbol);
      assert.equal(s.symbol, symbol);
      assert.equal(s.spin, spin);
      // Tabulated values have 6-9 digits; the derived γ/2π are rounded to the digits shown.
      assertClose(s.gamma / (2 * Math.PI) / 1e6, mhzPerT, 2e-7, `${symbol} γ/2π`);
      assert.match(s.source, /IUPAC 2001/);
    });
  }

  it('has negative gamma for 3He, 15N, 17O, 29Si and 129Xe among the light nuclei the format names', () => {
    // Signs of the IUPAC 2001 table (Harris et al. 2001).
    const negative = IUPAC.map(([s]) => s).filter((s) => species(s).gamma < 0);
    assert.deepEqual(negative, ['3He', '15N', '17O', '29Si', '129Xe']);
  });

  it('gives 40K a negative gamma, as its negative magnetic moment requires', () => {
    // Harris et al. 2001, Table 1: μ(40K) = −1.451 μ_N, γ = −1.554 × 10⁷ rad s⁻¹ T⁻¹, I = 4.
    assert.ok(species('40K').gamma < 0);
    assert.equal(species('40K').spin, 4);
  });

  it('gives the free electron spin one half and gamma of minus the CODATA 2022 magnitude', () => {
    // CODATA 2022: |γ_e| = 1.760 859 627 84 × 10¹¹ s⁻¹ T⁻¹, sign of g_e (negative).
    assert.equal(ELECTRON.spin, 0.5);
    assert.equal(ELECTRON.gamma, -1.76085962784e11);
    assert.match(ELECTRON.source, /CODATA 2022/);
    assert.equal(species('electron'), ELECTRON);
  });
});

describe('electronWithGFactor', () => {
  it('reproduces the free-electron gamma from the free-electron g-factor', () => {
    // g_e μ_B/ħ = −γ_e within the CODATA 2022 relative uncertainty of 3.1e-10.
    const e = electronWithGFactor(ELECTRON_G_FACTOR);
    assert.ok(e !== null);
    assertClose(e.gamma, -ELECTRON_GYROMAGNETIC_RATIO, 1e-9, 'γ from g_e');
    assert.equal(e.symbol, 'electron');
    assert.equal(e.spin, 0.5);
  });

  it('scales gamma in proportion to g and keeps its sign', () => {
    const e = electronWithGFactor(2.0036);
    assert.ok(e !== null);
    assertClose(e.gamma, (ELECTRON_GYROMAGNETIC_RATIO * 2.0036) / -ELECTRON_G_FACTOR, 1e-9, 'γ for g = 2.0036');
    assert.ok(e.gamma > 0);
  });

  it('refuses a zero or non-finite g-factor', () => {
    assert.equal(electronWithGFactor(0), null);
    assert.equal(electronWithGFactor(Number.NaN), null);
    assert.equal(electronWithGFactor(Number.POSITIVE_INFINITY), null);
  });
});

describe('Larmor frequency and Zeeman spacing', () => {
  it('gives 400.228 2091 MHz for 1H at 9.4 T', () => {
    // IUPAC 2001 γ(1H) = 26.752 2128 × 10⁷ rad s⁻¹ T⁻¹; ν = γB/2π derived (30-digit arithmetic).
    assertClose(larmorFrequencyHz(species('1H'), 9.4), 400.2282091e6, 1e-9, '1H at 9.4 T');
  });

  it('gives 100.658 9278 MHz for 13C at 9.4 T', () => {
    // IUPAC 2001 γ(13C) = 6.728 284 × 10⁷ rad s⁻¹ T⁻¹; derived.
    assertClose(larmorFrequencyHz(species('13C'), 9.4), 100.6589278e6, 1e-9, '13C at 9.4 T');
  });

  it('gives 93.88 GHz for the free electron at 3.35 T', () => {
    // CODATA 2022 γ_e/2π = 28 024.951 3861 MHz/T; × 3.35 T = 93 883.587 14 MHz (derived).
    const nu = larmorFrequencyHz(ELECTRON, 3.35);
    assertClose(nu, 28024.9513861e6 * 3.35, 3e-12, 'electron at 3.35 T');
    assert.equal((nu / 1e9).toFixed(2), '93.88');
  });

  it('gives positive frequencies for negative-gamma nuclei', () => {
    // IUPAC 2001 |γ(129Xe)| = 7.452 103 × 10⁷ ⇒ 35.581 170 87 MHz at 3 T;
    // |γ(3He)| = 20.380 1587 × 10⁷ ⇒ 97.308 090 MHz at 3 T (both derived).
    assertClose(larmorFrequencyHz(species('129Xe'), 3), 35.58117087e6, 1e-9, '129Xe at 3 T');
    assertClose(larmorFrequencyHz(species('3He'), 3), 97.30809e6, 1e-7, '3He at 3 T');
  });

  it('gives a Zeeman spacing of 4.830 8666 mK for 13C at 9.4 T', () => {
    // hν/k with IUPAC 2001 γ(13C) and exact h/k (derived, 30-digit arithmetic).
    assertClose(zeemanSpacingKelvin(species('13C'), 9.4), 4.8308666e-3, 1e-7, '13C spacing');
  });

  it('keeps the Zeeman spacing equal to h times the Larmor frequency over k for every species', () => {
    for (const symbol of speciesSymbols()) {
      const s = species(symbol);
      assertClose(zeemanSpacingKelvin(s, 7.05), larmorFrequencyHz(s, 7.05) * KELVIN_PER_HERTZ, 1e-14, symbol);
    }
  });
});

describe('lookupSpecies', () => {
  it('accepts only the exact symbols', () => {
    for (const symbol of speciesSymbols()) assert.ok('species' in lookupSpecies(symbol), symbol);
  });

  it('reads the mass number written as a superscript, as print writes isotopes, as the same isotope', () => {
    const sup = (n: string): string => n.replace(/\d/g, (d) => '⁰¹²³⁴⁵⁶⁷⁸⁹'[Number(d)]!);
    for (const symbol of speciesSymbols().filter((x) => /^\d/.test(x))) {
      const found = lookupSpecies(sup(symbol));
      assert.ok('species' in found, sup(symbol));
      assert.equal(found.species.symbol, symbol);
    }
    // A superscript mass number of a nucleus the table lacks (12C has no spin) is suggested like the plain one.
    assert.deepEqual(lookupSpecies('¹²C'), lookupSpecies('12C'));
    assert.ok(!('species' in lookupSpecies('¹²C')));
    assert.deepEqual(lookupSpecies('C¹³'), { suggestion: null });
  });

  const misspellings: ReadonlyArray<readonly [string, string]> = [
    ['C13', '13C'],
    ['c13', '13C'],
    ['13c', '13C'],
    ['13 C', '13C'],
    ['C-13', '13C'],
    ['carbon-13', '13C'],
    ['H1', '1H'],
    ['1h', '1H'],
    ['Xe129', '129Xe'],
    ['129xe', '129Xe'],
    ['129XE', '129Xe'],
    ['he3', '3He'],
    ['Si29', '29Si'],
    ['Electron', 'electron'],
    ['ELECTRON', 'electron'],
    ['e-', 'electron'],
    ['e', 'electron'],
    ['elektron', 'electron'],
    ['electorn', 'electron'],
    ['proton', '1H'],
    ['deuterium', '2H'],
    [' 13C ', '13C'],
  ];
  for (const [written, meant] of misspellings) {
    it(`suggests ${meant} for ${JSON.stringify(written)}`, () => {
      assert.deepEqual(lookupSpecies(written), { suggestion: meant });
    });
  }

  it('suggests an isotope of the same element for an unlisted mass number or a bare element', () => {
    assert.deepEqual(lookupSpecies('16O'), { suggestion: '17O' });
    assert.deepEqual(lookupSpecies('238U'), { suggestion: '235U' });
    assert.deepEqual(lookupSpecies('niobium-93'), { suggestion: '93Nb' });
    assert.deepEqual(lookupSpecies('germanium'), { suggestion: '73Ge' });
    assert.deepEqual(lookupSpecies('Xe'), { suggestion: '129Xe' });
    assert.deepEqual(lookupSpecies('carbon'), { suggestion: '13C' });
  });

  it('suggests nothing for text that resembles no species', () => {
    for (const text of ['foo', '', 'Unobtainium', 'neutrino', 'constructor', 'toString', '__proto__'])
      assert.deepEqual(lookupSpecies(text), { suggestion: null }, text);
  });
});
