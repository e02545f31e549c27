#!/usr/bin/env bash
# One-step set-up on a fresh Debian/Ubuntu machine (or any machine with
# Python >= 3.11): the system libraries Qt needs (installed only if missing,
# and only where apt-get is available as root), then Wetline and its test
# tools from PyPI into the current Python.
set -euo pipefail
cd "$(dirname "$0")/.."

if command -v apt-get >/dev/null 2>&1 && command -v dpkg >/dev/null 2>&1; then
  need=()
  for pkg in libegl1 libgl1 libxkbcommon0 libfontconfig1 libfreetype6 libdbus-1-3 \
             libglib2.0-0 fonts-dejavu-core fontconfig; do
    dpkg -s "$pkg" >/dev/null 2>&1 || need+=("$pkg")
  done
  if [ "${#need[@]}" -gt 0 ]; then
    if [ "$(id -u)" = 0 ]; then SUDO=""; else SUDO="sudo"; fi
    echo "installing system libraries: ${need[*]}"
    $SUDO apt-get update -qq
    DEBIAN_FRONTEND=noninteractive $SUDO apt-get install -y -qq "${need[@]}" >/dev/null
  fi
fi

python3 -m pip install --quiet --disable-pip-version-check -e ".[test]"
# An editable install leaves Wetline's own bytecode to be written at first
# import, which never happens where PYTHONDONTWRITEBYTECODE is set: compile
# it now, as installing the wheel would (start-up is about 0.4 s faster).
python3 -m compileall -q core app wetline >/dev/null
