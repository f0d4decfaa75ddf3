#!/usr/bin/env bash
# Every performance measurement behind the README's Performance section, run
# against the targets of ARCHITECTURE.md, in one go. Not part of CI: the
# numbers mean something only on a quiet machine (the script prints the load
# average before and after; rerun when it is above about 1).
#
# Usage: tests/bench/measure.sh [bench-build] [app-build]
#   bench-build: a build with -DHEATCHAIN_BUILD_BENCHMARKS=ON (default build-bench)
#   app-build:   a build with the GUI and CLI (default build)
# Both should be RelWithDebInfo or Release builds.
set -euo pipefail
root="$(cd "$(dirname "$0")/../.." && pwd)"
bench="${1:-$root/build-bench}"
app="${2:-$root/build}"
reps=5
work="$(mktemp -d)"
trap 'rm -rf "$work"' EXIT
export QT_QPA_PLATFORM=offscreen
export XDG_RUNTIME_DIR="${XDG_RUNTIME_DIR:-$work/xdg}"
mkdir -p "$XDG_RUNTIME_DIR" && chmod 0700 "$XDG_RUNTIME_DIR"

median() { sort -g | awk '{ a[NR] = $1 } END { if (NR % 2) print a[(NR + 1) / 2]; else print (a[NR / 2] + a[NR / 2 + 1]) / 2 }'; }

# A worksheet of N steps repeating one seven-step water cycle (pump, heat,
# boil, superheat, expand, condense, subcool), written to FILE with INDENT
# spaces of indentation and TITLE: cycle_worksheet N FILE INDENT TITLE.
cycle_worksheet() {
  /usr/bin/python3 - "$@" <<'PY'
import json, sys
n, path, indent, title = int(sys.argv[1]), sys.argv[2], int(sys.argv[3]), sys.argv[4]
cycle = [
    {"id": "pump", "kind": "compress", "to": {"P": "14 bar"}, "path": "adiabatic", "efficiency": 0.7},
    {"id": "eco", "kind": "heat", "to": {"T": "180 degC"}, "source": {"T": "240 degC"}},
    {"id": "boil", "kind": "boil", "source": {"T": "240 degC"}},
    {"id": "sh", "kind": "heat", "to": {"T": "265 degC"}, "source": {"T": "420 degC"}},
    {"id": "turbine", "kind": "expand", "to": {"P": "1.4 bar"}, "path": "adiabatic", "efficiency": 0.8},
    {"id": "cond", "kind": "condense", "sink": {"T": "30 degC"}},
    {"id": "sub", "kind": "cool", "to": {"T": "48 degC"}, "sink": {"T": "30 degC"}},
]
steps = []
for i in range(n):
    s = dict(cycle[i % 7]); s["id"] = f"{s['id']}-{i // 7}"; steps.append(s)
doc = {"format": "heatchain-project", "version": 1, "meta": {"title": title},
       "system": "steady-flow", "model": "reference", "substance": "water",
       "basis": {"massFlow": "4.2 t/h"}, "start": {"T": "48 degC", "P": "1.4 bar"}, "steps": steps}
json.dump(doc, open(path, "w"), indent=indent)
PY
}

echo "== machine"
echo "cores: $(nproc); cpu: $(grep -m1 'model name' /proc/cpuinfo | cut -d: -f2- | sed 's/^ //')"
echo "compiler: $(g++ --version | head -1); build type: $(grep CMAKE_BUILD_TYPE: "$bench/CMakeCache.txt" | cut -d= -f2)"
echo "load before: $(cut -d' ' -f1-3 /proc/loadavg)"

# Google Benchmark programs: median aggregates of $reps repetitions.
for b in bench_solver bench_if97 bench_peng_robinson bench_ammonia bench_utilities bench_gui_edit; do
  [ -x "$bench/tests/$b" ] || { echo "($b not built)"; continue; }
  echo "== $b (median of $reps)"
  "$bench/tests/$b" --benchmark_repetitions=$reps --benchmark_report_aggregates_only=true \
    --benchmark_format=console 2>/dev/null | grep -E '_median|_BigO|_RMS'
done

# GUI: edit -> redraw on the 100-step worksheet (its own median and p90).
if [ -x "$app/tests/gui/gui_edit_timing" ]; then
  echo "== GUI edit -> redraw, 100 steps (target 16 ms)"
  "$app/tests/gui/gui_edit_timing" 200 2>/dev/null | grep -iE 'median|p90' | head -4
fi

# GUI cold start: main() to the first painted window on a sample, and peak memory.
if [ -x "$app/app/gui/heatchain" ]; then
  echo "== GUI cold start (target 1 s), $reps runs"
  for i in $(seq $reps); do
    /usr/bin/time -v "$app/app/gui/heatchain" "$root/sample-projects/boiler-feed.hchain" --quit-after-show \
      >"$work/start.out" 2>"$work/start.time"
    sed -n 's/.*shown \([0-9.]*\) ms.*/\1/p' "$work/start.out" >>"$work/start.ms"
    sed -n 's/.*Maximum resident set size (kbytes): //p' "$work/start.time" >>"$work/start.kb"
  done
  echo "shown after main(): median $(median <"$work/start.ms") ms; peak RSS median $(($(median <"$work/start.kb" | cut -d. -f1) / 1024)) MB"
fi

# PDF report of a 30-step worksheet with both charts (target 2 s).
if [ -x "$app/app/cli/heatchain-cli" ]; then
  echo "== PDF report, 30 steps (target 2 s), $reps runs"
  cycle_worksheet 30 "$work/thirty.hchain" 2 "thirty-step report timing"
  for i in $(seq $reps); do
    /usr/bin/time -v "$app/app/cli/heatchain-cli" report "$work/thirty.hchain" -o "$work/thirty.pdf" \
      >/dev/null 2>"$work/report.time"
    sed -n 's/.*Elapsed (wall clock) time (h:mm:ss or m:ss): //p' "$work/report.time" |
      awk -F: '{ print $(NF - 1) * 60 + $NF }' >>"$work/report.s"
    sed -n 's/.*Maximum resident set size (kbytes): //p' "$work/report.time" >>"$work/report.kb"
  done
  echo "pages: $(pdfinfo "$work/thirty.pdf" | sed -n 's/^Pages: *//p'); wall median $(median <"$work/report.s") s;" \
       "peak RSS median $(($(median <"$work/report.kb" | cut -d. -f1) / 1024)) MB"
fi
# The command line on long worksheets: compute --json and check of a
# 10,000-step file, and both on a 200,000-step file (the loader's limit is
# 250,000 steps a stream), wall time and peak memory of whole runs.
if [ -x "$app/app/cli/heatchain-cli" ]; then
  for n in 10000 200000; do cycle_worksheet $n "$work/s$n.hchain" 1 "$n-step timing"; done
  for n in 10000 200000; do
    runs=$reps; [ "$n" -gt 10000 ] && runs=1
    for verb in "compute --json" check; do
      rm -f "$work/cli.s" "$work/cli.kb"
      for i in $(seq $runs); do
        # shellcheck disable=SC2086
        /usr/bin/time -v "$app/app/cli/heatchain-cli" $verb "$work/s$n.hchain" >/dev/null 2>"$work/cli.time"
        sed -n 's/.*Elapsed (wall clock) time (h:mm:ss or m:ss): //p' "$work/cli.time" |
          awk -F: '{ print $(NF - 1) * 60 + $NF }' >>"$work/cli.s"
        sed -n 's/.*Maximum resident set size (kbytes): //p' "$work/cli.time" >>"$work/cli.kb"
      done
      echo "== $verb, $n steps ($(($(stat -c %s "$work/s$n.hchain") / 1024)) KiB): wall median $(median <"$work/cli.s") s;" \
           "peak RSS median $(($(median <"$work/cli.kb" | cut -d. -f1) / 1024)) MB ($runs runs)"
    done
  done
fi
echo "load after: $(cut -d' ' -f1-3 /proc/loadavg)"
