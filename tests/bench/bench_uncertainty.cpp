// Uncertainty and sweep speed: first-order propagation of a 20-step sequence
// (target ≤ 50 ms), 10,000 Monte Carlo draws of it without curves (target
// ≤ 2 s on two cores), and a sweep, each on one thread and on two (the ratio
// is the second core's speed-up, target ≥ 1.8). Wall-clock time (real time),
// since the work is spread over threads.
//
// The worksheet is a steam cycle of our own invention, three times over (20
// steps), with tolerances on its start, flow, targets, sources and efficiencies.
#include <benchmark/benchmark.h>

#include <cstdio>
#include <cstdlib>
#include <string>

#include "heatchain/project_file.hpp"
#include "heatchain/sweep.hpp"
#include "heatchain/uncertainty.hpp"

namespace {

using namespace heatchain;

const char* kLoop[] = {
    R"({ "id": "feed-pump-%", "kind": "compress", "to": { "P": "12 bar" }, "path": "adiabatic", "efficiency": "0.68 ± 0.03" })",
    R"({ "id": "preheat-%", "kind": "heat", "to": { "T": "170 degC ± 1 K" }, "source": { "T": "230 degC ± 2 K" } })",
    R"({ "id": "evaporate-%", "kind": "boil", "source": { "T": "230 degC ± 2 K" } })",
    R"({ "id": "superheat-%", "kind": "heat", "to": { "T": "290 degC ± 2 K" }, "source": { "T": "400 degC" } })",
    R"({ "id": "turbine-%", "kind": "expand", "to": { "P": "1.2 bar" }, "path": "adiabatic", "efficiency": "0.78 ± 0.02" })",
    R"({ "id": "condense-%", "kind": "condense", "sink": { "T": "25 degC ± 1 K" } })",
    R"({ "id": "subcool-%", "kind": "cool", "to": { "T": "45 degC ± 0.5 K" }, "sink": { "T": "25 degC" } })",
};

Project worksheet(int steps) {
    std::string t = R"({ "format": "heatchain-project", "version": 1, "meta": { "title": "uncertainty benchmark" },
  "system": "steady-flow", "model": "reference", "substance": "water", "basis": { "massFlow": "3.6 t/h ± 2 %" },
  "start": { "T": "45 degC ± 0.5 K", "P": "1.2 bar" }, "steps": [
)";
    for (int i = 0; i < steps; ++i) {
        const std::string step = kLoop[i % 7];
        const std::size_t at = step.find('%');
        if (i) t += ",\n";
        t += step.substr(0, at) + std::to_string(i / 7) + step.substr(at + 1);
    }
    t += "\n] }\n";
    auto p = parseProject(t, "bench.hchain");
    if (!p) {
        std::fprintf(stderr, "benchmark worksheet does not load: %s\n", p.error().text().c_str());
        std::abort();
    }
    return std::move(*p);
}

void FirstOrder20Steps(benchmark::State& st) {
    const Project p = worksheet(20);
    UncertaintyOptions o;
    o.threads = unsigned(st.range(0));
    for (auto _ : st) {
        auto r = propagateUncertainty(p, o);
        if (!r) st.SkipWithError(r.error().text().c_str());
        benchmark::DoNotOptimize(r);
    }
}
BENCHMARK(FirstOrder20Steps)->Arg(1)->Arg(2)->Unit(benchmark::kMillisecond)->UseRealTime();

void MonteCarlo10000Draws20Steps(benchmark::State& st) {
    const Project p = worksheet(20);
    UncertaintyOptions o;
    o.method = UncertaintyMethod::MonteCarlo;
    o.samples = 10000;
    o.seed = 1;
    o.threads = unsigned(st.range(0));
    for (auto _ : st) {
        auto r = propagateUncertainty(p, o);
        if (!r) st.SkipWithError(r.error().text().c_str());
        benchmark::DoNotOptimize(r);
    }
}
BENCHMARK(MonteCarlo10000Draws20Steps)->Arg(1)->Arg(2)->Unit(benchmark::kMillisecond)->UseRealTime()->Iterations(1);

void Sweep200Points20Steps(benchmark::State& st) {
    const Project p = worksheet(20);
    SweepSpec spec{"superheat-0", "to.T", "260 degC", "320 degC", 200, {}};
    spec.threads = unsigned(st.range(0));
    for (auto _ : st) {
        auto r = sweep(p, spec);
        if (!r) st.SkipWithError(r.error().text().c_str());
        benchmark::DoNotOptimize(r);
    }
}
BENCHMARK(Sweep200Points20Steps)->Arg(1)->Arg(2)->Unit(benchmark::kMillisecond)->UseRealTime();

}  // namespace

BENCHMARK_MAIN();
