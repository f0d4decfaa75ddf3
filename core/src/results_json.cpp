// The results contract of `heatchain-cli compute --json` (project-format.md):
// fixed keys, SI numbers. Also the CSV ledger with units in the header row.
#include "heatchain/results_json.hpp"

#include <cmath>
#include <cstdio>
#include <sstream>

namespace heatchain {

namespace {

Json numberOrNull(double v) { return std::isfinite(v) ? Json(v) : Json(nullptr); }

Json optNumber(const std::optional<double>& v) { return v ? numberOrNull(*v) : Json(nullptr); }

}  // namespace

Json stateToJson(const State& s) {
    Json j = Json::object();
    j["T_K"] = numberOrNull(s.T);
    j["P_Pa"] = numberOrNull(s.P);
    j["phase"] = std::string(phaseId(s.phase));
    j["quality"] = optNumber(s.quality);
    j["meltFraction"] = optNumber(s.meltFraction);
    j["h_J_per_kg"] = numberOrNull(s.h);
    j["s_J_per_kgK"] = numberOrNull(s.s);
    j["u_J_per_kg"] = numberOrNull(s.u);
    j["v_m3_per_kg"] = numberOrNull(s.v);
    return j;
}

Json resultsToJson(const Project& project, const SequenceResult& r) {
    const bool closed = project.system == SystemKind::Closed;
    Json j = Json::object();
    j["title"] = project.meta.title;
    j["system"] = std::string(systemId(project.system));
    j["model"] = std::string(modelId(project.model));
    j["substance"] = project.substance.id;
    j["units"] = {{"Q", closed ? "J" : "W"},        {"W", closed ? "J" : "W"},
                  {"dH", closed ? "J" : "W"},       {"dU", closed ? "J" : "W"},
                  {"dS", closed ? "J/K" : "W/K"},   {"Sgen", closed ? "J/K" : "W/K"},
                  {"exergyDestroyed", closed ? "J" : "W"}, {"massBasis", closed ? "kg" : "kg/s"}};
    j["massBasis"] = r.massBasis;
    j["start"] = r.startError ? Json(nullptr) : stateToJson(r.start);
    Json steps = Json::array();
    for (const auto& s : r.steps) {
        Json st = Json::object();
        st["id"] = s.id;
        st["kind"] = std::string(stepKindId(s.kind));
        if (s.computed) {
            st["start"] = stateToJson(s.start);
            st["end"] = stateToJson(s.end);
            st["Q"] = s.Q;
            st["W"] = s.W;
            st["dH"] = s.dH;
            st["dU"] = s.dU;
            st["dS"] = s.dS;
            st["Sgen"] = s.Sgen;
            st["exergyDestroyed"] = s.exergyDestroyed;
            Json segs = Json::array();
            for (const auto& g : s.segments) {
                segs.push_back({{"label", g.label}, {"start", stateToJson(g.start)},
                                {"end", stateToJson(g.end)}, {"Q", g.Q}});
            }
            st["segments"] = segs;
        } else {
            for (const char* k : {"start", "end", "Q", "W", "dH", "dU", "dS", "Sgen", "exergyDestroyed"})
                st[k] = nullptr;
            st["segments"] = Json::array();
        }
        st["warnings"] = s.warnings;
        if (s.error) st["error"] = s.error->text();
        steps.push_back(std::move(st));
    }
    j["steps"] = steps;
    const auto& t = r.totals;
    j["totals"] = {{"Q", t.Q},       {"W", t.W},       {"dH", t.dH},
                   {"dU", t.dU},     {"dS", t.dS},     {"Sgen", t.Sgen},
                   {"exergyDestroyed", t.exergyDestroyed},
                   {"heatingDuty", t.heatingDuty},     {"coolingDuty", t.coolingDuty}};
    if (r.model) {
        j["modelName"] = std::string(r.model->name());
    }
    if (const Error* e = r.firstError()) j["error"] = e->text();
    return j;
}

std::string resultsToCsv(const Project& project, const SequenceResult& r) {
    const bool closed = project.system == SystemKind::Closed;
    const std::string E = closed ? "J" : "W", S = closed ? "J/K" : "W/K";
    std::ostringstream out;
    out << "step,kind,segment,T_start [K],P_start [Pa],T_end [K],P_end [Pa],phase_end,quality_end,"
        << "Q [" << E << "],W [" << E << "],dH [" << E << "],dS [" << S << "],Sgen [" << S
        << "],exergy destroyed [" << E << "]\n";
    auto q = [](const std::string& s) {
        if (s.find_first_of(",\"\n") == std::string::npos) return s;
        std::string o = "\"";
        for (char c : s) {
            if (c == '"') o += '"';
            o += c;
        }
        return o + "\"";
    };
    auto n = [](double v) {
        char buf[64];
        std::snprintf(buf, sizeof buf, "%.10g", v);
        return std::string(buf);
    };
    auto qual = [&](const State& s) { return s.quality ? n(*s.quality) : std::string(); };
    for (const auto& s : r.steps) {
        if (!s.computed) {
            out << q(s.id) << "," << stepKindId(s.kind) << ",,,,,,,,,,,,,\n";
            continue;
        }
        out << q(s.id) << "," << stepKindId(s.kind) << ",," << n(s.start.T) << "," << n(s.start.P) << ","
            << n(s.end.T) << "," << n(s.end.P) << "," << phaseId(s.end.phase) << "," << qual(s.end) << ","
            << n(s.Q) << "," << n(s.W) << "," << n(s.dH) << "," << n(s.dS) << "," << n(s.Sgen) << ","
            << n(s.exergyDestroyed) << "\n";
        if (s.segments.size() > 1) {
            for (const auto& g : s.segments) {
                out << q(s.id) << "," << stepKindId(s.kind) << "," << q(g.label) << "," << n(g.start.T) << ","
                    << n(g.start.P) << "," << n(g.end.T) << "," << n(g.end.P) << "," << phaseId(g.end.phase) << ","
                    << qual(g.end) << "," << n(g.Q) << ",,,,,\n";
            }
        }
    }
    const auto& t = r.totals;
    out << "total,,,,,,,,," << n(t.Q) << "," << n(t.W) << "," << n(t.dH) << "," << n(t.dS) << "," << n(t.Sgen)
        << "," << n(t.exergyDestroyed) << "\n";
    out << "heating duty,,,,,,,,," << n(t.heatingDuty) << ",,,,,\n";
    out << "cooling duty,,,,,,,,," << n(-t.coolingDuty) << ",,,,,\n";
    return out.str();
}

}  // namespace heatchain
