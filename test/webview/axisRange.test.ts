import { strict as assert } from 'node:assert';
import { largestMagnitude, paddedRange } from '../../media/src/axisRange';

// The measurement chart's axes for series far longer than a call may take arguments
// (V8 overflows somewhat over 100,000 spread arguments on Node 20; measured, from memory).
describe('the measurement chart’s axis ranges', () => {
  it('spans the values with 8 % padding, and widens a single value by 1 each side', () => {
    assert.deepEqual(paddedRange([0, 10, 5]), { min: -0.8, max: 10.8 });
    assert.deepEqual(paddedRange([3, 3]), { min: 2 - 0.16, max: 4 + 0.16 });
  });

  it('takes 250,000 points without overflowing the stack', () => {
    const xs = Array.from({ length: 250_000 }, (_, i) => i - 1000);
    const r = paddedRange(xs);
    assert.ok(Math.abs(r.min - (-1000 - 0.08 * 249_999)) < 1e-6 && Math.abs(r.max - (248_999 + 0.08 * 249_999)) < 1e-6);
    assert.equal(largestMagnitude(xs, 1e-300), 248_999);
  });
});
