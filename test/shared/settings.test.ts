import { strict as assert } from 'node:assert';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { CLIENT_ID, clientOptions } from '../../src/client/clientOptions';
import { FORMAT_DOC_URL, codeLink } from '../../src/server/docsLink';
import { DEFAULT_SETTINGS, fromSection, SETTING_DEFS } from '../../src/shared/settings';

describe('settings', () => {
  const manifest = JSON.parse(readFileSync('package.json', 'utf8')) as {
    contributes: { configuration: { properties: Record<string, Record<string, unknown>> } };
  };
  const props = manifest.contributes.configuration.properties;

  it('declares in package.json exactly the settings the code defines, with the same types, defaults and choices', () => {
    assert.deepEqual(Object.keys(props).sort(), SETTING_DEFS.map((d) => d.key).sort());
    for (const d of SETTING_DEFS) {
      const p = props[d.key];
      assert.equal(p.type, d.type, d.key);
      assert.deepEqual(p.default, d.default, d.key);
      assert.deepEqual(p.enum, d.enum, d.key);
      assert.equal(p.markdownDescription, d.description, d.key);
      assert.equal(p.scope, d.scope ?? 'resource', d.key);
      assert.match(d.key, /^boltzmark\.[a-z][a-zA-Z]*\.[a-z][a-zA-Z]*$/);
    }
  });

  it('declares every setting that changes results per resource, and the protocol trace for the window', () => {
    // The server reads resource settings per note (test/protocol/settings.test.ts); the trace is read by
    // vscode-languageclient as `<client id>.trace.server` with the values off, messages and verbose.
    assert.deepEqual(
      Object.entries(props)
        .filter(([, p]) => p.scope !== 'resource')
        .map(([k, p]) => [k, p.scope]),
      [['boltzmark.trace.server', 'window']],
    );
    assert.deepEqual(props['boltzmark.trace.server'].enum, ['off', 'messages', 'verbose']);
    assert.equal(CLIENT_ID, 'boltzmark');
  });

  it('leaves settings to the server instead of the deprecated static synchronisation', () => {
    const log = {} as Parameters<typeof clientOptions>[0];
    const options = clientOptions(log);
    assert.equal(options.synchronize, undefined);
    assert.equal(options.outputChannel, log);
    assert.deepEqual(options.documentSelector, [{ language: 'markdown' }]);
  });

  it('reads a configuration section, keeping defaults for anything missing or malformed', () => {
    assert.deepEqual(fromSection(undefined), DEFAULT_SETTINGS);
    assert.equal(DEFAULT_SETTINGS.saturationSigma, 2);
    const s = fromSection({
      display: { significantDigits: 99, temperature: 'kelvin', polarization: 'bogus' },
      inlayHints: { enabled: false },
      status: { saturationSigma: 3 },
      blocks: { extraInfoStrings: ['populations', 3, ' '] },
    });
    assert.equal(s.significantDigits, 8);
    assert.equal(s.temperature, 'kelvin');
    assert.equal(s.polarization, 'percent');
    assert.equal(s.inlayHints, false);
    assert.equal(s.saturationSigma, 3);
    assert.deepEqual(s.extraInfoStrings, ['populations']);
  });

  it('declares its commands with localised titles and activates only on Markdown and a restored curve view', () => {
    const m = JSON.parse(readFileSync('package.json', 'utf8')) as {
      activationEvents: string[];
      contributes: { commands: { title: string; command: string }[] };
      capabilities: { untrustedWorkspaces: { supported: boolean } };
    };
    const nls = JSON.parse(readFileSync('package.nls.json', 'utf8')) as Record<string, string>;
    assert.deepEqual(m.activationEvents, ['onLanguage:markdown', 'onWebviewPanel:boltzmark.curveView']);
    assert.equal(m.capabilities.untrustedWorkspaces.supported, true);
    for (const c of m.contributes.commands) assert.ok(nls[c.title.replace(/%/g, '')], `title of ${c.command}`);
  });
});

describe('documentation links', () => {
  it('point diagnostics at the docs/format.md shipped beside the server, which has every section', () => {
    const doc = readFileSync(fileURLToPath(FORMAT_DOC_URL), 'utf8');
    assert.match(codeLink('unit-case'), /docs\/format\.md#unit-case$/);
    assert.match(doc, /^#### unit-case$/m);
  });
});
