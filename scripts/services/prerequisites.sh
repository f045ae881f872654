# Shared by scripts/start.sh and scripts/test.sh (sourced, not run).
# Installs what the commands need on a fresh Debian machine: npm packages and
# Debian packages; each only when missing.

paraxia_log() { printf '[paraxia] %s\n' "$*" >&2; }

paraxia_as_root() {
  if [ "$(id -u)" = "0" ]; then
    "$@"
  elif command -v sudo >/dev/null 2>&1; then
    sudo "$@"
  else
    paraxia_log "error: '$*' needs root and sudo is not available."
    return 1
  fi
}

PARAXIA_APT_UPDATED=0
paraxia_apt_install() {
  if ! command -v apt-get >/dev/null 2>&1; then
    paraxia_log "error: apt-get is not available; install these packages by hand: $*"
    return 1
  fi
  if [ "$PARAXIA_APT_UPDATED" = "0" ]; then
    paraxia_log "apt-get update"
    paraxia_as_root env DEBIAN_FRONTEND=noninteractive apt-get update -q
    PARAXIA_APT_UPDATED=1
  fi
  paraxia_log "apt-get install -y $*"
  paraxia_as_root env DEBIAN_FRONTEND=noninteractive apt-get install -y -q --no-install-recommends "$@"
}

paraxia_ensure_node_modules() {
  if [ ! -d node_modules ] || [ ! -x node_modules/.bin/tsx ]; then
    if [ -f package-lock.json ]; then
      paraxia_log "Installing npm dependencies (npm ci)"
      npm ci --no-audit --no-fund
    else
      paraxia_log "Installing npm dependencies (npm install)"
      npm install --no-audit --no-fund
    fi
  fi
}

paraxia_ensure_postgresql() {
  if ! ls /usr/lib/postgresql/*/bin/postgres >/dev/null 2>&1; then
    paraxia_apt_install postgresql
  fi
}

# Browser and PDF tests need Chromium and poppler-utils (pdftotext, pdftoppm).
paraxia_ensure_test_tools() {
  local missing=()
  [ -x /usr/lib/chromium/chromium ] || missing+=(chromium)
  command -v pdftotext >/dev/null 2>&1 || missing+=(poppler-utils)
  if [ "${#missing[@]}" -gt 0 ]; then
    paraxia_apt_install "${missing[@]}"
  fi
}
