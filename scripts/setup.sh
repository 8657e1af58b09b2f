#!/usr/bin/env bash
# Installs what a fresh Debian machine with only Rust and gcc lacks: cmake,
# libclang and a C++ compiler, which building HiGHS needs, and Chromium with
# a font, which the browser test of report.html runs headless; and the venv
# module of Python where it is missing (make python). Does nothing when
# they are already there.
set -euo pipefail

need=()
command -v cmake >/dev/null 2>&1 || need+=(cmake)
command -v g++ >/dev/null 2>&1 || need+=(g++)
# bindgen needs libclang with its headers: the -dev package (a runtime
# library alone, libclang-NN.so.1, is not enough).
if ! ls /usr/lib/llvm-*/lib/libclang.so >/dev/null 2>&1 && ! ls /usr/lib/x86_64-linux-gnu/libclang.so >/dev/null 2>&1; then
  need+=(libclang-dev)
fi
command -v chromium >/dev/null 2>&1 || need+=(chromium)
[ -e /usr/share/fonts/truetype/dejavu/DejaVuSans.ttf ] || need+=(fonts-dejavu-core)
# make python creates a virtual environment: Debian's python3 has venv
# and ensurepip only with python3-venv.
if command -v python3 >/dev/null 2>&1 && ! python3 -c 'import venv, ensurepip' >/dev/null 2>&1; then
  need+=(python3-venv)
fi

if [ ${#need[@]} -gt 0 ]; then
  echo "setup: installing ${need[*]}"
  sudo=""
  [ "$(id -u)" -eq 0 ] || sudo="sudo"
  $sudo apt-get update -qq
  DEBIAN_FRONTEND=noninteractive $sudo apt-get install -y -qq --no-install-recommends "${need[@]}" >/dev/null
fi
