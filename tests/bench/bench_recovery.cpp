// Heat recovery targets of a worksheet of 20 streams × 10 steps (target:
// 10 ms): the targets from already solved streams (cutting the curves into
// straight pieces, then the problem table, composites and utility levels),
// the problem table alone on those pieces, and a 20-point ΔTmin sweep.
#include <benchmark/benchmark.h>

#include <cstdio>
#include <cstdlib>
#include <string>

#include "heatchain/recovery.hpp"
#include "heatchain/streams.hpp"

namespace {

// 20 water streams at 6 bar (liquid, IF97), each with 10 heating and
// cooling steps that wander between 25 and 150 °C: an invented plant.
heatchain::StreamSet twentyStreams() {
    std::string text = R"({ "format": "heatchain-project", "version": 2, "minApproach": "10 K", "streams": [)";
    for (int s = 0; s < 20; ++s) {
        text += std::string(s ? "," : "") + R"({ "id": "s)" + std::to_string(s) +
                R"(", "system": "steady-flow", "model": "reference", "substance": "water", "basis": { "massFlow": ")" +
                std::to_string(0.5 + 0.1 * s) + R"( kg/s" }, "start": { "T": ")" + std::to_string(25 + 5 * s) +
                R"( degC", "P": "6 bar" }, "steps": [)";
        int now = 25 + 5 * s;
        for (int k = 0; k < 10; ++k) {
            int T = 25 + (s * 37 + k * 53) % 125;
            if (T == now) T += 7;
            text += std::string(k ? "," : "") + R"({ "id": "k)" + std::to_string(k) + R"(", "kind": ")" +
                    (T > now ? "heat" : "cool") + R"(", "to": { "T": ")" + std::to_string(T) + R"( degC" } })";
            now = T;
        }
        text += "] }";
    }
    text += "] }";
    auto set = heatchain::parseStreamSet(text);
    if (!set) {
        std::fprintf(stderr, "%s\n", set.error().text().c_str());
        std::abort();
    }
    return *set;
}

void BM_TargetsFromSolvedStreams(benchmark::State& state) {
    const auto set = twentyStreams();
    const auto results = heatchain::solveStreams(set);
    for (auto _ : state) {
        auto r = heatchain::worksheetRecovery(set, results, 10.0);
        benchmark::DoNotOptimize(r);
    }
}
BENCHMARK(BM_TargetsFromSolvedStreams)->Unit(benchmark::kMillisecond);

void BM_ProblemTableOnPieces(benchmark::State& state) {
    const auto set = twentyStreams();
    const auto results = heatchain::solveStreams(set);
    std::vector<heatchain::RecoveryStream> streams;
    for (std::size_t i = 0; i < set.streams.size(); ++i)
        streams.push_back({set.streams[i].id, &set.streams[i].project, &results[i], {}});
    const auto pieces = heatchain::piecesFromStreams(streams);
    state.counters["pieces"] = static_cast<double>(pieces.pieces.size());
    state.counters["excluded"] = static_cast<double>(pieces.excluded.size());
    for (auto _ : state) {
        auto t = heatchain::pinchTargets(pieces.pieces, 10.0);
        benchmark::DoNotOptimize(t);
    }
}
BENCHMARK(BM_ProblemTableOnPieces)->Unit(benchmark::kMillisecond);

void BM_DTminSweep20Points(benchmark::State& state) {
    const auto set = twentyStreams();
    const auto results = heatchain::solveStreams(set);
    std::vector<heatchain::RecoveryStream> streams;
    for (std::size_t i = 0; i < set.streams.size(); ++i)
        streams.push_back({set.streams[i].id, &set.streams[i].project, &results[i], {}});
    const auto pieces = heatchain::piecesFromStreams(streams);
    for (auto _ : state) {
        auto s = heatchain::dTminSweep(pieces.pieces, 2.0, 40.0, 20);
        benchmark::DoNotOptimize(s);
    }
}
BENCHMARK(BM_DTminSweep20Points)->Unit(benchmark::kMillisecond);

}  // namespace

BENCHMARK_MAIN();
