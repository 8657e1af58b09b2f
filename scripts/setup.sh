#!/usr/bin/env bash
# Installs what a fresh Debian machine with only Rust and gcc lacks: cmake,
# libclang and a C++ compiler, which building HiGHS needs, and Chromium with
# a font, which the browser test of report.html runs headless. Does nothing
# when they are already there.
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

if [ ${#need[@]} -gt 0 ]; then
  echo "setup: installing ${need[*]}"
  sudo=""
  [ "$(id -u)" -eq 0 ] || sudo="sudo"
  $sudo apt-get update -qq
  DEBIAN_FRONTEND=noninteractive $sudo apt-get install -y -qq --no-install-recommends "${need[@]}" >/dev/null
fi
