// The results contract of `heatchain-cli compute --json` (project-format.md):
// fixed keys, SI numbers. Also the CSV ledger with units in the header row.
#include "heatchain/results_json.hpp"

#include "heatchain/rules.hpp"
#include "json_writer.hpp"

#include <cmath>
#include <cstdio>
#include <ostream>
#include <sstream>

namespace heatchain {

namespace {

Json numberOrNull(double v) { return std::isfinite(v) ? Json(v) : Json(nullptr); }

Json optNumber(const std::optional<double>& v) { return v ? numberOrNull(*v) : Json(nullptr); }

Json utilityStepJson(const StepUtility& u, double minApproach, const std::vector<SegmentResult>& segs) {
    Json j = Json::object();
    j["id"] = u.id;
    j["kind"] = std::string(utilityKindId(u.kind));
    j["role"] = u.asSource ? "source" : "sink";
    j["flow"] = u.kind == UtilityKind::Sensible ? "counter-current" : "constant temperature";
    j["T_mean_K"] = u.Tmean;
    j["duty"] = u.duty;
    j["mass"] = u.mass;
    j["volume"] = optNumber(u.volume);
    Json a = Json::object();
    a["minimum_K"] = u.minApproach;
    a["required_K"] = minApproach;
    a["belowRequired"] = approachBelowRequired(u, minApproach);
    a["segment"] = u.segment;
    a["segmentLabel"] = u.segment < segs.size() ? segs[u.segment].label : std::string();
    a["position"] = u.position;
    a["duty"] = u.approachDuty;
    a["T_material_K"] = u.Tmaterial;
    a["T_utility_K"] = u.Tutility;
    j["approach"] = a;
    Json line = Json::array();
    for (const auto& p : u.line) line.push_back({{"Q", p.Q}, {"T_K", p.T}});
    j["line"] = line;
    return j;
}

// A step with no source given has no exergy-destroyed figure: null, and
// "notCharged" says why.
Json stepExergyJson(const StepResult& s) {
    Json j = {{"start_J_per_kg", s.exergyStart}, {"end_J_per_kg", s.exergyEnd}, {"change", s.dEx},
              {"heat", s.exergyHeat},            {"usefulWork", s.usefulWork}, {"supplied", s.exergySupplied},
              {"destroyed", s.exergyNotCharged ? Json(nullptr) : Json(s.exergyDestroyed)},
              {"destroyedShare", s.exergyDestroyedShare},
              {"secondLawEfficiency", optNumber(s.secondLawEfficiency)}};
    if (s.exergyNotCharged) j["notCharged"] = *s.exergyNotCharged;
    return j;
}

// Area and zones of a step (transfer.hpp); a zone's U and area are null
// when only UA was given.
Json transferJson(const StepTransfer& t) {
    Json zones = Json::array();
    for (const auto& z : t.zones)
        zones.push_back({{"label", z.label}, {"Q", z.Q}, {"U_W_per_m2K", z.U > 0 ? Json(z.U) : Json(nullptr)},
                         {"LMTD_K", z.LMTD}, {"area_m2", z.U > 0 ? Json(z.area) : Json(nullptr)}});
    return {{"UA_W_per_K", t.UA}, {"area_m2", optNumber(t.area)}, {"meanDeltaT_K", t.meanDeltaT}, {"zones", zones}};
}

void batchJson(Json& st, const StepBatch& b) {
    st["duration_s"] = b.duration;
    st["peakDuty_W"] = b.peakDuty;
    st["meanDuty_W"] = b.meanDuty;
    Json profile = Json::array();
    for (const auto& p : b.profile) profile.push_back({{"t_s", p.t}, {"T_K", p.T}, {"Qdot_W", p.Qdot}});
    st["profile"] = profile;
}

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

namespace {

// One step of `compute --json`'s "steps" list.
Json stepResultToJson(const Project& project, const SequenceResult& r, const StepResult& s) {
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
        st["exergyDestroyed"] = s.exergyNotCharged ? Json(nullptr) : Json(s.exergyDestroyed);
        Json segs = Json::array();
        for (const auto& g : s.segments) {
            segs.push_back({{"label", g.label}, {"start", stateToJson(g.start)},
                            {"end", stateToJson(g.end)}, {"Q", g.Q}});
        }
        st["segments"] = segs;
        if (s.utility) st["utility"] = utilityStepJson(*s.utility, project.minApproachK(), s.segments);
        st["exergy"] = r.exergyAvailable ? stepExergyJson(s) : Json(nullptr);
        if (s.transfer) st["transfer"] = transferJson(*s.transfer);
        if (s.batch) batchJson(st, *s.batch);
    } else {
        for (const char* k : {"start", "end", "Q", "W", "dH", "dU", "dS", "Sgen", "exergyDestroyed"})
            st[k] = nullptr;
        st["segments"] = Json::array();
    }
    st["warnings"] = s.warnings;
    st["notes"] = s.notes;
    if (s.error) st["error"] = s.error->text();
    return st;
}

// Every member of the results but the steps, which stay an empty list in
// their place (so the members keep their order).
Json resultsHead(const Project& project, const SequenceResult& r) {
    const bool closed = project.system == SystemKind::Closed;
    Json j = Json::object();
    j["title"] = project.meta.title;
    j["system"] = std::string(systemId(project.system));
    j["model"] = std::string(modelId(project.model));
    j["substance"] = project.substance.id;
    j["units"] = {{"Q", closed ? "J" : "W"},        {"W", closed ? "J" : "W"},
                  {"dH", closed ? "J" : "W"},       {"dU", closed ? "J" : "W"},
                  {"dS", closed ? "J/K" : "W/K"},   {"Sgen", closed ? "J/K" : "W/K"},
                  {"exergyDestroyed", closed ? "J" : "W"}, {"massBasis", closed ? "kg" : "kg/s"},
                  {"exergy", closed ? "J" : "W"},   {"utilityMass", closed ? "kg" : "kg/s"},
                  {"utilityVolume", closed ? "m3" : "m3/s"}};
    j["massBasis"] = r.massBasis;
    j["start"] = r.startError ? Json(nullptr) : stateToJson(r.start);
    j["steps"] = Json::array();  // kept in its place; filled by the callers below
    const auto& t = r.totals;
    j["totals"] = {{"Q", t.Q},       {"W", t.W},       {"dH", t.dH},
                   {"dU", t.dU},     {"dS", t.dS},     {"Sgen", t.Sgen},
                   {"exergyDestroyed", t.exergyDestroyed},
                   {"heatingDuty", t.heatingDuty},     {"coolingDuty", t.coolingDuty},
                   {"complete", t.complete}};
    j["totals"]["area_m2"] = optNumber(t.area);
    if (closed) j["totals"]["cycleTime_s"] = optNumber(t.cycleTime);
    j["warnings"] = r.warnings;
    j["notes"] = r.notes;
    // Exergy of the sequence and the utilities.
    if (r.exergyAvailable) {
        j["exergy"] = {{"T0_K", r.T0},
                       {"P0_Pa", r.P0},
                       {"deadState", r.deadState ? stateToJson(*r.deadState) : Json(nullptr)},
                       {"start_J_per_kg", r.exergyStart},
                       {"change", t.dEx},
                       {"heatIn", t.exergyHeatIn},
                       {"heatOut", t.exergyHeatOut},
                       {"workIn", t.workIn},
                       {"workOut", t.workOut},
                       {"supplied", t.exergySupplied},
                       {"destroyed", t.exergyDestroyed},
                       {"secondLawEfficiency", optNumber(t.secondLawEfficiency)}};
    } else {
        j["exergy"] = nullptr;
    }
    j["minApproach_K"] = project.minApproachK();
    Json utilities = Json::array();
    for (const auto& u : r.utilities) {
        Json uj = {{"id", u.id}, {"kind", std::string(utilityKindId(u.kind))}};
        if (u.profile) {
            uj["T_in_K"] = u.profile->Tin;
            uj["T_out_K"] = u.profile->Tout;
            uj["T_mean_K"] = u.profile->Tmean;
            uj["P_Pa"] = u.kind == UtilityKind::Steam ? Json(u.profile->P) : Json(nullptr);
            uj["latentHeat_J_per_kg"] = u.kind == UtilityKind::Steam ? Json(u.profile->latentHeat) : Json(nullptr);
            uj["cp_J_per_kgK"] = u.kind == UtilityKind::Sensible ? Json(u.profile->cp) : Json(nullptr);
        }
        uj["steps"] = u.steps;
        uj["heatSupplied"] = u.heatSupplied;
        uj["heatAbsorbed"] = u.heatAbsorbed;
        uj["mass"] = u.mass;
        uj["volume"] = optNumber(u.volume);
        uj["exergyGivenUp"] = r.exergyAvailable ? Json(u.exergyGivenUp) : Json(nullptr);
        if (u.error) uj["error"] = u.error->text();
        utilities.push_back(std::move(uj));
    }
    j["utilities"] = utilities;
    if (r.model) {
        j["modelName"] = std::string(r.model->name());
    }
    if (const Error* e = r.firstError()) j["error"] = e->text();
    return j;
}

}  // namespace

Json resultsToJson(const Project& project, const SequenceResult& r) {
    Json j = resultsHead(project, r);
    Json& steps = j["steps"];
    for (const auto& s : r.steps) steps.push_back(stepResultToJson(project, r, s));
    return j;
}

void writeResultsJson(std::ostream& out, const Project& project, const SequenceResult& r, const Json& more) {
    Json head = resultsHead(project, r);
    for (auto it = more.begin(); it != more.end(); ++it) head[it.key()] = it.value();
    std::string text;
    detail::JsonWriter w(text);
    auto flush = [&] {
        out.write(text.data(), static_cast<std::streamsize>(text.size()));
        text.clear();
    };
    w.beginObject();
    for (auto it = head.begin(); it != head.end(); ++it) {
        w.key(it.key());
        if (it.key() != "steps") {
            w.value(it.value());
            continue;
        }
        w.beginArray();
        for (const StepResult& s : r.steps) {
            w.value(stepResultToJson(project, r, s));
            flush();
        }
        w.endArray();
    }
    w.endObject();
    flush();
}

std::string csvField(const std::string& s) {
    if (s.find_first_of(",\"\n") == std::string::npos) return s;
    std::string o = "\"";
    for (char c : s) {
        if (c == '"') o += '"';
        o += c;
    }
    return o + "\"";
}

std::string csvNumber(double v) {
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.10g", v);
    return buf;
}

std::string resultsToCsv(const Project& project, const SequenceResult& r) {
    const bool closed = project.system == SystemKind::Closed;
    const std::string E = closed ? "J" : "W", S = closed ? "J/K" : "W/K";
    std::ostringstream out;
    out << "step,kind,segment,T_start [K],P_start [Pa],T_end [K],P_end [Pa],phase_end,quality_end,"
        << "Q [" << E << "],W [" << E << "],dH [" << E << "],dS [" << S << "],Sgen [" << S
        << "],exergy destroyed [" << E << "]"
        << ",utility,utility use [" << (closed ? "kg" : "kg/s") << "],utility volume [" << (closed ? "m3" : "m3/s")
        << "],min approach [K],exergy change [" << E << "],exergy of heat [" << E << "],exergy supplied [" << E
        << "],second-law efficiency,share of exergy destroyed\n";
    const auto q = csvField;
    const auto n = csvNumber;
    auto qual = [&](const State& s) { return s.quality ? n(*s.quality) : std::string(); };
    for (const auto& s : r.steps) {
        if (!s.computed) {
            out << q(s.id) << "," << stepKindId(s.kind) << ",,,,,,,,,,,,," << ",,,,,,,,,\n";
            continue;
        }
        out << q(s.id) << "," << stepKindId(s.kind) << ",," << n(s.start.T) << "," << n(s.start.P) << ","
            << n(s.end.T) << "," << n(s.end.P) << "," << phaseId(s.end.phase) << "," << qual(s.end) << ","
            << n(s.Q) << "," << n(s.W) << "," << n(s.dH) << "," << n(s.dS) << "," << n(s.Sgen) << ","
            << (s.exergyNotCharged ? std::string() : n(s.exergyDestroyed));
        if (s.utility) {
            out << "," << q(s.utility->id) << "," << (s.utility->kind == UtilityKind::Fixed ? "" : n(s.utility->mass))
                << "," << (s.utility->volume ? n(*s.utility->volume) : "") << "," << n(s.utility->minApproach);
        } else {
            out << ",,,,";
        }
        if (r.exergyAvailable) {
            out << "," << n(s.dEx) << "," << n(s.exergyHeat) << "," << n(s.exergySupplied) << ","
                << (s.secondLawEfficiency ? n(*s.secondLawEfficiency) : "") << "," << n(s.exergyDestroyedShare);
        } else {
            out << ",,,,,";
        }
        out << "\n";
        if (s.segments.size() > 1) {
            for (const auto& g : s.segments) {
                out << q(s.id) << "," << stepKindId(s.kind) << "," << q(g.label) << "," << n(g.start.T) << ","
                    << n(g.start.P) << "," << n(g.end.T) << "," << n(g.end.P) << "," << phaseId(g.end.phase) << ","
                    << qual(g.end) << "," << n(g.Q) << ",,,,," << ",,,,,,,,,\n";
            }
        }
    }
    const auto& t = r.totals;
    out << (t.complete ? "total" : "total (incomplete)") << ",,,,,,,,," << n(t.Q) << "," << n(t.W) << "," << n(t.dH) << "," << n(t.dS) << "," << n(t.Sgen)
        << "," << n(t.exergyDestroyed) << ",,,,";
    if (r.exergyAvailable)
        out << "," << n(t.dEx) << "," << n(t.exergyHeatIn - t.exergyHeatOut) << "," << n(t.exergySupplied) << ","
            << (t.secondLawEfficiency ? n(*t.secondLawEfficiency) : "") << "," << (t.exergyDestroyed > 0 ? "1" : "0");
    else
        out << ",,,,,";
    out << "\n";
    out << "heating duty,,,,,,,,," << n(t.heatingDuty) << ",,,,," << ",,,,,,,,,\n";
    out << "cooling duty,,,,,,,,," << n(-t.coolingDuty) << ",,,,," << ",,,,,,,,,\n";
    // One row per utility: its total use in the utility columns.
    for (const auto& u : r.utilities) {
        out << "utility total,,,,,,,,," << n(u.heatSupplied - u.heatAbsorbed) << ",,,,,," << q(u.id) << ","
            << (u.kind == UtilityKind::Fixed ? "" : n(u.mass)) << "," << (u.volume ? n(*u.volume) : "") << ",,,"
            << (r.exergyAvailable ? n(u.exergyGivenUp) : "") << ",,,\n";
    }
    return out.str();
}

}  // namespace heatchain
