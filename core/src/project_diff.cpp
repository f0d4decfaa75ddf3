// Review aid: compares two revisions through the stable writer's JSON (so a
// field reads as typed and unknown fields are compared too) and the solved
// results step by step.
#include "heatchain/project_diff.hpp"

#include <algorithm>
#include <cmath>
#include <functional>
#include <map>
#include <set>
#include <sstream>

#include "heatchain/project_file.hpp"
#include "heatchain/units.hpp"

namespace heatchain {

namespace {

// path → text of every leaf; objects are walked, arrays and scalars are leaves.
void flatten(const Json& j, const std::string& prefix, std::map<std::string, std::string>& out) {
    if (j.is_object()) {
        for (auto it = j.begin(); it != j.end(); ++it)
            flatten(it.value(), prefix.empty() ? it.key() : prefix + "." + it.key(), out);
        return;
    }
    out[prefix] = j.is_string() ? j.get<std::string>() : j.dump();
}

// Field changes between two flattened objects, in the order of the keys of
// `after` first, then fields only `before` has.
std::vector<FieldChange> compareFlat(const Json& before, const Json& after) {
    std::map<std::string, std::string> a, b;
    flatten(before, "", a);
    flatten(after, "", b);
    // Keep the writer's key order for readability: walk `after` in order.
    std::vector<std::string> order;
    std::function<void(const Json&, const std::string&)> keys = [&](const Json& j, const std::string& p) {
        if (j.is_object()) {
            for (auto it = j.begin(); it != j.end(); ++it) keys(it.value(), p.empty() ? it.key() : p + "." + it.key());
        } else {
            order.push_back(p);
        }
    };
    keys(after, "");
    std::vector<FieldChange> out;
    for (const auto& k : order) {
        auto ia = a.find(k);
        const std::string& nb = b.at(k);
        if (ia == a.end()) out.push_back({k, "", nb, false, true});
        else if (ia->second != nb) out.push_back({k, ia->second, nb, true, true});
    }
    order.clear();
    keys(before, "");
    for (const auto& k : order)
        if (!b.count(k)) out.push_back({k, a.at(k), "", true, false});
    return out;
}

// The project as the stable writer writes it; the writer is the format's
// single definition, so comparing its JSON compares exactly what is saved.
Json canonical(const Project& p) {
    return Json::parse(writeProject(p), nullptr, /*allow_exceptions=*/false);
}

// Ids of `a` kept in the same relative order in `b`: a longest common
// subsequence of the common ids. Quadratic; bounded by a table size cap,
// beyond which steps count as moved only when their neighbours differ.
std::set<std::string> keptInOrder(const std::vector<std::string>& a, const std::vector<std::string>& b) {
    const std::size_t n = a.size(), m = b.size();
    std::set<std::string> kept;
    if (n == 0 || m == 0) return kept;
    if (n * m > 25'000'000) {
        std::map<std::string, std::size_t> posB;
        for (std::size_t j = 0; j < m; ++j) posB[b[j]] = j;
        std::size_t last = 0;
        bool first = true;
        for (const auto& id : a) {
            const std::size_t p = posB.at(id);
            if (first || p > last) { kept.insert(id); last = p; first = false; }
        }
        return kept;
    }
    std::vector<std::vector<unsigned>> L(n + 1, std::vector<unsigned>(m + 1, 0));
    for (std::size_t i = n; i-- > 0;)
        for (std::size_t j = m; j-- > 0;)
            L[i][j] = a[i] == b[j] ? L[i + 1][j + 1] + 1 : std::max(L[i + 1][j], L[i][j + 1]);
    for (std::size_t i = 0, j = 0; i < n && j < m;) {
        if (a[i] == b[j]) { kept.insert(a[i]); ++i; ++j; }
        else if (L[i + 1][j] >= L[i][j + 1]) ++i;
        else ++j;
    }
    return kept;
}

const StepResult* findResult(const SequenceResult& r, const std::string& id) {
    for (const auto& s : r.steps)
        if (s.id == id) return &s;
    return nullptr;
}

}  // namespace

bool Shift::changed(double relTol, double absTol) const {
    if (before.has_value() != after.has_value()) return true;
    if (!before) return false;
    return std::fabs(*after - *before) > std::max(absTol, relTol * std::max(std::fabs(*before), std::fabs(*after)));
}

ProjectDiff diffProjects(const Project& before, const Project& after) {
    ProjectDiff d;
    Json a = canonical(before), b = canonical(after);
    Json stepsA = a.contains("steps") ? a["steps"] : Json::array();
    Json stepsB = b.contains("steps") ? b["steps"] : Json::array();
    a.erase("steps");
    b.erase("steps");
    d.project = compareFlat(a, b);

    std::vector<std::string> idsA, idsB;
    std::map<std::string, std::size_t> posA, posB;
    for (std::size_t i = 0; i < before.steps.size(); ++i) { idsA.push_back(before.steps[i].id); posA[before.steps[i].id] = i; }
    for (std::size_t i = 0; i < after.steps.size(); ++i) { idsB.push_back(after.steps[i].id); posB[after.steps[i].id] = i; }
    std::vector<std::string> commonA, commonB;
    for (const auto& id : idsA) if (posB.count(id)) commonA.push_back(id);
    for (const auto& id : idsB) if (posA.count(id)) commonB.push_back(id);
    const std::set<std::string> kept = keptInOrder(commonA, commonB);

    auto stepJson = [](const Json& arr, std::size_t i) {
        Json s = i < arr.size() ? arr[i] : Json::object();
        s.erase("id");
        return s;
    };
    for (std::size_t j = 0; j < idsB.size(); ++j) {
        const std::string& id = idsB[j];
        auto ia = posA.find(id);
        StepChange c;
        c.id = id;
        c.positionAfter = int(j) + 1;
        if (ia == posA.end()) {
            c.kind = StepChange::Kind::Added;
            c.fields = compareFlat(Json::object(), stepJson(stepsB, j));
            d.steps.push_back(std::move(c));
            continue;
        }
        c.positionBefore = int(ia->second) + 1;
        c.moved = !kept.count(id);
        c.fields = compareFlat(stepJson(stepsA, ia->second), stepJson(stepsB, j));
        if (c.fields.empty() && !c.moved) continue;
        c.kind = c.fields.empty() ? StepChange::Kind::Moved : StepChange::Kind::Changed;
        d.steps.push_back(std::move(c));
    }
    for (std::size_t i = 0; i < idsA.size(); ++i) {
        if (posB.count(idsA[i])) continue;
        StepChange c;
        c.id = idsA[i];
        c.kind = StepChange::Kind::Removed;
        c.positionBefore = int(i) + 1;
        c.fields = compareFlat(stepJson(stepsA, i), Json::object());
        d.steps.push_back(std::move(c));
    }
    return d;
}

ProjectDiff diffProjects(const Project& before, const SequenceResult& ra, const Project& after,
                         const SequenceResult& rb) {
    ProjectDiff d = diffProjects(before, after);
    d.resultsCompared = true;
    auto fill = [](StepResultShift& s, const StepResult* r, bool isAfter) {
        if (!r || !r->computed) return;
        auto set = [&](Shift& sh, double v) { (isAfter ? sh.after : sh.before) = v; };
        set(s.Q, r->Q);
        set(s.W, r->W);
        set(s.Sgen, r->Sgen);
        set(s.endT, r->end.T);
    };
    std::set<std::string> seen;
    for (const auto& st : after.steps) {
        StepResultShift s;
        s.id = st.id;
        fill(s, findResult(ra, st.id), false);
        fill(s, findResult(rb, st.id), true);
        d.results.push_back(std::move(s));
        seen.insert(st.id);
    }
    for (const auto& st : before.steps) {
        if (seen.count(st.id)) continue;
        StepResultShift s;
        s.id = st.id;
        fill(s, findResult(ra, st.id), false);
        d.results.push_back(std::move(s));
    }
    auto tot = [](Shift& sh, const SequenceResult& r, double Totals::*m, bool isAfter) {
        if (r.startError) return;
        (isAfter ? sh.after : sh.before) = r.totals.*m;
    };
    for (bool isAfter : {false, true}) {
        const SequenceResult& r = isAfter ? rb : ra;
        tot(d.totals.Q, r, &Totals::Q, isAfter);
        tot(d.totals.W, r, &Totals::W, isAfter);
        tot(d.totals.Sgen, r, &Totals::Sgen, isAfter);
        tot(d.totals.exergyDestroyed, r, &Totals::exergyDestroyed, isAfter);
        tot(d.totals.heatingDuty, r, &Totals::heatingDuty, isAfter);
        tot(d.totals.coolingDuty, r, &Totals::coolingDuty, isAfter);
    }
    return d;
}

namespace {

const char* kindId(StepChange::Kind k) {
    switch (k) {
    case StepChange::Kind::Added: return "added";
    case StepChange::Kind::Removed: return "removed";
    case StepChange::Kind::Changed: return "changed";
    case StepChange::Kind::Moved: return "moved";
    }
    return "";
}

Json fieldsJson(const std::vector<FieldChange>& fs) {
    Json arr = Json::array();
    for (const auto& f : fs)
        arr.push_back({{"field", f.field},
                       {"before", f.presentBefore ? Json(f.before) : Json(nullptr)},
                       {"after", f.presentAfter ? Json(f.after) : Json(nullptr)}});
    return arr;
}

Json shiftJson(const Shift& s) {
    auto o = [](const std::optional<double>& v) { return v ? Json(*v) : Json(nullptr); };
    return {{"before", o(s.before)}, {"after", o(s.after)}, {"change", o(s.delta())}};
}

}  // namespace

Json projectDiffToJson(const ProjectDiff& d, const Project& after) {
    const bool closed = after.system == SystemKind::Closed;
    Json j = Json::object();
    j["identicalInput"] = d.identicalInput();
    j["project"] = fieldsJson(d.project);
    Json steps = Json::array();
    for (const auto& c : d.steps) {
        Json s = {{"id", c.id}, {"change", kindId(c.kind)}, {"moved", c.moved},
                  {"positionBefore", c.positionBefore ? Json(c.positionBefore) : Json(nullptr)},
                  {"positionAfter", c.positionAfter ? Json(c.positionAfter) : Json(nullptr)},
                  {"fields", fieldsJson(c.fields)}};
        steps.push_back(std::move(s));
    }
    j["steps"] = steps;
    if (d.resultsCompared) {
        j["units"] = {{"Q", closed ? "J" : "W"}, {"W", closed ? "J" : "W"},
                      {"Sgen", closed ? "J/K" : "W/K"}, {"endT", "K"}};
        Json res = Json::array();
        for (const auto& r : d.results)
            res.push_back({{"id", r.id}, {"Q", shiftJson(r.Q)}, {"W", shiftJson(r.W)},
                           {"Sgen", shiftJson(r.Sgen)}, {"endT_K", shiftJson(r.endT)},
                           {"moved", r.Q.changed() || r.W.changed() || r.Sgen.changed() || r.endT.changed()}});
        j["results"] = res;
        j["totals"] = {{"Q", shiftJson(d.totals.Q)}, {"W", shiftJson(d.totals.W)},
                       {"Sgen", shiftJson(d.totals.Sgen)},
                       {"exergyDestroyed", shiftJson(d.totals.exergyDestroyed)},
                       {"heatingDuty", shiftJson(d.totals.heatingDuty)},
                       {"coolingDuty", shiftJson(d.totals.coolingDuty)}};
    }
    return j;
}

std::string projectDiffText(const ProjectDiff& d, const Project& after) {
    std::ostringstream o;
    auto side = [](bool present, const std::string& v) { return present ? "\"" + v + "\"" : std::string("(absent)"); };
    auto fields = [&](const std::vector<FieldChange>& fs, const char* indent) {
        for (const auto& f : fs)
            o << indent << f.field << ": " << side(f.presentBefore, f.before) << " -> " << side(f.presentAfter, f.after) << "\n";
    };
    if (d.identicalInput()) o << "Inputs: identical.\n";
    if (!d.project.empty()) {
        o << "Project:\n";
        fields(d.project, "  ");
    }
    if (!d.steps.empty()) {
        o << "Steps:\n";
        for (const auto& c : d.steps) {
            o << "  " << c.id << ": " << kindId(c.kind);
            if (c.kind == StepChange::Kind::Added) o << " at " << c.positionAfter;
            else if (c.kind == StepChange::Kind::Removed) o << " from " << c.positionBefore;
            else if (c.moved) o << (c.kind == StepChange::Kind::Changed ? " and moved" : "") << " from " << c.positionBefore << " to " << c.positionAfter;
            o << "\n";
            if (c.kind == StepChange::Kind::Changed) fields(c.fields, "    ");
        }
    }
    if (!d.resultsCompared) return o.str();
    const UnitSystem us = after.displayUnits;
    const UnitContext ctx = after.unitContext();
    const bool closed = after.system == SystemKind::Closed;
    const Dimension E = closed ? Dimension::Energy : Dimension::Power;
    const Dimension S = closed ? Dimension::Entropy : Dimension::EntropyRate;
    auto q = [&](const std::optional<double>& v, Dimension dim) {
        return v ? formatQuantity(*v, dim, us, ctx) : std::string("–");
    };
    auto line = [&](const char* name, const Shift& s, Dimension dim, Dimension diffDim) {
        if (!s.changed(1e-9, 1e-6)) {
            o << "    " << name << ": " << q(s.after, dim) << " (unchanged)\n";
            return;
        }
        o << "    " << name << ": " << q(s.before, dim) << " -> " << q(s.after, dim);
        if (auto dl = s.delta()) o << " (change " << (*dl > 0 ? "+" : "") << formatQuantity(*dl, diffDim, us, ctx) << ")";
        o << "\n";
    };
    bool any = false;
    for (const auto& r : d.results) {
        if (!(r.Q.changed() || r.W.changed() || r.Sgen.changed() || r.endT.changed())) continue;
        if (!any) o << "Results that moved:\n";
        any = true;
        o << "  " << r.id << "\n";
        if (r.Q.changed()) line("Q", r.Q, E, E);
        if (r.W.changed()) line("W", r.W, E, E);
        if (r.Sgen.changed()) line("S_gen", r.Sgen, S, S);
        if (r.endT.changed()) line("end T", r.endT, Dimension::Temperature, Dimension::TemperatureDifference);
    }
    if (!any) o << "Results: no step result moved.\n";
    o << "Totals:\n";
    line("Q", d.totals.Q, E, E);
    line("W", d.totals.W, E, E);
    line("S_gen", d.totals.Sgen, S, S);
    line("exergy destroyed", d.totals.exergyDestroyed, E, E);
    line("heating duty", d.totals.heatingDuty, E, E);
    line("cooling duty", d.totals.coolingDuty, E, E);
    return o.str();
}

}  // namespace heatchain
