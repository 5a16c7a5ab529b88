/**
 * Payloads for the view tests, built the way the server builds them: a
 * block's text through the core's Analyzer and `curveData`.
 */
import {
  Analyzer,
  curveData,
  type CurvePayload,
  type PinnedRun,
  type RenderMessage,
  type ViewPayload,
} from '../../src/core';

const analyzer = new Analyzer();

/** The payload of one block body (its note is `file:///lab/<name>.md`). */
export function payloadOf(body: string, name = 'note', version = 1): ViewPayload {
  const text = `# ${name}\n\n\`\`\`levels\n${body}\n\`\`\`\n`;
  const [block] = analyzer.analyzeText(text).blocks;
  if (!block) throw new Error('no block');
  return curveData(block, { uri: `file:///lab/${name}.md`, version });
}

/** As {@link payloadOf}, asserting a drawable block. */
export function curveOf(body: string, name?: string): CurvePayload {
  const p = payloadOf(body, name);
  if (p.kind !== 'curve') throw new Error(`not drawable: ${p.message}`);
  return p;
}

let seq = 0;

/** A render message with a fresh, increasing sequence number. */
export function render(current: ViewPayload | null, pinned: readonly PinnedRun[] = []): RenderMessage {
  return { type: 'render', seq: ++seq, current, pinned };
}

/** Two levels 10 K apart, 30 % up, lattice at 10 K. */
export const TWO_LEVEL = 'id: two levels\ngap: 10 K\npopulations: [0.7 ± 0.01, 0.3 ± 0.01]\nlattice: 10 K';

/** The same scheme with more population up: inverted. */
export const TWO_LEVEL_INVERTED =
  'id: two levels, inverted\ngap: 10 K\npopulations: [0.35 ± 0.01, 0.65 ± 0.01]\nlattice: 10 K';

/** Three levels in cm⁻¹, far from one temperature (the demo's pumped cell). */
export const MULTI_LEVEL = [
  'id: cell P-4, pump on',
  'levels:',
  '  - { label: ground, energy: 0 cm-1,     g: 2, population: 0.52, uncertainty: 0.01 }',
  '  - { label: P1/2,   energy: 12579 cm-1, g: 2, population: 0.30, uncertainty: 0.01 }',
  '  - { label: P3/2,   energy: 12817 cm-1, g: 4, population: 0.18, uncertainty: 0.01 }',
].join('\n');

/** Two levels with N = 12 systems: a visible staircase. */
export const FINITE_N =
  'id: twelve spins\ngap: 4 GHz\npopulations: [0.75 ± 0.02, 0.25 ± 0.02]\nlattice: 0.1 K\ncount: 12';

/** A run series on one ¹³C scheme, for pinning. */
export const SERIES = [0.312, 0.18, 0.05, -0.12].map(
  (p, i) => `id: cell-B run ${i + 7}\nsystem: 13C\nfield: 7.05 T\nlattice: 1.4 K\npolarization: ${p} ± 0.010`,
);

/** The id a test of escaping uses. */
export const XSS_ID = '<img src=x onerror=alert(1)>';
