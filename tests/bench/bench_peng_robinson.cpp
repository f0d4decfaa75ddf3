// Peng–Robinson real-fluid model speed (ARCHITECTURE.md target: state from
// (T, P) <= 1 us; the brief: saturation <= 20 us). Ammonia built in code.
#include <benchmark/benchmark.h>

#include "heatchain/models/peng_robinson.hpp"
#include "support/ammonia_substance.hpp"

namespace {

using namespace heatchain;

const PropertyModel& ammonia() {
    static const auto m = makePengRobinsonModel(testing::ammoniaForTests()).value();
    return *m;
}

void BM_StateTP_Vapor(benchmark::State& st) {
    const auto& m = ammonia();
    double T = 330.0;
    for (auto _ : st) {
        auto s = m.stateTP(T, 5e5);
        benchmark::DoNotOptimize(s);
        T = T > 400 ? 330.0 : T + 0.37;
    }
}
BENCHMARK(BM_StateTP_Vapor);

void BM_StateTP_Liquid(benchmark::State& st) {
    const auto& m = ammonia();
    double T = 220.0;
    for (auto _ : st) {
        auto s = m.stateTP(T, 2e6);
        benchmark::DoNotOptimize(s);
        T = T > 300 ? 220.0 : T + 0.37;
    }
}
BENCHMARK(BM_StateTP_Liquid);

void BM_PhaseState_Vapor(benchmark::State& st) {
    const auto& m = ammonia();
    double T = 330.0;
    for (auto _ : st) {
        auto s = m.phaseState(Phase::Vapor, T, 5e5);
        benchmark::DoNotOptimize(s);
        T = T > 400 ? 330.0 : T + 0.37;
    }
}
BENCHMARK(BM_PhaseState_Vapor);

void BM_SaturationPressure(benchmark::State& st) {
    const auto& m = ammonia();
    double T = 200.0;
    for (auto _ : st) {
        auto p = m.transitionPressure(Transition::Boiling, T);
        benchmark::DoNotOptimize(p);
        T = T > 400 ? 200.0 : T + 1.37;
    }
}
BENCHMARK(BM_SaturationPressure);

void BM_SaturationTemperature(benchmark::State& st) {
    const auto& m = ammonia();
    double P = 1e4;
    for (auto _ : st) {
        auto t = m.transitionTemperature(Transition::Boiling, P);
        benchmark::DoNotOptimize(t);
        P = P > 1e7 ? 1e4 : P * 1.07;
    }
}
BENCHMARK(BM_SaturationTemperature);

void BM_StatePH(benchmark::State& st) {
    const auto& m = ammonia();
    const double h0 = m.stateTP(300.0, 1e6).value().h, h1 = m.stateTP(400.0, 1e6).value().h;
    double x = 0;
    for (auto _ : st) {
        auto s = m.statePH(1e6, h0 + x * (h1 - h0));
        benchmark::DoNotOptimize(s);
        x = x > 1 ? 0 : x + 0.013;
    }
}
BENCHMARK(BM_StatePH);

void BM_StatePS(benchmark::State& st) {
    const auto& m = ammonia();
    const double s0 = m.stateTP(300.0, 1e6).value().s, s1 = m.stateTP(400.0, 1e6).value().s;
    double x = 0;
    for (auto _ : st) {
        auto s = m.statePS(1e6, s0 + x * (s1 - s0));
        benchmark::DoNotOptimize(s);
        x = x > 1 ? 0 : x + 0.013;
    }
}
BENCHMARK(BM_StatePS);

}  // namespace

BENCHMARK_MAIN();
