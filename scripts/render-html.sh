#!/usr/bin/env bash
# Renders an erg HTML report in headless Chromium to a PNG, and checks the page: no console error,
# no request leaving the page, and the three charts (svg ids chart-energy, chart-latency,
# chart-roofline) present in the rendered DOM.
#
#   scripts/render-html.sh REPORT.html OUT.png [WIDTH] [HEIGHT]
#
# Needs Debian's chromium package; it is installed with apt-get when missing (as root). Exit 0 when
# the page renders clean, 1 when a check fails, 2 on bad usage.
set -euo pipefail

if [ $# -lt 2 ]; then
  echo "usage: $0 REPORT.html OUT.png [WIDTH] [HEIGHT]" >&2
  exit 2
fi
report=$1
out=$2
width=${3:-1200}
height=${4:-3200}
if [ ! -f "$report" ]; then
  echo "render-html: $report: no such file" >&2
  exit 2
fi

browser=""
for b in chromium chromium-browser; do
  if command -v "$b" >/dev/null 2>&1; then browser=$b; break; fi
done
if [ -z "$browser" ]; then
  echo "render-html: installing Debian's chromium package" >&2
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -qq
  apt-get install -y -qq chromium fonts-dejavu-core >/dev/null
  browser=chromium
fi

work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
url="file://$(cd "$(dirname "$report")" && pwd)/$(basename "$report")"
mkdir -p "$(dirname "$out")"
abs_out="$(cd "$(dirname "$out")" && pwd)/$(basename "$out")"

flags=(--headless --no-sandbox --disable-gpu --disable-quic --no-first-run --disable-background-networking
       --disable-component-update --disable-sync --disable-extensions --hide-scrollbars
       --force-device-scale-factor=1 --enable-logging=stderr --v=0)

# 1. The screenshot, with the browser's log (console messages land in it as "CONSOLE" lines).
"$browser" "${flags[@]}" --user-data-dir="$work/profile-shot" --window-size="$width,$height" \
  --screenshot="$abs_out" "$url" >"$work/shot.out" 2>"$work/shot.log" || true
if [ ! -s "$abs_out" ]; then
  echo "render-html: chromium wrote no screenshot; its log:" >&2
  tail -20 "$work/shot.log" >&2
  exit 1
fi

# 2. The DOM after rendering, in a fresh profile.
"$browser" "${flags[@]}" --user-data-dir="$work/profile-dom" --dump-dom "$url" \
  >"$work/dom.html" 2>"$work/dom.log" || true

fail=0
if grep -E "Uncaught|ERROR:CONSOLE|CONSOLE\([0-9]+\)" "$work/shot.log" "$work/dom.log" >/dev/null; then
  echo "render-html: the page logged console errors:" >&2
  grep -E "Uncaught|ERROR:CONSOLE|CONSOLE\([0-9]+\)" "$work/shot.log" "$work/dom.log" >&2
  fail=1
fi
for id in chart-energy chart-latency chart-roofline; do
  if ! grep -q "<svg id=\"$id\"" "$work/dom.html"; then
    echo "render-html: the rendered page has no svg with id $id" >&2
    fail=1
  fi
done
# The page must stand alone: no element that loads anything.
if grep -Eiq "<(script|link|img|iframe|object|embed)[ >]|@import|url\(" "$work/dom.html"; then
  echo "render-html: the page loads something from elsewhere" >&2
  fail=1
fi
if [ $fail -eq 0 ]; then
  echo "render-html: $report rendered to $out (${width}x${height}), no console error, 3 charts"
fi
exit $fail
