// Cost of the utilities, second law and sweeps: solving a sample with steam and cooling
// water (approach search, utility use, exergy accounts) and a 20-point sweep.
#include <benchmark/benchmark.h>

#include <string>

#include "heatchain/project_file.hpp"
#include "heatchain/solver.hpp"
#include "heatchain/sweep.hpp"
#include "support/samples.hpp"

namespace {

heatchain::Project load(const char* name) {
    auto p = heatchain::loadProject(heatchain::testing::samplePath(name));
    return p ? *p : heatchain::Project{};
}

void BM_SolveWithUtilities(benchmark::State& state) {
    const auto p = load("solvent-recovery");
    auto model = heatchain::makeModel(p.model, p.substance);
    for (auto _ : state) {
        auto r = heatchain::solve(p, *model);
        benchmark::DoNotOptimize(r.totals.exergyDestroyed);
    }
}
BENCHMARK(BM_SolveWithUtilities)->Unit(benchmark::kMicrosecond);


void BM_Sweep20Points(benchmark::State& state) {
    const auto p = load("solvent-recovery");
    const heatchain::SweepSpec spec{"superheat", "to.T", "120 degC", "135 degC", 20, {}};
    for (auto _ : state) {
        auto r = heatchain::sweep(p, spec);
        benchmark::DoNotOptimize(r);
    }
}
BENCHMARK(BM_Sweep20Points)->Unit(benchmark::kMillisecond);

}  // namespace

BENCHMARK_MAIN();
