#!/usr/bin/env bash
# Local check of the review report (not run by CI): renders an HTML report in
# headless Chromium to a PNG and fails when the picture is blank. Installs the
# Debian `chromium` package when it is missing (needs root and the network;
# the page itself needs no network).
#
#   bash scripts/render_report.sh                 # writes and renders the demo job's report
#   bash scripts/render_report.sh REPORT.html [OUT.png]
#
# TW_REPORT_WINDOW (default 1400,2000) is the window in CSS pixels and
# TW_REPORT_SCALE (default 1) the device scale factor: 0.6 gives the small
# picture in docs/report_screenshot.png.
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
report="${1:-}"
png="${2:-$root/build/report.png}"

if [[ -z "$report" ]]; then
  cmake -S "$root" -B "$root/build" -DTW_BUILD_BENCHMARKS=OFF > /dev/null
  cmake --build "$root/build" -j2 --target write_sample_report > /dev/null
  report="$root/build/sample_report.html"
  "$root/build/tests/postproc/write_sample_report" "$report"
fi
[[ -f "$report" ]] || { echo "render_report: no such file: $report" >&2; exit 2; }

if ! command -v chromium > /dev/null; then
  echo "render_report: installing chromium"
  apt-get update
  apt-get install -y --no-install-recommends chromium
fi

profile="$(mktemp -d)"
trap 'rm -rf "$profile"' EXIT
mkdir -p "$(dirname "$png")"
rm -f "$png"
# No network, no first-run or background traffic: the page must render from
# the file alone.
chromium --headless --no-sandbox --disable-gpu --disable-quic --no-first-run \
  --disable-background-networking --disable-component-update --disable-sync \
  --user-data-dir="$profile" --hide-scrollbars --screenshot="$png" \
  --force-device-scale-factor="${TW_REPORT_SCALE:-1}" \
  --window-size="${TW_REPORT_WINDOW:-1400,2000}" "file://$(realpath "$report")" 2> "$profile/chromium.log" \
  || { cat "$profile/chromium.log" >&2; exit 1; }
[[ -s "$png" ]] || { echo "render_report: chromium wrote no PNG" >&2; exit 1; }

# Not blank: enough distinct colours in a sample of the pixels. A blank or
# error page has one or two; the report has text, plots and bands in many.
python3 "$root/scripts/png_colour_count.py" "$png" 40
echo "render_report: $png"
