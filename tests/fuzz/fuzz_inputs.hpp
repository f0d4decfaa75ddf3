#pragma once
// The bodies of the fuzz targets, shared by the libFuzzer drivers
// (fuzz_<target>.cpp, built with HEATCHAIN_FUZZ=ON and clang) and by the
// GoogleTest that replays every corpus file in every build
// (tests/core/fuzz_corpus_test.cpp), so each regression input found by a
// fuzzer runs on every machine, with or without clang.
//
// Each function feeds one input to a core entry point. Any input must give a
// value or an Error: a crash, a hang or a sanitizer report is the failure the
// fuzzer looks for. A broken promise of the API that does not crash (a parsed
// quantity that is not finite, a written project that cannot be read back) is
// returned as a message so both drivers can fail on it.
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <optional>
#include <string>
#include <string_view>

#include "heatchain/json.hpp"
#include "heatchain/project_file.hpp"
#include "heatchain/property_model.hpp"
#include "heatchain/solver.hpp"
#include "heatchain/streams.hpp"
#include "heatchain/substance.hpp"
#include "heatchain/units.hpp"

namespace heatchain::fuzz {

// Project text: load; a loaded project must write and load again, and its
// sequence must solve (to values or errors).
inline std::optional<std::string> projectInput(const std::uint8_t* data, std::size_t size) {
    const std::string_view text(reinterpret_cast<const char*>(data), size);
    // Several streams (version 2): read, write, read again to the same bytes.
    if (auto set = parseStreamSet(text, "fuzz.hchain"); set && set->streams.size() > 1) {
        const std::string written = writeStreamSet(*set);
        auto again = parseStreamSet(written, "rewritten.hchain");
        if (!again) return "a worksheet of several streams was written as text that does not load: " + again.error().text();
        if (writeStreamSet(*again) != written) return "a worksheet of several streams does not write back stably";
    }
    auto project = parseProject(text, "fuzz.hchain");
    if (!project) return std::nullopt;
    const std::string written = writeProject(*project);
    auto again = parseProject(written, "rewritten.hchain");
    if (!again) return "a loaded project was written as text that does not load: " + again.error().text();
    // Solving is bounded work per step; a cap keeps one input inside the
    // fuzzer's 1 s budget.
    if (project->steps.size() <= 32) {
        SolveOptions options;
        options.curvePointsPerStep = 4;
        auto result = solve(*project, options);
        for (const auto& step : result.steps) {
            if (!step.computed) continue;
            for (double x : {step.Q, step.W, step.dH, step.dU, step.dS, step.Sgen, step.exergyDestroyed})
                if (!std::isfinite(x)) return "step \"" + step.id + "\" computed a non-finite balance";
        }
    }
    return std::nullopt;
}

inline constexpr int kDimensionCount = static_cast<int>(kLastDimension) + 1;

// Quantity text: byte 0 picks the Dimension, byte 1 the atmosphere gauge
// units refer to (50–305 kPa), the rest is the text. A parsed value must be
// finite (units.hpp promises it) and format in every display system.
inline std::optional<std::string> quantityInput(const std::uint8_t* data, std::size_t size) {
    if (size < 2) return std::nullopt;
    const auto dimension = static_cast<Dimension>(data[0] % kDimensionCount);
    UnitContext context;
    context.atmosphere_Pa = 50000.0 + 1000.0 * data[1];
    const std::string_view text(reinterpret_cast<const char*>(data + 2), size - 2);
    auto value = parseQuantity(text, dimension, context);
    if (!value) return std::nullopt;
    if (!std::isfinite(*value)) return "parseQuantity returned a non-finite value for \"" + std::string(text) + "\"";
    for (auto system : {UnitSystem::SI, UnitSystem::MetricEngineering, UnitSystem::USCustomary})
        (void)formatQuantity(*value, dimension, system, context);
    return std::nullopt;
}

// A custom substance object: parse; a parsed substance must give every model
// kind or an Error, and the models must answer at a few pressures. The same
// text is read as a library file too, which locates its errors in the text.
inline std::optional<std::string> substanceInput(const std::uint8_t* data, std::size_t size) {
    const std::string_view text(reinterpret_cast<const char*>(data), size);
    const std::string_view texts[] = {text};
    if (auto lib = SubstanceLibrary::fromJsonTexts(texts); !lib && lib.error().where.empty())
        return "a library text was refused without saying where: " + lib.error().message;
    auto json = nlohmann::ordered_json::parse(text, nullptr, /*allow_exceptions=*/false);
    if (json.is_discarded()) return std::nullopt;
    auto substance = parseSubstance(json, "substance");
    if (!substance) return std::nullopt;
    for (auto kind : {ModelKind::ConstantCp, ModelKind::TemperatureDependentCp, ModelKind::RealFluid,
                      ModelKind::Reference}) {
        auto model = makeModel(kind, *substance);
        if (!model) continue;
        const auto& m = **model;
        for (double P : {1e3, 101325.0, 1e6}) {
            (void)m.transitionsAt(P);
            (void)m.stateTP(300.0, P);
            (void)m.statePH(P, 1e5);
        }
    }
    return std::nullopt;
}

}  // namespace heatchain::fuzz
