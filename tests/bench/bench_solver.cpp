// Worksheet speed (ARCHITECTURE.md targets: solve 100 steps with curves
// <= 5 ms; 1,000 steps <= 50 ms and linear in steps), property calls of the
// simple models, and loading and writing large project files.
//
// The worksheet is a water/steam cycle of our own invention repeated as many
// times as needed: pump, economiser, boil, superheat, expand, condense,
// subcool. Each cycle returns to its start state, so any length is valid.
#include <benchmark/benchmark.h>

#include <string>

#include "heatchain/project_file.hpp"
#include "heatchain/solver.hpp"
#include "heatchain/substance.hpp"

namespace {

using namespace heatchain;

const char* kCycle[] = {
    R"({ "id": "pump-%", "kind": "compress", "to": { "P": "14 bar" }, "path": "adiabatic", "efficiency": 0.7 })",
    R"({ "id": "eco-%", "kind": "heat", "to": { "T": "180 degC" }, "source": { "T": "240 degC" } })",
    R"({ "id": "boil-%", "kind": "boil", "source": { "T": "240 degC" } })",
    R"({ "id": "sh-%", "kind": "heat", "to": { "T": "265 degC" }, "source": { "T": "420 degC" } })",
    R"({ "id": "turbine-%", "kind": "expand", "to": { "P": "1.4 bar" }, "path": "adiabatic", "efficiency": 0.8 })",
    R"({ "id": "cond-%", "kind": "condense", "sink": { "T": "30 degC" } })",
    R"({ "id": "sub-%", "kind": "cool", "to": { "T": "48 degC" }, "sink": { "T": "30 degC" } })",
};

std::string worksheetText(int steps, const char* model = "reference", const char* substance = "water") {
    std::string t = std::string(R"({ "format": "heatchain-project", "version": 1,
  "meta": { "title": "benchmark cycle" }, "system": "steady-flow", "model": ")") + model +
                    R"(", "substance": ")" + substance + R"(", "basis": { "massFlow": "4.2 t/h" },
  "start": { "T": "48 degC", "P": "1.4 bar" }, "steps": [
)";
    for (int i = 0; i < steps; ++i) {
        std::string s = kCycle[i % 7];
        s.replace(s.find('%'), 1, std::to_string(i / 7));
        t += (i ? ",\n" : "") + s;
    }
    return t + "\n] }\n";
}

Project worksheet(int steps, const char* model = "reference") {
    auto p = parseProject(worksheetText(steps, model), "bench.hchain");
    if (!p) {
        std::fprintf(stderr, "benchmark worksheet does not load: %s\n", p.error().text().c_str());
        std::abort();
    }
    return std::move(*p);
}

// The GUI keeps the project and the model between edits and re-solves:
// this is the recompute an edit costs (64 curve points a step).
void SolveWithCurves(benchmark::State& st) {
    const Project p = worksheet(int(st.range(0)));
    auto model = makeModel(p.model, p.substance).value();
    {
        auto check = solve(p, model);
        if (!check.ok()) st.SkipWithError(check.firstError()->text().c_str());
    }
    for (auto _ : st) {
        auto r = solve(p, model);
        benchmark::DoNotOptimize(r);
    }
    st.SetComplexityN(st.range(0));
    st.counters["per_step_us"] = benchmark::Counter(double(st.range(0)), benchmark::Counter::kIsIterationInvariantRate |
                                                                             benchmark::Counter::kInvert);
}
BENCHMARK(SolveWithCurves)->Arg(10)->Arg(100)->Arg(1000)->Arg(10000)->Unit(benchmark::kMillisecond)->Complexity();

// Same worksheet without curves: the bookkeeping alone.
void SolveNoCurves(benchmark::State& st) {
    const Project p = worksheet(int(st.range(0)));
    auto model = makeModel(p.model, p.substance).value();
    for (auto _ : st) {
        auto r = solve(p, model, SolveOptions{0});
        benchmark::DoNotOptimize(r);
    }
}
BENCHMARK(SolveNoCurves)->Arg(100)->Arg(1000)->Unit(benchmark::kMillisecond);

// The other models on the same cycle (100 steps with curves).
void SolveModel(benchmark::State& st, const char* model) {
    const Project p = worksheet(100, model);
    auto m = makeModel(p.model, p.substance).value();
    {
        auto check = solve(p, m);
        if (!check.ok()) st.SkipWithError(check.firstError()->text().c_str());
    }
    for (auto _ : st) {
        auto r = solve(p, m);
        benchmark::DoNotOptimize(r);
    }
}
BENCHMARK_CAPTURE(SolveModel, constant_cp_100, "constant-cp")->Unit(benchmark::kMillisecond);
BENCHMARK_CAPTURE(SolveModel, temperature_dependent_cp_100, "temperature-dependent-cp")->Unit(benchmark::kMillisecond);
BENCHMARK_CAPTURE(SolveModel, real_fluid_100, "real-fluid")->Unit(benchmark::kMillisecond);

// Property calls of the simple models (IF97: bench_if97, PR: bench_peng_robinson).
void SimpleTP(benchmark::State& st, ModelKind kind) {
    auto m = makeModel(kind, *SubstanceLibrary::builtin().find("water")).value();
    double T = 300;
    for (auto _ : st) {
        auto s = m->stateTP(T, 1e5);
        benchmark::DoNotOptimize(s);
        T = T > 360 ? 300 : T + 0.37;
    }
}
BENCHMARK_CAPTURE(SimpleTP, constant_cp_liquid, ModelKind::ConstantCp);
BENCHMARK_CAPTURE(SimpleTP, temperature_dependent_cp_liquid, ModelKind::TemperatureDependentCp);

void SimplePH(benchmark::State& st, ModelKind kind) {
    auto m = makeModel(kind, *SubstanceLibrary::builtin().find("water")).value();
    double h = 2.0e5;
    for (auto _ : st) {
        auto s = m->statePH(1e5, h);
        benchmark::DoNotOptimize(s);
        h = h > 3.0e6 ? 2.0e5 : h + 1.3e4;  // liquid, wet and vapour states
    }
}
BENCHMARK_CAPTURE(SimplePH, constant_cp, ModelKind::ConstantCp);
BENCHMARK_CAPTURE(SimplePH, temperature_dependent_cp, ModelKind::TemperatureDependentCp);

// Loading and writing large project files.
void LoadProject(benchmark::State& st) {
    const std::string text = worksheetText(int(st.range(0)));
    for (auto _ : st) {
        auto p = parseProject(text, "bench.hchain");
        benchmark::DoNotOptimize(p);
    }
    st.SetBytesProcessed(int64_t(st.iterations()) * int64_t(text.size()));
}
BENCHMARK(LoadProject)->Arg(1000)->Arg(10000)->Unit(benchmark::kMillisecond);

void WriteProject(benchmark::State& st) {
    const Project p = worksheet(int(st.range(0)));
    for (auto _ : st) {
        auto text = writeProject(p);
        benchmark::DoNotOptimize(text);
    }
}
BENCHMARK(WriteProject)->Arg(1000)->Arg(10000)->Unit(benchmark::kMillisecond);

// An edit in the application is held to the file's rules by resolving the
// whole worksheet (resolveProject): its cost per edit.
void ResolveProject(benchmark::State& st) {
    const Project p = worksheet(int(st.range(0)));
    for (auto _ : st) {
        auto r = resolveProject(p);
        benchmark::DoNotOptimize(r);
    }
}
BENCHMARK(ResolveProject)->Arg(100)->Arg(1000)->Unit(benchmark::kMillisecond);

}  // namespace

BENCHMARK_MAIN();
