// `npm start`: the demo notebook in a real VS Code, in the browser.
//
// Builds, packs the .vsix (scripts/package.mjs), makes sure the browser-hosted
// VS Code is installed (scripts/editor-host.sh), installs the .vsix into a
// fresh extensions folder the way a user would, and serves demo/ on a free
// 127.0.0.1 port until Ctrl-C. Open the printed URL in a browser.
//
//   npm start                      serve demo/ in the oldest supported VS Code (1.100)
//   npm start -- --vscode newest   in the newest VS Code the project tests (1.139)
//   npm start -- --port 8080       a fixed port
//   npm start -- path/to/notes     another folder of notes
//
// BOLTZMARK_VSCODE=newest does what --vscode newest does.
//
// Edits made in the browser are saved to the served folder (demo/ by default)
// when you save, as in any editor.
import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync, statSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const require = createRequire(import.meta.url);
const host = require('./editorHost.cjs');

function parseArgs(argv) {
  const out = { port: 0, folder: join(host.ROOT, 'demo'), version: host.chosenVersion() };
  for (let i = 0; i < argv.length; i++) {
    if (argv[i] === '--port') out.port = Number(argv[++i]);
    else if (argv[i] === '--vscode') out.version = host.chosenVersion(argv[++i] ?? '');
    else if (argv[i].startsWith('--vscode=')) out.version = host.chosenVersion(argv[i].slice('--vscode='.length));
    else if (argv[i] === '-h' || argv[i] === '--help') {
      console.log(
        'usage: npm start [-- [--vscode oldest|newest] [--port N] [FOLDER]]   (FOLDER defaults to demo/, the VS Code to the oldest)',
      );
      process.exit(0);
    } else out.folder = resolve(argv[i]);
  }
  if (!Number.isInteger(out.port) || out.port < 0 || out.port > 65535)
    throw new Error(`--port wants a port number, not ${out.port}`);
  if (!existsSync(out.folder) || !statSync(out.folder).isDirectory()) throw new Error(`${out.folder} is not a folder`);
  return out;
}

function step(title, command, args) {
  console.log(`== ${title}`);
  const r = spawnSync(command, args, { cwd: host.ROOT, stdio: 'inherit' });
  if (r.status !== 0) throw new Error(`${title} failed (exit ${r.status ?? r.signal})`);
}

async function main() {
  const args = parseArgs(process.argv.slice(2));
  step('build', process.execPath, ['scripts/build.mjs']);
  const vsix = join(host.ROOT, 'out', 'start', 'boltzmark.vsix');
  step('package', process.execPath, ['scripts/package.mjs', '--out', vsix]);
  console.log(`== editor host: ${host.TITLES[args.version]}`);
  host.ensureHost({ version: args.version });

  const run = host.makeRun('boltzmark-start-', args.version);
  let server = null;
  let stopping = false;
  const stop = async (code) => {
    if (stopping) return;
    stopping = true;
    console.log('\n== stopping');
    await server?.stop();
    run.remove();
    process.exit(code);
  };
  process.on('SIGINT', () => void stop(0));
  process.on('SIGTERM', () => void stop(0));
  try {
    host.writeUserSettings(run, { 'workbench.startupEditor': 'readme' });
    const installed = host.installVsix(run, vsix);
    console.log(`== installed ${installed.split('/').pop()}`);
    server = await host.startServer(run, { workspace: args.folder, port: args.port });
    server.child.on('exit', (code, signal) => {
      if (stopping) return;
      console.error(`the editor host stopped (${code ?? signal}); its log: ${join(run.dir, 'server.log')}`);
      void stop(1);
    });
    console.log(startBanner(args.folder, server.open, host.vscodeVersion(args.version)));
  } catch (err) {
    console.error(String(err instanceof Error ? err.message : err));
    const log = join(run.dir, 'server.log');
    if (existsSync(log))
      console.error(`---- server log ----\n${readFileSync(log, 'utf8').split('\n').slice(-30).join('\n')}`);
    await stop(1);
  }
}

/**
 * The line printed once the editor is up: it names the folder served (the demo only when it is the
 * demo), so `npm start -- ~/notes` does not claim to show the demo.
 */
export function startBanner(folder, url, vscodeVersion) {
  const demo = resolve(folder) === resolve(join(host.ROOT, 'demo'));
  const what = demo ? 'the demo notebook (demo/)' : folder;
  const editor = vscodeVersion ? `VS Code ${vscodeVersion}` : 'VS Code';
  return `\nBoltzmark in ${editor}, serving ${what}: ${url}\n(Ctrl-C stops)\n`;
}

// Run only as the `npm start` script, not when a test imports startBanner.
if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  main().catch((err) => {
    console.error(String(err instanceof Error ? err.message : err));
    process.exit(1);
  });
}
