#!/usr/bin/python3
"""Times Heatchain's IF97 calls (Google Benchmark, bench_if97) and python3-iapws
on the same states in the same run, and prints both and their ratio.

Usage: /usr/bin/python3 tests/bench/iapws_side_by_side.py BENCH_IF97 [REPETITIONS]

Heatchain: the median aggregate of REPETITIONS (default 5) Google Benchmark
repetitions. python3-iapws (Debian's package, run by Debian's /usr/bin/python3):
the median over REPETITIONS of timeit rounds, each the mean time per call over
the same cycle of states as the benchmark. The states are bench_if97.cpp's
(kR1, kR2, kR3); keep the two lists alike.
"""
import json
import os
import statistics
import subprocess
import sys
import timeit

from iapws import IAPWS97
from iapws.iapws97 import _Region1, _Region2

R1 = [(300, 3e6), (350, 1e5), (500, 20e6), (450, 80e6), (600, 50e6)]
R2 = [(400, 1e4), (700, 3e6), (900, 60e6), (500, 1e5), (1000, 10e6)]
R3 = [(650, 25.6e6), (700, 40e6), (750, 78e6), (660, 22e6), (800, 90e6)]


def bench_medians(binary, reps, names):
    out = subprocess.run(
        [binary, "--benchmark_filter=^(" + "|".join(names) + ")$",
         "--benchmark_repetitions=%d" % reps, "--benchmark_report_aggregates_only=true",
         "--benchmark_format=json"],
        check=True, capture_output=True, text=True).stdout
    med = {}
    for b in json.loads(out)["benchmarks"]:
        if b.get("aggregate_name") == "median":
            unit = {"ns": 1e-9, "us": 1e-6, "ms": 1e-3, "s": 1.0}[b["time_unit"]]
            med[b["run_name"]] = b["real_time"] * unit
    return med


def py_median(fn, states, reps):
    per = []
    for _ in range(reps):
        n = max(1, 2000 // len(states)) if fn.__name__.startswith("raw") else max(1, 40 // len(states))
        t = timeit.timeit(lambda: [fn(*x) for x in states], number=n)
        per.append(t / (n * len(states)))
    return statistics.median(per)


def raw1(T, P):
    return _Region1(T, P / 1e6)


def raw2(T, P):
    return _Region2(T, P / 1e6)


def full_tp(T, P):
    return IAPWS97(T=T, P=P / 1e6)


def ph_of(states):
    return [(P, IAPWS97(T=T, P=P / 1e6).h) for T, P in states]


def full_ph(P, h):
    return IAPWS97(P=P / 1e6, h=h)


def main():
    binary = sys.argv[1]
    reps = int(sys.argv[2]) if len(sys.argv) > 2 else 5
    rows = [
        ("IF97 region 1 (T,P) -> h, s, raw", "If97Region1HS", raw1, R1),
        ("IF97 region 2 (T,P) -> h, s, raw", "If97Region2HS", raw2, R2),
        ("IF97 region 1 (T,P), all properties", "If97Region1TP", raw1, R1),
        ("IF97 region 2 (T,P), all properties", "If97Region2TP", raw2, R2),
        ("water state (T,P), region 1", "ModelTP/region1", full_tp, R1),
        ("water state (T,P), region 3", "ModelTP/region3", full_tp, R3),
        ("water state (P,h), region 1", "ModelPH/region1", full_ph, ph_of(R1)),
        ("water state (P,h), region 2", "ModelPH/region2", full_ph, ph_of(R2)),
        ("water state (P,h), region 3", "ModelPH/region3", full_ph, ph_of(R3)),
    ]
    print("machine: %d cores; %s" % (os.cpu_count(), open("/proc/cpuinfo").read().split("model name")[1]
                                      .split("\n")[0].strip(": \t")))
    print("load average before: %s" % " ".join(open("/proc/loadavg").read().split()[:3]))
    med = bench_medians(binary, reps, [r[1] for r in rows])
    print("%-40s %14s %16s %10s" % ("work", "Heatchain", "python3-iapws", "ratio"))
    for label, name, fn, states in rows:
        ours = med.get(name)
        theirs = py_median(fn, states, reps)
        ratio = theirs / ours if ours else float("nan")
        print("%-40s %11.1f ns %13.2f us %9.0fx" % (label, (ours or float("nan")) * 1e9, theirs * 1e6, ratio))
    print("load average after: %s" % " ".join(open("/proc/loadavg").read().split()[:3]))


if __name__ == "__main__":
    main()
