/**
 * The curve view's β error bar is the contract's k = 2 interval, β ± 2u(β),
 * so that read on the T = 1/β axis it spans T's interval (the image of β's).
 * The chart model is a pure function of the payload; this runs it in Node.
 */
import { strict as assert } from 'node:assert';
import { viewModel } from '../../media/src/model';
import type { Palette } from '../../media/src/palette';
import { curveOf, TWO_LEVEL } from '../webview/payloads';
import { Analyzer, LineIndex, reportEntry } from '../../src/core';

const PALETTE: Palette = {
  background: '#fff',
  foreground: '#000',
  muted: '#888',
  grid: '#ccc',
  curve: '#00f',
  finiteN: '#0a0',
  measured: '#f00',
  lattice: '#a0a',
  inversion: '#fa0',
  saturation: '#666',
  pins: ['#111'],
  fontFamily: 'sans-serif',
  fontSize: 12,
  highContrast: false,
};

describe('curve view: β error bar as the k = 2 interval', () => {
  it('spans β ± 2u(β), whose T reading is the JSON report’s temperature interval', () => {
    const payload = curveOf(TWO_LEVEL);
    const model = viewModel(payload, [], 'K', PALETTE);
    const m = payload.measured!;
    const bar = model.beta.errorBars.find((b) => b.dy !== null)!;
    assert.ok(bar, 'the measured point has a β bar');
    // Energy axis in kelvin: kelvinPerUnit = 1, so the bar is in K⁻¹.
    assert.equal(bar.dy, 2 * m.uBeta!);
    const text = `\`\`\`levels\n${TWO_LEVEL}\n\`\`\`\n`;
    const entry = reportEntry('n.md', new Analyzer().analyzeText(text).blocks[0], new LineIndex(text));
    const [low, high] = entry.temperature!.interval!;
    assert.ok(Math.abs(1 / (bar.y + bar.dy) - low) <= 1e-12 * low, 'upper end of the bar reads as T’s low end');
    assert.ok(Math.abs(1 / (bar.y - bar.dy) - high) <= 1e-12 * high, 'lower end of the bar reads as T’s high end');
  });
});
