// Speed of ammonia's reference model (Tillner-Roth et al. 1993): states from
// (T, P) in vapour and liquid, saturation at T, and states from (P, h) in the
// two-phase region and in superheated vapour. Run with
// --benchmark_repetitions=9 --benchmark_report_aggregates_only=true and read
// the medians (the machine is shared).
#include <benchmark/benchmark.h>

#include "heatchain/models/ammonia.hpp"
#include "heatchain/substance.hpp"

namespace {

using namespace heatchain;

const PropertyModel& ammonia() {
    static const auto m = makeAmmoniaReferenceModel(*SubstanceLibrary::builtin().find("ammonia")).value();
    return *m;
}

void BM_Ammonia_StateTP_Vapour(benchmark::State& st) {
    const auto& m = ammonia();
    double T = 330.0;
    for (auto _ : st) {
        auto s = m.stateTP(T, 5e5);
        benchmark::DoNotOptimize(s);
        T = T > 400 ? 330.0 : T + 0.37;
    }
}
BENCHMARK(BM_Ammonia_StateTP_Vapour);

void BM_Ammonia_StateTP_Liquid(benchmark::State& st) {
    const auto& m = ammonia();
    double T = 220.0;
    for (auto _ : st) {
        auto s = m.stateTP(T, 2e6);
        benchmark::DoNotOptimize(s);
        T = T > 300 ? 220.0 : T + 0.37;
    }
}
BENCHMARK(BM_Ammonia_StateTP_Liquid);

void BM_Ammonia_SaturationAtT(benchmark::State& st) {
    const auto& m = ammonia();
    double T = 240.0;
    for (auto _ : st) {
        auto p = m.transitionPressure(Transition::Boiling, T);
        benchmark::DoNotOptimize(p);
        T = T > 390 ? 240.0 : T + 0.71;
    }
}
BENCHMARK(BM_Ammonia_SaturationAtT);

void BM_Ammonia_StatePH_TwoPhase(benchmark::State& st) {
    const auto& m = ammonia();
    const double P = 2.908e5;  // about -10 C saturation
    const double hl = m.stateOnLineP(Transition::Boiling, P, 0.0)->h;
    const double hv = m.stateOnLineP(Transition::Boiling, P, 1.0)->h;
    double x = 0.05;
    for (auto _ : st) {
        auto s = m.statePH(P, hl + x * (hv - hl));
        benchmark::DoNotOptimize(s);
        x = x > 0.95 ? 0.05 : x + 0.0137;
    }
}
BENCHMARK(BM_Ammonia_StatePH_TwoPhase);

void BM_Ammonia_StatePH_Superheated(benchmark::State& st) {
    const auto& m = ammonia();
    const double P = 1.555e6;  // about 40 C saturation
    const double h0 = m.stateTP(330.0, P)->h, h1 = m.stateTP(450.0, P)->h;
    double f = 0.0;
    for (auto _ : st) {
        auto s = m.statePH(P, h0 + f * (h1 - h0));
        benchmark::DoNotOptimize(s);
        f = f > 0.98 ? 0.0 : f + 0.0173;
    }
}
BENCHMARK(BM_Ammonia_StatePH_Superheated);

}  // namespace

BENCHMARK_MAIN();
