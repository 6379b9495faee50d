#!/usr/bin/env bash
# Installs what the test command needs on a fresh machine: the Node packages from the lock file, Debian's
# Chromium for the browser tests (Playwright's own browser download cannot work here), and poppler-utils,
# whose pdftoppm/pdftotext/pdfinfo read the printed quarterly review back in its browser test, and Syncthing, the
# real file-sync engine two instances of which carry a shared folder in the folder-sync test.
set -euo pipefail
cd "$(dirname "$0")/../.."
if ! command -v chromium >/dev/null 2>&1 || ! command -v pdftoppm >/dev/null 2>&1 ||
  ! command -v syncthing >/dev/null 2>&1; then
  if [ "$(id -u)" -eq 0 ]; then apt_get="apt-get"; else apt_get="sudo apt-get"; fi
  $apt_get update -qq
  DEBIAN_FRONTEND=noninteractive $apt_get install -y -qq chromium fonts-dejavu-core poppler-utils syncthing >/dev/null
fi
chromium --version 2>/dev/null | head -n 1
syncthing --version 2>/dev/null | head -n 1
npm ci --no-audit --no-fund
