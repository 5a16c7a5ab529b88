import { strict as assert } from 'node:assert';
import { SettingsStore, type SettingsChange } from '../../src/server/settingsStore';
import { DEFAULT_SETTINGS } from '../../src/shared/settings';

// The server's settings per note: asked for by scopeUri, kept per workspace
// folder, with a fallback for clients that cannot or do not answer.
describe('settings store', () => {
  const noLate = (): void => assert.fail('no late answer expected');

  it('keeps one answer per innermost workspace folder, and asks for a note outside them on its own', async () => {
    const asked: string[] = [];
    const store = new SettingsStore(
      (scope) => {
        asked.push(scope);
        return Promise.resolve({ display: { significantDigits: scope.includes('/inner/') ? 6 : 3 } });
      },
      () => undefined,
      noLate,
    );
    store.setFolders(['file:///lab/a', 'file:///lab/a/inner/']);
    assert.equal(store.scopeOf('file:///lab/a/x.md'), 'file:///lab/a/');
    assert.equal(store.scopeOf('file:///lab/a/inner/y.md'), 'file:///lab/a/inner/');
    // A folder is a path prefix only up to a separator: /lab/ab is not inside /lab/a.
    assert.equal(store.scopeOf('file:///lab/ab/z.md'), 'file:///lab/ab/z.md');
    const digits = await Promise.all(
      ['file:///lab/a/x.md', 'file:///lab/a/more/w.md', 'file:///lab/a/inner/y.md', 'file:///lab/ab/z.md'].map(
        async (u) => (await store.get(u)).significantDigits,
      ),
    );
    assert.deepEqual(digits, [3, 3, 6, 3]);
    assert.deepEqual(asked, ['file:///lab/a/x.md', 'file:///lab/a/inner/y.md', 'file:///lab/ab/z.md']);
  });

  it('falls back to the initialization options when the client refuses, and says so in the log', async () => {
    const logged: string[] = [];
    const store = new SettingsStore(
      () => Promise.reject(new Error('Unhandled method workspace/configuration')),
      (m) => logged.push(m),
      noLate,
    );
    store.setFallback({ display: { temperature: 'kelvin' } });
    assert.equal((await store.get('file:///n.md')).temperature, 'kelvin');
    assert.equal(logged.length, 1);
    assert.match(logged[0], /workspace\/configuration/);
  });

  it('serves the fallback while an answer is late, then keeps the answer and reports what it changed', async () => {
    let answer: (section: unknown) => void = () => undefined;
    let late: (c: SettingsChange) => void = () => undefined;
    const reported = new Promise<SettingsChange>((resolve) => (late = resolve));
    const store = new SettingsStore(
      () => new Promise((resolve) => (answer = resolve)),
      () => undefined,
      (c) => late(c),
      1,
    );
    assert.deepEqual(await store.get('file:///n.md'), DEFAULT_SETTINGS);
    answer({ display: { temperature: 'beta-first' } });
    assert.deepEqual(await reported, { analysis: false, any: true });
    assert.equal((await store.get('file:///n.md')).temperature, 'beta-first');
  });

  it('tells a change of results from a change of display, and from no change', async () => {
    let section: unknown = {};
    const store = new SettingsStore(
      () => Promise.resolve(section),
      () => undefined,
      noLate,
    );
    const open = ['file:///n.md'];
    await store.get(open[0]);
    section = { display: { polarization: 'fraction' } };
    assert.deepEqual(await store.reload(open), { analysis: false, any: true });
    assert.deepEqual(await store.reload(open), { analysis: false, any: false });
    section = { display: { polarization: 'fraction' }, status: { saturationSigma: 3 } };
    assert.deepEqual(await store.reload(open), { analysis: true, any: true });
    section = {
      display: { polarization: 'fraction' },
      status: { saturationSigma: 3 },
      blocks: { extraInfoStrings: ['x'] },
    };
    assert.deepEqual(await store.reload(open), { analysis: true, any: true });
  });

  it('uses pushed settings for a client that cannot be asked, and reports their change', async () => {
    const store = new SettingsStore(null, () => undefined, noLate);
    assert.deepEqual(await store.get('file:///n.md'), DEFAULT_SETTINGS);
    assert.deepEqual(store.setFallback({ display: { temperature: 'kelvin' } }), { analysis: false, any: true });
    assert.equal((await store.get('file:///n.md')).temperature, 'kelvin');
    assert.deepEqual(store.setFallback({ display: { temperature: 'kelvin' } }), { analysis: false, any: false });
  });

  it('asks again when the workspace folders change, and reports a note whose new folder brings other values', async () => {
    // The client resolves a scopeUri against its own folders; folder b's settings exist once b is open.
    let clientFolders = ['file:///lab/a/'];
    const store = new SettingsStore(
      (scope) =>
        Promise.resolve(
          clientFolders.includes('file:///lab/b/') && scope.startsWith('file:///lab/b/')
            ? { display: { temperature: 'kelvin' } }
            : {},
        ),
      () => undefined,
      noLate,
    );
    store.setFolders(['file:///lab/a']);
    const open = ['file:///lab/a/1.md', 'file:///lab/b/2.md'];
    for (const u of open) assert.equal((await store.get(u)).temperature, 'auto');
    clientFolders = ['file:///lab/a/', 'file:///lab/c/'];
    assert.deepEqual(await store.reload(open, ['file:///lab/a', 'file:///lab/c']), { analysis: false, any: false });
    clientFolders = ['file:///lab/a/', 'file:///lab/b/'];
    assert.deepEqual(await store.reload(open, ['file:///lab/a', 'file:///lab/b']), { analysis: false, any: true });
    assert.equal(store.scopeOf('file:///lab/b/2.md'), 'file:///lab/b/');
    assert.equal((await store.get('file:///lab/b/2.md')).temperature, 'kelvin');
    assert.equal((await store.get('file:///lab/a/1.md')).temperature, 'auto');
  });
});
