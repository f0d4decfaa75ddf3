// Sweeps: one input varied linearly (in SI) between two quantities, the
// project re-read and re-solved at each point. See sweep.hpp.
#include "heatchain/sweep.hpp"

#include <cmath>
#include <cstdio>
#include <functional>

#include "heatchain/project_file.hpp"
#include "heatchain/uncertainty.hpp"

namespace heatchain {

namespace {

struct InputPath {
    std::vector<std::string> keys;  // inside the step object (or "start")
    Dimension dimension = Dimension::Dimensionless;
    bool number = false;            // written as a JSON number
};

// The inputs a sweep may vary, and how each is written in the file.
Result<InputPath> resolveInput(const Project& p, bool start, std::string input) {
    const Dimension energy = p.system == SystemKind::Closed ? Dimension::Energy : Dimension::Power;
    if (start) {
        if (input.rfind("start.", 0) == 0) input = input.substr(6);
        if (input == "T") return InputPath{{"T"}, Dimension::Temperature, false};
        if (input == "P") return InputPath{{"P"}, Dimension::Pressure, false};
        if (input == "quality") return InputPath{{"quality"}, Dimension::Dimensionless, true};
        if (input == "meltFraction") return InputPath{{"meltFraction"}, Dimension::Dimensionless, true};
        return makeError("unknown input \"" + input + "\" of the start state; valid ones are T, P, quality, meltFraction",
                         "sweep --input");
    }
    if (input == "to.T") return InputPath{{"to", "T"}, Dimension::Temperature, false};
    if (input == "to.P") return InputPath{{"to", "P"}, Dimension::Pressure, false};
    if (input == "to.duty") return InputPath{{"to", "duty"}, energy, false};
    if (input == "to.quality") return InputPath{{"to", "quality"}, Dimension::Dimensionless, true};
    if (input == "to.ratio") return InputPath{{"to", "ratio"}, Dimension::Dimensionless, true};
    if (input == "efficiency" || input == "fraction" || input == "n")
        return InputPath{{input}, Dimension::Dimensionless, true};
    // Heat transfer: the exchanger, jacket or coil, and a batch's times.
    if (input == "transfer.U") return InputPath{{"transfer", "U"}, Dimension::HeatTransferCoefficient, false};
    if (input == "transfer.area") return InputPath{{"transfer", "area"}, Dimension::Area, false};
    if (input == "transfer.UA") return InputPath{{"transfer", "UA"}, Dimension::ThermalConductance, false};
    if (input == "to.time") return InputPath{{"to", "time"}, Dimension::Time, false};
    if (input == "duration") return InputPath{{"duration"}, Dimension::Time, false};
    if (input == "source.T") return InputPath{{"source", "T"}, Dimension::Temperature, false};
    if (input == "sink.T") return InputPath{{"sink", "T"}, Dimension::Temperature, false};
    return makeError("unknown input \"" + input +
                         "\" of a step; valid ones are to.T, to.P, to.duty, to.quality, to.ratio, to.time, efficiency, "
                         "fraction, n, source.T, sink.T, transfer.U, transfer.area, transfer.UA, duration",
                     "sweep --input");
}

std::string_view siUnit(Dimension d) {
    switch (d) {
        case Dimension::Temperature: return "K";
        case Dimension::Pressure: return "Pa";
        case Dimension::Energy: return "J";
        case Dimension::Power: return "W";
        case Dimension::Area: return "m2";
        case Dimension::HeatTransferCoefficient: return "W/(m2 K)";
        case Dimension::ThermalConductance: return "W/K";
        case Dimension::Time: return "s";
        default: return "";
    }
}

// Sets the input in the project's JSON; other targets of "to" are removed
// (a step has one target), a utility named by the source or sink gives way
// to the temperature, and on the start an over-specification is avoided.
void setInput(Json& node, const InputPath& in, const Json& value) {
    if (in.keys.size() == 2) {
        Json& parent = node[in.keys[0]];
        if (!parent.is_object()) parent = Json::object();
        if (in.keys[0] == "to")
            for (const char* k : {"T", "P", "duty", "quality", "ratio", "rated", "time"}) parent.erase(k);
        // U with area, or UA instead of both.
        if (in.keys[0] == "transfer") {
            if (in.keys[1] == "UA") {
                parent.erase("U");
                parent.erase("area");
            } else {
                parent.erase("UA");
            }
        }
        if (in.keys[0] == "source" || in.keys[0] == "sink") parent.erase("utility");
        parent[in.keys[1]] = value;
        return;
    }
    const std::string& key = in.keys[0];
    if (key == "T" || key == "P") {
        // Start on a phase line (quality or meltFraction with T or P): the swept one replaces the other.
        if (node.contains("quality") || node.contains("meltFraction")) node.erase(key == "T" ? "P" : "T");
    }
    if (key == "quality" || key == "meltFraction") {
        node.erase(key == "quality" ? "meltFraction" : "quality");
        if (node.contains("T") && node.contains("P")) node.erase("T");
    }
    node[key] = value;
}

}  // namespace

std::size_t SweepResult::computed() const {
    std::size_t n = 0;
    for (const auto& p : points) n += p.error ? 0 : 1;
    return n;
}

namespace {

using Getter = std::function<std::optional<double>(const SequenceResult&)>;

struct OutputDef {
    SweepOutput out;
    Getter get;
};

std::vector<OutputDef> outputDefs(const Project& p) {
    const bool closed = p.system == SystemKind::Closed;
    const Dimension dE = closed ? Dimension::Energy : Dimension::Power;
    const Dimension dS = closed ? Dimension::Entropy : Dimension::EntropyRate;
    const Dimension dM = closed ? Dimension::Mass : Dimension::MassFlow;
    std::vector<OutputDef> d;
    auto total = [&](const char* key, const char* label, Dimension dim, const std::function<double(const Totals&)>& f) {
        d.push_back({{std::string("total.") + key, label, dim}, [f](const SequenceResult& r) { return std::optional<double>(f(r.totals)); }});
    };
    total("Q", "total Q", dE, [](const Totals& t) { return t.Q; });
    total("W", "total W", dE, [](const Totals& t) { return t.W; });
    total("heatingDuty", "heating duty", dE, [](const Totals& t) { return t.heatingDuty; });
    total("coolingDuty", "cooling duty", dE, [](const Totals& t) { return t.coolingDuty; });
    total("Sgen", "total S_gen", dS, [](const Totals& t) { return t.Sgen; });
    total("exergyDestroyed", "exergy destroyed", dE, [](const Totals& t) { return t.exergyDestroyed; });
    d.push_back({{"total.secondLawEfficiency", "second-law efficiency", Dimension::Dimensionless},
                 [](const SequenceResult& r) { return r.totals.secondLawEfficiency; }});
    d.push_back({{"total.area", "total area", Dimension::Area}, [](const SequenceResult& r) { return r.totals.area; }});
    if (closed)
        d.push_back({{"total.cycleTime", "cycle time", Dimension::Time},
                     [](const SequenceResult& r) { return r.totals.cycleTime; }});
    for (std::size_t i = 0; i < p.steps.size(); ++i) {
        const std::string id = p.steps[i].id;
        auto step = [&](const char* key, const char* label, Dimension dim, const std::function<double(const StepResult&)>& f) {
            d.push_back({{"step:" + id + "." + key, id + " " + label, dim}, [i, f](const SequenceResult& r) {
                             return i < r.steps.size() && r.steps[i].computed ? std::optional<double>(f(r.steps[i]))
                                                                              : std::nullopt;
                         }});
        };
        step("T_end", "T end", Dimension::Temperature, [](const StepResult& s) { return s.end.T; });
        step("P_end", "P end", Dimension::Pressure, [](const StepResult& s) { return s.end.P; });
        step("Q", "Q", dE, [](const StepResult& s) { return s.Q; });
        step("W", "W", dE, [](const StepResult& s) { return s.W; });
        step("Sgen", "S_gen", dS, [](const StepResult& s) { return s.Sgen; });
        step("exergyDestroyed", "exergy destroyed", dE, [](const StepResult& s) { return s.exergyDestroyed; });
        d.push_back({{"step:" + id + ".area", id + " area", Dimension::Area},
                     [i](const SequenceResult& r) -> std::optional<double> {
                         if (i >= r.steps.size() || !r.steps[i].computed || !r.steps[i].transfer) return std::nullopt;
                         return r.steps[i].transfer->area;
                     }});
        if (closed)
            d.push_back({{"step:" + id + ".duration", id + " time", Dimension::Time},
                         [i](const SequenceResult& r) -> std::optional<double> {
                             if (i >= r.steps.size() || !r.steps[i].computed || !r.steps[i].batch) return std::nullopt;
                             return r.steps[i].batch->duration;
                         }});
        d.push_back({{"step:" + id + ".approach", id + " min approach", Dimension::TemperatureDifference},
                     [i](const SequenceResult& r) -> std::optional<double> {
                         if (i >= r.steps.size() || !r.steps[i].computed || !r.steps[i].utility) return std::nullopt;
                         return r.steps[i].utility->minApproach;
                     }});
    }
    for (std::size_t k = 0; k < p.utilityList().size(); ++k) {
        const std::string id = p.utilityList()[k].id;
        d.push_back({{"utility:" + id + ".mass", id + " use", dM}, [k](const SequenceResult& r) -> std::optional<double> {
                         if (k >= r.utilities.size()) return std::nullopt;
                         return r.utilities[k].mass;
                     }});
        d.push_back({{"utility:" + id + ".duty", id + " duty", dE}, [k](const SequenceResult& r) -> std::optional<double> {
                         if (k >= r.utilities.size()) return std::nullopt;
                         return r.utilities[k].heatSupplied + r.utilities[k].heatAbsorbed;
                     }});
    }
    return d;
}

}  // namespace

std::vector<SweepOutput> sweepOutputKeys(const Project& project) {
    std::vector<SweepOutput> out;
    for (auto& d : outputDefs(project)) out.push_back(d.out);
    return out;
}

Result<SweepResult> sweep(const Project& project, const SweepSpec& spec, const SolveOptions& options) {
    if (spec.points < 2 || spec.points > kMaxSweepPoints)
        return makeError("the number of points must be 2 to " + std::to_string(kMaxSweepPoints) + "; got " +
                             std::to_string(spec.points),
                         "sweep --points");
    const bool start = spec.step == "start";
    std::size_t stepIndex = 0;
    if (!start) {
        while (stepIndex < project.steps.size() && project.steps[stepIndex].id != spec.step) ++stepIndex;
        if (stepIndex >= project.steps.size()) {
            std::string ids;
            for (const auto& s : project.steps) ids += (ids.empty() ? "" : ", ") + s.id;
            return makeError("no step \"" + spec.step + "\"; the steps are " + (ids.empty() ? "none" : ids) +
                                 " (or \"start\" for the start state)",
                             "sweep --step");
        }
    }
    auto in = resolveInput(project, start, spec.input);
    if (!in) return in.error();
    auto bound = [&](const std::string& text, const char* which) -> Result<double> {
        auto v = parseQuantity(text, in->dimension, project.unitContext());
        if (!v) return makeError(v.error().message, std::string("sweep --") + which);
        return v;
    };
    auto x0 = bound(spec.from, "from");
    if (!x0) return x0.error();
    auto x1 = bound(spec.to, "to");
    if (!x1) return x1.error();

    const auto defs = outputDefs(project);
    std::vector<const OutputDef*> chosen;
    if (spec.outputs.empty()) {
        const std::string endOf = start ? (project.steps.empty() ? "" : project.steps.back().id) : spec.step;
        for (const auto& d : defs) {
            const std::string& k = d.out.key;
            if (k == "total.Q" || k == "total.W" || k == "total.Sgen" || k == "total.exergyDestroyed" ||
                k == "step:" + endOf + ".T_end")
                chosen.push_back(&d);
            // The use of every utility that has one (fixed utilities have no stream to count).
            for (const Utility& u : project.utilityList())
                if (u.kind != UtilityKind::Fixed && k == "utility:" + u.id + ".mass") chosen.push_back(&d);
        }
    } else {
        for (const auto& key : spec.outputs) {
            const OutputDef* found = nullptr;
            for (const auto& d : defs)
                if (d.out.key == key) found = &d;
            if (!found) {
                std::string keys;
                for (const auto& d : defs) {
                    if (!keys.empty()) keys += ", ";
                    keys += d.out.key;
                }
                // Once, on the way out with an error.
                // NOLINTNEXTLINE(performance-inefficient-string-concatenation)
                return makeError("unknown output \"" + key + "\"; this project has " + keys, "sweep --outputs");
            }
            chosen.push_back(found);
        }
    }

    SweepResult result;
    result.spec = spec;
    result.inputDimension = in->dimension;
    for (const auto* d : chosen) result.outputs.push_back(d->out);

    // The model does not change along a sweep (substance and model kind are
    // not inputs): build it once.
    auto model = makeModel(project.model, project.substance);
    if (!model) return makeError(model.error().message, "model");
    Json base;
    try {
        base = Json::parse(writeProject(project));
    } catch (const std::exception& e) {
        return makeError(std::string("cannot prepare the sweep: ") + e.what(), "sweep");
    }
    // The points are independent: they are solved on every core, each into
    // its own slot, so the result is in input order whatever the threads.
    result.points.resize(static_cast<std::size_t>(spec.points));
    parallelFor(result.points.size(), spec.threads, [&](std::size_t idx) {
        const int k = static_cast<int>(idx);
        SweepPoint& pt = result.points[idx];
        pt.x = *x0 + (*x1 - *x0) * double(k) / double(spec.points - 1);
        if (k == spec.points - 1) pt.x = *x1;
        Json value;
        if (in->number) {
            value = pt.x;
            pt.text = value.dump();
        } else {
            char buf[64];
            std::snprintf(buf, sizeof buf, "%.12g %s", pt.x, std::string(siUnit(in->dimension)).c_str());
            pt.text = buf;
            value = pt.text;
        }
        Json j = base;
        Json& node = start ? j["start"] : j["steps"][stepIndex];
        setInput(node, *in, value);
        auto p = parseProject(j.dump());
        if (!p) {
            Error e = p.error();
            e.message = "at " + spec.input + " = " + pt.text + ": " + e.message;
            pt.error = e;
            pt.values.assign(chosen.size(), std::nullopt);
            return;
        }
        const SequenceResult r = solve(*p, *model, options);
        for (const auto& s : r.steps)
            for (const auto& w : s.warnings) pt.warnings.push_back(s.id + ": " + w);
        for (const auto& w : r.warnings) pt.warnings.push_back(w);
        if (const Error* e = r.firstError()) {
            pt.error = *e;
            pt.values.assign(chosen.size(), std::nullopt);
        } else {
            for (const auto* d : chosen) pt.values.push_back(d->get(r));
        }
    });
    return result;
}

}  // namespace heatchain
