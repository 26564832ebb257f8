#!/usr/bin/env bash
# Installs, with apt-get, every Debian 12 package Sagline needs to build, test and run.
# Idempotent: when everything is present it only runs dpkg-query and exits in seconds.
set -euo pipefail

packages=(
    # build
    build-essential cmake ninja-build pkg-config ccache
    # core
    libeigen3-dev libsqlite3-dev nlohmann-json3-dev
    # instruments, ui
    qt6-base-dev qt6-charts-dev qt6-serialport-dev qt6-svg-dev qt6-qpa-plugins libqt6opengl6-dev
    libgl-dev libxkbcommon-dev
    fonts-dejavu-core
    # tests and benchmarks
    libgtest-dev libgmock-dev libbenchmark-dev libgsl-dev
    clang libclang-rt-14-dev
    xvfb xauth poppler-utils sqlite3 python3
    # scripts/york-odr-check.py: regenerates the York test's independent ODR reference values
    python3-scipy
    # packaging: .deb build (shlibdeps), checks, icon rendering, desktop integration
    dpkg-dev lintian appstream desktop-file-utils shared-mime-info libglib2.0-bin
    librsvg2-bin libxml2-utils file man-db groff-base
)

missing=()
for p in "${packages[@]}"; do
    status=$(dpkg-query -W -f='${db:Status-Status}' "$p" 2>/dev/null || true)
    [ "$status" = "installed" ] || missing+=("$p")
done

if [ ${#missing[@]} -eq 0 ]; then
    echo "install-deps: all ${#packages[@]} packages present"
    exit 0
fi

echo "install-deps: installing ${missing[*]}"
sudo=""
if [ "$(id -u)" -ne 0 ]; then sudo="sudo"; fi
export DEBIAN_FRONTEND=noninteractive
$sudo apt-get update -qq
$sudo apt-get install -y -qq --no-install-recommends "${missing[@]}"
