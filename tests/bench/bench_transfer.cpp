// Heat-transfer speed (targets of the heat-transfer work): sizing every step
// of a 100-step sequence adds at most 20 % to its solve (compare
// SolveSized/100 with SolvePlain/100), and a batch step's time integration
// costs at most 50 µs (BatchStep).
//
// The sequence is a water/steam cycle of our own invention repeated as often
// as needed (each cycle returns to its start), every heat-exchanging step
// against a utility or a plain temperature.
#include <benchmark/benchmark.h>

#include <cstdio>
#include <cstdlib>
#include <string>

#include "heatchain/project_file.hpp"
#include "heatchain/solver.hpp"

namespace {

using namespace heatchain;

const char* kCycle[] = {
    R"({ "id": "pump-%", "kind": "compress", "to": { "P": "14 bar" }, "path": "adiabatic", "efficiency": 0.7 })",
    R"({ "id": "eco-%", "kind": "heat", "to": { "T": "180 degC" }, "source": { "T": "240 degC" }@L })",
    R"({ "id": "boil-%", "kind": "boil", "source": { "T": "240 degC" }@B })",
    R"({ "id": "sh-%", "kind": "heat", "to": { "T": "265 degC" }, "source": { "T": "420 degC" }@V })",
    R"({ "id": "turbine-%", "kind": "expand", "to": { "P": "1.4 bar" }, "path": "adiabatic", "efficiency": 0.8 })",
    R"({ "id": "cond-%", "kind": "condense", "sink": { "utility": "cw" }@C })",
    R"({ "id": "sub-%", "kind": "cool", "to": { "T": "48 degC" }, "sink": { "T": "30 degC" }@L })",
};

std::string worksheetText(int steps, bool sized) {
    std::string t = R"j({ "format": "heatchain-project", "version": 1,
  "meta": { "title": "benchmark cycle" }, "system": "steady-flow", "model": "reference",
  "substance": "water", "basis": { "massFlow": "4.2 t/h" },
  "start": { "T": "48 degC", "P": "1.4 bar" },
  "utilities": [ { "id": "cw", "kind": "sensible", "in": "20 degC", "out": "28 degC", "cp": "4.18 kJ/(kg K)" } ],
  "steps": [
)j";
    for (int i = 0; i < steps; ++i) {
        std::string s = kCycle[i % 7];
        s.replace(s.find('%'), 1, std::to_string(i / 7));
        if (auto at = s.find('@'); at != std::string::npos) {
            std::string spec;
            if (sized) {
                switch (s[at + 1]) {
                    case 'L': spec = R"j(, "transfer": { "U": "800 W/(m2 K)" })j"; break;
                    case 'B': spec = R"j(, "transfer": { "U": { "liquid": "800 W/(m2 K)", "two-phase": "2500 W/(m2 K)" } })j"; break;
                    case 'V': spec = R"j(, "transfer": { "U": "90 W/(m2 K)" })j"; break;
                    default: spec = R"j(, "transfer": { "U": { "vapour": "90 W/(m2 K)", "two-phase": "3000 W/(m2 K)" } })j"; break;
                }
            }
            s.replace(at, 2, spec);
        }
        t += (i ? ",\n" : "") + s;
    }
    return t + "\n] }\n";
}

Project load(const std::string& text) {
    auto p = parseProject(text, "bench.hchain");
    if (!p) {
        std::fprintf(stderr, "benchmark worksheet does not load: %s\n", p.error().text().c_str());
        std::abort();
    }
    return std::move(*p);
}

void solveLoop(benchmark::State& st, const Project& p) {
    auto model = makeModel(p.model, p.substance).value();
    if (auto check = solve(p, model); !check.ok()) st.SkipWithError(check.firstError()->text().c_str());
    for (auto _ : st) {
        auto r = solve(p, model);
        benchmark::DoNotOptimize(r);
    }
}

void SolvePlain(benchmark::State& st) { solveLoop(st, load(worksheetText(int(st.range(0)), false))); }
void SolveSized(benchmark::State& st) { solveLoop(st, load(worksheetText(int(st.range(0)), true))); }
BENCHMARK(SolvePlain)->Arg(100)->Unit(benchmark::kMillisecond);
BENCHMARK(SolveSized)->Arg(100)->Arg(1000)->Unit(benchmark::kMillisecond);

// One batch heating step through a jacket (64 curve points), then the same
// step without its jacket: the difference is the time integration.
const char* kBatch = R"({ "format": "heatchain-project", "version": 1, "system": "closed", "model": "reference",
  "substance": "water", "basis": { "mass": "2 t" }, "start": { "T": "20 degC", "P": "2 bar" },
  "heatLoss": { "UA": "30 W/K" },
  "steps": [ { "id": "heat-up", "kind": "heat", "to": { "T": "90 degC" }, "source": { "T": "120 degC" }@J } ] })";

std::string batchText(bool jacket) {
    std::string s = kBatch;
    s.replace(s.find("@J"), 2, jacket ? R"j(, "transfer": { "U": "450 W/(m2 K)", "area": "6 m2" })j" : "");
    return s;
}

// The same heat-up through a coil fed by hot water at a given flow: its
// outlet follows the batch, and its own entropy change is integrated along
// the step as well.
std::string flowingText(bool coil) {
    std::string s = kBatch;
    const std::string plain = R"("source": { "T": "120 degC" })";
    s.replace(s.find(plain), plain.size(), R"j("source": { "utility": "hw" })j");
    s.replace(s.find(R"("steps")"), 0,
              R"j("utilities": [ { "id": "hw", "kind": "sensible", "in": "120 degC", "flow": "2 kg/s", "cp": "4.25 kJ/(kg K)" } ],
  )j");
    s.replace(s.find("@J"), 2, coil ? R"j(, "transfer": { "U": "450 W/(m2 K)", "area": "6 m2" })j" : "");
    return s;
}

void BatchStep(benchmark::State& st) { solveLoop(st, load(batchText(true))); }
void BatchStepFlowing(benchmark::State& st) { solveLoop(st, load(flowingText(true))); }
void BatchStepFlowingWithoutCoil(benchmark::State& st) { solveLoop(st, load(flowingText(false))); }
BENCHMARK(BatchStepFlowing)->Unit(benchmark::kMicrosecond);
BENCHMARK(BatchStepFlowingWithoutCoil)->Unit(benchmark::kMicrosecond);
void BatchStepWithoutJacket(benchmark::State& st) { solveLoop(st, load(batchText(false))); }
BENCHMARK(BatchStep)->Unit(benchmark::kMicrosecond);
BENCHMARK(BatchStepWithoutJacket)->Unit(benchmark::kMicrosecond);

}  // namespace

BENCHMARK_MAIN();
