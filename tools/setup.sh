#!/usr/bin/env bash
# One-step set-up on a fresh Debian/Ubuntu machine (or any machine with
# Python >= 3.11): the system libraries Qt needs (installed only if missing,
# and only where apt-get is available as root), then Wetline and its test
# tools from PyPI into the current Python. The libraries are those of Qt's
# offscreen and X11 (xcb) platforms: the tests run offscreen, the program
# opens its window through xcb (tests/packaging/test_display_libraries.py).
set -euo pipefail
cd "$(dirname "$0")/.."

if command -v apt-get >/dev/null 2>&1 && command -v dpkg >/dev/null 2>&1; then
  need=()
  for pkg in libegl1 libgl1 libxkbcommon0 libfontconfig1 libfreetype6 libdbus-1-3 \
             libglib2.0-0 fonts-dejavu-core fontconfig \
             libx11-xcb1 libxkbcommon-x11-0 libxcb-cursor0 libxcb-icccm4 libxcb-image0 \
             libxcb-keysyms1 libxcb-randr0 libxcb-render-util0 libxcb-shape0 libxcb-shm0 \
             libxcb-sync1 libxcb-util1 libxcb-xfixes0 libxcb-xkb1; do
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
