#!/usr/bin/env bash
# Checks the Debian package like a package: builds heatchain_<version>_amd64.deb
# from an existing build tree with CPack, runs lintian (no error allowed),
# validates the desktop entry and the AppStream metadata, installs it with
# dpkg -i, proves the installed programs, man pages, file type, bash
# completion and Python module work from the installed paths, and removes
# it, checking nothing is left behind.
# usage: check_package.sh BUILD_DIR    (needs root, or sudo, for dpkg)
set -euo pipefail
build="$(cd "$1" && pwd)"
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
sudo=""
if [ "$(id -u)" -ne 0 ]; then sudo="sudo"; fi
work="$(mktemp -d)"
installed=0
cleanup() {
  if [ "$installed" = 1 ]; then $sudo dpkg --purge heatchain >/dev/null 2>&1 || true; fi
  rm -rf "$work"
}
trap cleanup EXIT
step() { echo "-- $*"; }
fail() { echo "FAIL: $*" >&2; exit 1; }

version="$(sed -n 's/^#define HEATCHAIN_VERSION_STRING "\(.*\)"$/\1/p' "$build/generated/heatchain/version.hpp")"
[ -n "$version" ] || fail "no version in $build/generated/heatchain/version.hpp"
deb="$build/heatchain_${version}_amd64.deb"

step "cpack: $(basename "$deb")"
rm -f "$deb"
(cd "$build" && cpack -G DEB >"$work/cpack.log" 2>&1) || { cat "$work/cpack.log"; fail "cpack"; }
[ -f "$deb" ] || fail "cpack made no $deb"
depends="$(dpkg-deb -f "$deb" Depends)"
echo "   Depends: $depends"
for lib in libc6 libstdc++6 libqt6core6 libqt6widgets6; do
  grep -q "\b$lib\b" <<<"$depends" || fail "Depends lacks $lib (dpkg-shlibdeps should have found it)"
done

step "lintian"
# --fail-on error: any E: tag fails; warnings are printed for the reader.
lintian --fail-on error --tag-display-limit 0 "$deb" | tee "$work/lintian.log"
if grep -q '^E:' "$work/lintian.log"; then fail "lintian reports errors"; fi

step "desktop-file-validate and appstreamcli validate (files as packaged)"
dpkg-deb -x "$deb" "$work/tree"
desktop-file-validate "$work/tree/usr/share/applications/org.heatchain.Heatchain.desktop"
appstreamcli validate --no-net "$work/tree/usr/share/metainfo/org.heatchain.Heatchain.metainfo.xml"

step "dpkg -i"
installed=1
$sudo dpkg -i "$deb" >"$work/dpkg.log" 2>&1 || { cat "$work/dpkg.log"; fail "dpkg -i"; }
[ "$(command -v heatchain-cli)" = /usr/bin/heatchain-cli ] || fail "heatchain-cli is not /usr/bin/heatchain-cli"
[ "$(/usr/bin/heatchain-cli --version)" = "heatchain-cli $version" ] || fail "heatchain-cli --version"
[ "$(QT_QPA_PLATFORM=offscreen /usr/bin/heatchain --version)" = "heatchain $version" ] || fail "heatchain --version"

step "installed heatchain-cli computes an installed sample"
sample=/usr/share/heatchain/sample-projects/boiler-feed.hchain
(cd "$work" && /usr/bin/heatchain-cli compute "$sample" --json -o results.json)
/usr/bin/python3 - "$work/results.json" <<'PY'
import json, sys
r = json.load(open(sys.argv[1]))
assert r["substance"] == "water" and len(r["steps"]) > 0, r.keys()
# First law on every step, read back from the installed program's output.
for s in r["steps"]:
    assert abs(s["dH"] - (s["Q"] + s["W"])) <= 1e-9 * max(abs(s["Q"]), abs(s["W"]), 1.0), s["id"]
print("   %d steps, total Q %.6g W" % (len(r["steps"]), r["totals"]["Q"]))
PY
/usr/bin/heatchain-cli check - <"$sample"

step "man -l renders both pages without warnings"
for page in heatchain heatchain-cli; do
  f=/usr/share/man/man1/$page.1.gz
  MANWIDTH=80 man --warnings -l "$f" >"$work/$page.txt" 2>"$work/$page.warn" || fail "man -l $f"
  [ ! -s "$work/$page.warn" ] || { cat "$work/$page.warn"; fail "man warnings in $page.1"; }
  grep -q "EXIT STATUS\|OPTIONS" "$work/$page.txt" || fail "$page.1 rendered without its sections"
done

step "the MIME type resolves for a .hchain file"
cp "$sample" "$work/plant.hchain"
type="$(XDG_CURRENT_DESKTOP=GNOME xdg-mime query filetype "$work/plant.hchain")"
[ "$type" = "application/x-heatchain" ] || fail "xdg-mime says '$type' for a .hchain file"
grep -q "application/x-heatchain" /usr/share/mime/globs2 || fail "update-mime-database did not run"
[ -f /usr/share/icons/hicolor/48x48/mimetypes/application-x-heatchain.png ] || fail "no 48 px file icon"

step "bash completion"
bash "$root/tests/package/completion_test.sh" /usr/share/bash-completion/completions/heatchain-cli "$sample"

step "the installed Python module"
(cd "$work" && env -u PYTHONPATH PYTHONDONTWRITEBYTECODE=1 /usr/bin/python3 -c '
import heatchain, sys
assert heatchain.__file__.startswith("/usr/lib/python3/dist-packages/heatchain/"), heatchain.__file__
print("   heatchain", heatchain.__version__, "from", heatchain.__file__)
')
[ "$(cd "$work" && env -u PYTHONPATH PYTHONDONTWRITEBYTECODE=1 /usr/bin/python3 -c 'import heatchain; print(heatchain.__version__)')" = "$version" ] ||
  fail "the module's version"
(cd "$work" && env -u PYTHONPATH PYTHONDONTWRITEBYTECODE=1 HEATCHAIN_CLI=/usr/bin/heatchain-cli HEATCHAIN_SOURCE_DIR="$root" MPLBACKEND=Agg \
  /usr/bin/python3 -m pytest -q -p no:cacheprovider "$root/tests/python")

step "dpkg --purge removes it cleanly"
dpkg-query -L heatchain | sort >"$work/files"
$sudo dpkg --purge heatchain >"$work/purge.log" 2>&1 || { cat "$work/purge.log"; fail "dpkg --purge"; }
installed=0
left=0
while read -r f; do
  if [ -f "$f" ] || [ -L "$f" ]; then echo "left behind: $f"; left=1; fi
done <"$work/files"
[ "$left" = 0 ] || fail "files left after removal"
[ ! -e /usr/lib/python3/dist-packages/heatchain ] || fail "the Python package folder is left behind"
if grep -q "application/x-heatchain" /usr/share/mime/globs2; then fail "the MIME type outlived the package"; fi
echo "package checks passed: $(basename "$deb")"
