import { strict as assert } from 'node:assert';
import { join, resolve } from 'node:path';

describe('npm start', () => {
  it('names the folder it serves, and calls only demo/ the demo', async () => {
    // The `npm start` script; importing it runs nothing (it starts only when run as the script).
    const { startBanner } = await import('../../scripts/start-demo.mjs');
    const notes = resolve('/tmp/lab-notes');
    const line = startBanner(notes, 'http://127.0.0.1:5000/');
    assert.match(line, /serving \/tmp\/lab-notes: http:\/\/127\.0\.0\.1:5000\//);
    assert.doesNotMatch(line, /demo/);
    assert.match(startBanner(join(process.cwd(), 'demo'), 'http://x/'), /the demo notebook \(demo\/\)/);
  });
});
