# Shared by scripts/test and scripts/run: installs the Debian packages the
# build needs (when missing) and configures and builds into build/.
set -euo pipefail

HEATCHAIN_ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
HEATCHAIN_BUILD="${HEATCHAIN_BUILD:-$HEATCHAIN_ROOT/build}"

heatchain_packages=(
  build-essential cmake qt6-base-dev libqt6opengl6-dev qt6-charts-dev qt6-svg-dev
  libeigen3-dev nlohmann-json3-dev libgtest-dev libgmock-dev libbenchmark-dev
  xvfb xauth imagemagick poppler-utils fonts-dejavu-core python3-iapws python3-pint
  python3-uncertainties
  clang libclang-rt-14-dev clang-tidy
  pybind11-dev python3-dev python3-numpy python3-pytest python3-matplotlib
  lintian desktop-file-utils appstream shared-mime-info xdg-utils libglib2.0-bin man-db bash-completion
)

heatchain_install_packages() {
  local missing=()
  for p in "${heatchain_packages[@]}"; do
    dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
  done
  [ ${#missing[@]} -eq 0 ] && return 0
  echo "Installing Debian packages: ${missing[*]}"
  local sudo=""
  if [ "$(id -u)" -ne 0 ]; then sudo="sudo"; fi
  $sudo apt-get update -q
  DEBIAN_FRONTEND=noninteractive $sudo apt-get install -y -q --no-install-recommends "${missing[@]}"
}

heatchain_build() {
  local jobs
  jobs="$(nproc 2>/dev/null || echo 2)"
  cmake -S "$HEATCHAIN_ROOT" -B "$HEATCHAIN_BUILD" -DCMAKE_BUILD_TYPE=RelWithDebInfo "$@"
  cmake --build "$HEATCHAIN_BUILD" -j "$jobs"
}
