// Speed of the water reference model and its IF97 / ice Ih primitives.
// Targets (ARCHITECTURE.md): ≤ 0.5 µs for regions 1 and 2 from (T, P),
// ≤ 2 µs for (P, h) and (P, s). Run with --benchmark_repetitions=5 and read
// the median aggregate.
#include <benchmark/benchmark.h>

#include <vector>

#include "heatchain/models/ice_ih.hpp"
#include "heatchain/models/if97.hpp"
#include "heatchain/models/water_model.hpp"

using namespace heatchain;

namespace {

std::shared_ptr<const PropertyModel> water() {
    Substance s;
    s.id = "water";
    s.name = "Water";
    return makeWaterReferenceModel(s).value();
}

// A small cycle of inputs so that the branch predictor sees varied states.
template <class F>
void cycle(benchmark::State& st, const std::vector<std::pair<double, double>>& in, F&& f) {
    std::size_t i = 0;
    for (auto _ : st) {
        const auto& x = in[i];
        benchmark::DoNotOptimize(f(x.first, x.second));
        i = (i + 1) % in.size();
    }
}

const std::vector<std::pair<double, double>> kR1 = {{300, 3e6}, {350, 1e5}, {500, 20e6}, {450, 80e6}, {600, 50e6}};
const std::vector<std::pair<double, double>> kR2 = {{400, 1e4}, {700, 3e6}, {900, 60e6}, {500, 1e5}, {1000, 10e6}};
const std::vector<std::pair<double, double>> kR3 = {{650, 25.6e6}, {700, 40e6}, {750, 78e6}, {660, 22e6}, {800, 90e6}};
const std::vector<std::pair<double, double>> kR5 = {{1500, 0.5e6}, {1500, 30e6}, {2000, 30e6}, {1200, 1e6}, {2200, 45e6}};
const std::vector<std::pair<double, double>> kIce = {{263.15, 101325}, {200, 1e6}, {100, 100e6}, {273, 1e3}, {250, 1e8}};

void If97Region1TP(benchmark::State& st) { cycle(st, kR1, [](double T, double P) { return if97::region1(T, P).h; }); }
void If97Region2TP(benchmark::State& st) { cycle(st, kR2, [](double T, double P) { return if97::region2(T, P).h; }); }
// h and s alone ("raw"): what a caller that needs only those two pays.
void If97Region1HS(benchmark::State& st) {
    cycle(st, kR1, [](double T, double P) { const auto r = if97::region1HS(T, P); return r.h + r.s; });
}
void If97Region2HS(benchmark::State& st) {
    cycle(st, kR2, [](double T, double P) { const auto r = if97::region2HS(T, P); return r.h + r.s; });
}
void If97Region5TP(benchmark::State& st) { cycle(st, kR5, [](double T, double P) { return if97::region5(T, P).h; }); }
void If97Saturation(benchmark::State& st) {
    cycle(st, kR1, [](double T, double P) { return if97::saturationPressure(T) + if97::saturationTemperature(P); });
}
void IceIhTP(benchmark::State& st) { cycle(st, kIce, [](double T, double P) { return ice::props(T, P).h; }); }

void ModelTP(benchmark::State& st, const std::vector<std::pair<double, double>>& in) {
    auto m = water();
    cycle(st, in, [&](double T, double P) { return m->stateTP(T, P)->h; });
}

void ModelPH(benchmark::State& st, const std::vector<std::pair<double, double>>& in) {
    auto m = water();
    std::vector<std::pair<double, double>> ph;
    for (auto [T, P] : in) ph.emplace_back(P, m->stateTP(T, P)->h);
    cycle(st, ph, [&](double P, double h) { return m->statePH(P, h)->T; });
}

void ModelPS(benchmark::State& st, const std::vector<std::pair<double, double>>& in) {
    auto m = water();
    std::vector<std::pair<double, double>> ps;
    for (auto [T, P] : in) ps.emplace_back(P, m->stateTP(T, P)->s);
    cycle(st, ps, [&](double P, double s) { return m->statePS(P, s)->T; });
}

void ModelWetPH(benchmark::State& st) {
    auto m = water();
    std::vector<std::pair<double, double>> ph;
    for (double P : {1e4, 1e5, 1e6, 5e6, 15e6})
        ph.emplace_back(P, m->stateOnLineP(Transition::Boiling, P, 0.4)->h);
    cycle(st, ph, [&](double P, double h) { return m->statePH(P, h)->T; });
}

}  // namespace

BENCHMARK(If97Region1TP);
BENCHMARK(If97Region2TP);
BENCHMARK(If97Region1HS);
BENCHMARK(If97Region2HS);
BENCHMARK(If97Region5TP);
BENCHMARK(If97Saturation);
BENCHMARK(IceIhTP);
BENCHMARK_CAPTURE(ModelTP, region1, kR1);
BENCHMARK_CAPTURE(ModelTP, region2, kR2);
BENCHMARK_CAPTURE(ModelTP, region3, kR3);
BENCHMARK_CAPTURE(ModelTP, region5, kR5);
BENCHMARK_CAPTURE(ModelTP, ice, kIce);
BENCHMARK_CAPTURE(ModelPH, region1, kR1);
BENCHMARK_CAPTURE(ModelPH, region2, kR2);
BENCHMARK_CAPTURE(ModelPH, region3, kR3);
BENCHMARK_CAPTURE(ModelPS, region1, kR1);
BENCHMARK_CAPTURE(ModelPS, region2, kR2);
BENCHMARK_CAPTURE(ModelPS, region3, kR3);
BENCHMARK(ModelWetPH);
BENCHMARK_MAIN();
