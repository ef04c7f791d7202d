#!/usr/bin/env bash
# Builds the Debian package with cpack, unpacks it into a temporary root and
# runs both programs from there: `earmark-cli --help`, a scan of the packaged
# demo samples, and an offscreen `earmark --screenshot` of a packaged take.
# Also checks the desktop entry and the AppStream metadata with their
# validators (desktop-file-validate, appstreamcli), and that `cmake --install`
# works into another prefix. Usage: package_install_test.sh BUILD_DIR
set -euo pipefail
build="$1"
work="$(mktemp -d)"
trap 'rm -rf "$work"' EXIT
fail() { echo "FAIL: $*" >&2; exit 1; }

cpack --config "$build/CPackConfig.cmake" -B "$work/out" >"$work/cpack.log" 2>&1 ||
  { cat "$work/cpack.log" >&2; fail "cpack could not build the package"; }
deb="$(ls "$work"/out/earmark_*.deb)"
[ -f "$deb" ] || fail "no earmark_*.deb in $work/out"
echo "package: $(basename "$deb") ($(du -k "$deb" | cut -f1) KiB)"

# Control fields: the shared libraries became dependencies; the model is recommended.
depends="$(dpkg-deb -f "$deb" Depends)"
for lib in libsndfile1 libfftw3 libsoxr libespeak-ng libqt6widgets6 libsqlite3 libpq; do
  grep -q "$lib" <<<"$depends" || fail "Depends does not name $lib: $depends"
done
grep -q pocketsphinx-en-us <<<"$(dpkg-deb -f "$deb" Recommends)" || fail "Recommends does not name the model"

root="$work/root"
dpkg-deb -x "$deb" "$root"
for f in usr/bin/earmark usr/bin/earmark-cli \
         usr/share/applications/earmark.desktop \
         usr/share/metainfo/org.example.earmark.metainfo.xml \
         usr/share/icons/hicolor/scalable/apps/earmark.svg \
         usr/share/icons/hicolor/48x48/apps/earmark.png \
         usr/share/icons/hicolor/256x256/apps/earmark.png \
         usr/share/doc/earmark/README.md usr/share/doc/earmark/scan.md \
         usr/share/earmark/samples/lines.csv usr/share/earmark/samples/takes/ferry-001.wav; do
  [ -e "$root/$f" ] || fail "the package holds no $f"
done
desktop-file-validate "$root/usr/share/applications/earmark.desktop" || fail "desktop entry does not validate"
appstreamcli validate --no-net "$root/usr/share/metainfo/org.example.earmark.metainfo.xml" ||
  fail "AppStream metadata does not validate"

"$root/usr/bin/earmark-cli" --help >"$work/help.txt" || fail "earmark-cli --help exited with $?"
grep -q scan "$work/help.txt" || fail "earmark-cli --help does not list scan"
# The packaged demo samples scan from the package (their manifest's paths are relative to it).
"$root/usr/bin/earmark-cli" scan "$root/usr/share/earmark/samples/lines.csv" --jobs 2 --out "$work/scan.csv" 2>"$work/scan.log" ||
  { cat "$work/scan.log" >&2; fail "scan of the packaged samples failed"; }
[ "$(grep -c ferry- "$work/scan.csv")" -eq "$(grep -c ferry- "$root/usr/share/earmark/samples/lines.csv")" ] ||
  fail "the scan did not list every packaged take"

QT_QPA_PLATFORM=offscreen "$root/usr/bin/earmark" --screenshot "$work/shot.png" --size 800x500 \
  "$root/usr/share/earmark/samples/takes/ferry-001.wav" >"$work/window.log" 2>&1 ||
  { cat "$work/window.log" >&2; fail "earmark --screenshot failed"; }
file "$work/shot.png" | grep -q "PNG image data, 800 x 500" || fail "no 800x500 screenshot: $(file "$work/shot.png")"

# Any prefix, without the package.
cmake --install "$build" --prefix "$work/prefix" >/dev/null
"$work/prefix/bin/earmark-cli" --help >/dev/null || fail "earmark-cli from cmake --install failed"
[ -f "$work/prefix/share/doc/earmark/README.md" ] || fail "cmake --install put no README under the prefix"
echo "package installs and runs"
