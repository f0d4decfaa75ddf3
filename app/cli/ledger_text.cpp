#include "ledger_text.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <sstream>
#include <vector>

#include "heatchain/cautions.hpp"
#include "heatchain/rules.hpp"
#include "heatchain/units.hpp"
#include "transfer_text.hpp"

namespace heatchain::cli {

namespace {

std::string fixed(double v, int decimals) {
    if (!std::isfinite(v)) return "–";
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
    std::string s = buf;
    if (s == "-0" || s.rfind("-0.", 0) == 0) {
        bool allZero = std::all_of(s.begin() + 1, s.end(), [](char c) { return c == '0' || c == '.'; });
        if (allZero) s.erase(0, 1);
    }
    return s;
}

// Decimals that keep about five significant figures for the column's scale.
int decimalsFor(double maxAbs) {
    if (!(maxAbs > 0)) return 2;
    const int mag = int(std::floor(std::log10(maxAbs)));
    return std::clamp(4 - mag, 0, 6);
}

std::string phaseText(const State& s) {
    std::string p(phaseLabel(s.phase));
    if (s.quality && s.phase == Phase::LiquidVapor) p = "x=" + fixed(*s.quality, 3);
    if (s.quality && s.phase == Phase::SolidVapor) p = "sub x=" + fixed(*s.quality, 3);
    if (s.meltFraction) p = "melt " + fixed(*s.meltFraction, 3);
    return p;
}

struct Table {
    std::vector<std::string> head;
    std::vector<bool> rightAlign;
    std::vector<std::vector<std::string>> rows;
    std::string render() const {
        std::vector<std::size_t> w(head.size());
        auto width = [](const std::string& s) {
            // Count code points, not bytes, so "°C" and "Δ" line up.
            std::size_t n = 0;
            for (unsigned char c : s) if ((c & 0xC0) != 0x80) ++n;
            return n;
        };
        for (std::size_t i = 0; i < head.size(); ++i) w[i] = width(head[i]);
        for (const auto& r : rows)
            for (std::size_t i = 0; i < r.size() && i < w.size(); ++i) w[i] = std::max(w[i], width(r[i]));
        std::ostringstream o;
        auto line = [&](const std::vector<std::string>& r) {
            for (std::size_t i = 0; i < head.size(); ++i) {
                const std::string cell = i < r.size() ? r[i] : "";
                const std::size_t pad = w[i] - width(cell);
                if (i) o << "  ";
                if (rightAlign[i]) o << std::string(pad, ' ') << cell;
                else o << cell << (i + 1 < head.size() ? std::string(pad, ' ') : "");
            }
            o << "\n";
        };
        line(head);
        std::size_t total = 0;
        for (auto x : w) total += x + 2;
        o << std::string(total > 2 ? total - 2 : 0, '-') << "\n";
        for (const auto& r : rows) line(r);
        return o.str();
    }
};

// Display helpers shared by the utility and exergy sections.
struct Display {
    UnitSystem us;
    UnitContext ctx;
    bool closed;
    std::string text(double si, Dimension d, int decimals) const {
        return fixed(toDisplay(si, d, us, ctx), decimals) + " " + unitLabel(displayUnit(d, us, ctx));
    }
    std::string T(double K) const { return text(K, Dimension::Temperature, 1); }
    std::string E(double v) const {
        const Dimension d = closed ? Dimension::Energy : Dimension::Power;
        return fixed(toDisplay(v, d, us, ctx), decimalsFor(std::fabs(toDisplay(v, d, us, ctx)))) + " " +
               unitLabel(displayUnit(d, us));
    }
    std::string mass(double v) const {
        const Dimension d = closed ? Dimension::Mass : Dimension::MassFlow;
        const double x = toDisplay(v, d, us, ctx);
        return fixed(x, decimalsFor(std::fabs(x))) + " " + unitLabel(displayUnit(d, us));
    }
    std::string volume(double v) const {
        const Dimension d = closed ? Dimension::Volume : Dimension::VolumeFlow;
        const double x = toDisplay(v, d, us, ctx);
        return fixed(x, decimalsFor(std::fabs(x))) + " " + unitLabel(displayUnit(d, us));
    }
};

// Utilities: each served step (approach temperature and use), then the total
// per utility.
std::string utilitiesText(const Project& p, const SequenceResult& r) {
    if (r.utilities.empty()) return "";
    const Display d{p.displayUnits, p.unitContext(), p.system == SystemKind::Closed};
    std::ostringstream o;
    o << "\nutilities (minimum approach " << fixed(p.minApproachK(), 1)
      << " K; sensible utilities counter-current; exergy given = Q (1 − T0/T_utility)):\n";
    for (const auto& u : r.utilities) {
        o << "  " << u.id << ": ";
        if (!u.profile) {
            o << "ERROR " << (u.error ? u.error->text() : std::string("not resolved")) << "\n";
            continue;
        }
        const UtilityProfile& f = *u.profile;
        switch (u.kind) {
            case UtilityKind::Steam:
                o << "steam at " << d.text(f.P, Dimension::Pressure, 3) << ", condensing at " << d.T(f.Tin)
                  << ", latent heat " << d.text(f.latentHeat, Dimension::SpecificEnergy, 1);
                break;
            case UtilityKind::Sensible:
                o << "sensible, " << d.T(f.Tin) << " in, " << d.T(f.Tout) << " out, mean " << d.T(f.Tmean);
                break;
            case UtilityKind::Fixed: o << "fixed at " << d.T(f.Tin); break;
        }
        o << "\n";
    }
    Table t;
    t.head = {"step", "utility", "role", "duty", "use", "exergy given", "min approach", "where"};
    t.rightAlign = {false, false, false, true, true, true, true, false};
    auto exergy = [&](double v) { return r.exergyAvailable ? d.E(v) : std::string("–"); };
    for (std::size_t i = 0; i < r.steps.size(); ++i) {
        const auto& s = r.steps[i];
        if (!s.computed || !s.utility) continue;
        const StepUtility& u = *s.utility;
        std::string use = u.kind == UtilityKind::Fixed ? "–" : d.mass(u.mass);
        if (u.volume) use += " (" + d.volume(*u.volume) + ")";
        std::string where = u.position + " of " + (u.segment < s.segments.size() ? s.segments[u.segment].label : "");
        if (u.position != "start" || u.segment != 0) where += ", after " + d.E(u.approachDuty);
        std::string approach = fixed(u.minApproach, 1) + " K";
        if (approachBelowRequired(u, p.minApproachK())) approach += " (!)";
        t.rows.push_back({s.id, u.id, u.asSource ? "source" : "sink", d.E(u.duty), use, exergy(s.exergyHeat), approach, where});
    }
    for (const auto& u : r.utilities) {
        if (!u.steps) continue;
        std::string use = u.kind == UtilityKind::Fixed ? "–" : d.mass(u.mass);
        if (u.volume) use += " (" + d.volume(*u.volume) + ")";
        const double duty = u.heatSupplied + u.heatAbsorbed;
        t.rows.push_back({"total", u.id, u.heatAbsorbed > 0 && u.heatSupplied > 0 ? "both" : (u.heatSupplied > 0 ? "source" : "sink"),
                          d.E(duty), use, exergy(u.exergyGivenUp), "", std::to_string(u.steps) + " step" + (u.steps == 1 ? "" : "s")});
    }
    if (!t.rows.empty()) o << t.render();
    return o.str();
}

// Exergy: per step and for the sequence (definitions in core/src/solver.cpp).
std::string exergyText(const Project& p, const SequenceResult& r) {
    if (!r.exergyAvailable) return "";
    const Display d{p.displayUnits, p.unitContext(), p.system == SystemKind::Closed};
    std::ostringstream o;
    o << "\nexergy (dead state " << d.T(r.T0) << ", " << d.text(r.P0, Dimension::Pressure, 4)
      << "; η_II = 1 − destroyed / supplied):\n";
    Table t;
    t.head = {"step", "ΔEx", "Ex of heat", "useful W", "supplied", "destroyed", "share", "η_II"};
    t.rightAlign = {false, true, true, true, true, true, true, true};
    auto pct = [](std::optional<double> v) { return v ? fixed(100 * *v, 1) + " %" : std::string("–"); };
    for (const auto& s : r.steps) {
        if (!s.computed) continue;
        if (s.exergyNotCharged) {
            t.rows.push_back({s.id, d.E(s.dEx), d.E(s.exergyHeat), d.E(s.usefulWork), d.E(s.exergySupplied),
                              *s.exergyNotCharged, "–", "–"});
            continue;
        }
        t.rows.push_back({s.id, d.E(s.dEx), d.E(s.exergyHeat), d.E(s.usefulWork), d.E(s.exergySupplied),
                          d.E(s.exergyDestroyed), pct(s.exergyDestroyedShare), pct(s.secondLawEfficiency)});
    }
    const auto& tt = r.totals;
    t.rows.push_back({"sequence", d.E(tt.dEx), d.E(tt.exergyHeatIn - tt.exergyHeatOut), d.E(tt.workIn - tt.workOut),
                      d.E(tt.exergySupplied), d.E(tt.exergyDestroyed), tt.exergyDestroyed > 0 ? "100.0 %" : "–",
                      pct(tt.secondLawEfficiency)});
    o << t.render();
    return o.str();
}

}  // namespace

std::string ledgerText(const Project& p, const SequenceResult& r) {
    const UnitSystem us = p.displayUnits;
    const UnitContext ctx = p.unitContext();
    const bool closed = p.system == SystemKind::Closed;
    const Dimension dE = closed ? Dimension::Energy : Dimension::Power;
    const Dimension dS = closed ? Dimension::Entropy : Dimension::EntropyRate;
    const std::string uT = unitLabel(displayUnit(Dimension::Temperature, us));
    const std::string uP = unitLabel(displayUnit(Dimension::Pressure, us));
    const std::string uE = unitLabel(displayUnit(dE, us)), uS = unitLabel(displayUnit(dS, us));
    auto T = [&](double v) { return toDisplay(v, Dimension::Temperature, us, ctx); };
    auto P = [&](double v) { return toDisplay(v, Dimension::Pressure, us, ctx); };
    auto E = [&](double v) { return toDisplay(v, dE, us, ctx); };
    auto S = [&](double v) { return toDisplay(v, dS, us, ctx); };

    std::ostringstream o;
    o << (p.meta.title.empty() ? std::string("(untitled worksheet)") : p.meta.title);
    if (!p.meta.revision.empty()) o << "  rev " << p.meta.revision;
    o << "\n";
    o << p.substance.name << " · " << (r.model ? std::string(r.model->name()) : std::string(modelId(p.model))) << " · "
      << systemId(p.system) << " · basis " << p.basis.amount.text << "\n";
    if (r.startError) {
        o << "start: cannot be computed: " << r.startError->text() << "\n";
        return o.str();
    }
    o << "start: " << fixed(T(r.start.T), 2) << " " << uT << ", " << fixed(P(r.start.P), 4) << " " << uP << ", "
      << phaseText(r.start) << "\n\n";

    double mxE = 0, mxS = 0;
    for (const auto& s : r.steps)
        if (s.computed) {
            mxE = std::max({mxE, std::fabs(E(s.Q)), std::fabs(E(s.W)), std::fabs(E(s.dH)), std::fabs(E(s.exergyDestroyed))});
            mxS = std::max({mxS, std::fabs(S(s.dS)), std::fabs(S(s.Sgen))});
        }
    const int dE_ = decimalsFor(mxE), dS_ = decimalsFor(mxS);

    Table t;
    t.head = {"step", "kind", "T end [" + uT + "]", "P end [" + uP + "]", "phase", "Q [" + uE + "]",
              "W [" + uE + "]", "ΔH [" + uE + "]", "ΔS [" + uS + "]", "S_gen [" + uS + "]",
              "Ex.destroyed [" + uE + "]"};
    t.rightAlign = {false, false, true, true, false, true, true, true, true, true, true};
    for (const auto& s : r.steps) {
        if (!s.computed) {
            t.rows.push_back({s.id, std::string(stepKindId(s.kind)), "–", "–", s.error ? "ERROR" : "not computed"});
            continue;
        }
        // Round-off shows as zero by core's rule, judged within the step.
        const double eS = energyScale(s), sS = entropyScale(s);
        auto e = [&](double v) { return fixed(E(forDisplay(v, eS)), dE_); };
        auto en = [&](double v) { return fixed(S(forDisplay(v, sS)), dS_); };
        t.rows.push_back({s.id, std::string(stepKindId(s.kind)), fixed(T(s.end.T), 2), fixed(P(s.end.P), 4),
                          phaseText(s.end), e(s.Q), e(s.W), e(s.dH), en(s.dS), en(s.Sgen),
                          s.exergyNotCharged ? std::string("–") : e(s.exergyDestroyed)});
        if (s.segments.size() > 1)
            for (const auto& g : s.segments)
                t.rows.push_back({"", "  " + g.label, fixed(T(g.end.T), 2), fixed(P(g.end.P), 4), phaseText(g.end),
                                  e(g.Q)});
    }
    const auto& tt = r.totals;
    const double eT = energyScale(tt), sT = entropyScale(tt);
    auto te = [&](double v) { return fixed(E(forDisplay(v, eT)), dE_); };
    auto ts = [&](double v) { return fixed(S(forDisplay(v, sT)), dS_); };
    t.rows.push_back({tt.complete ? "total" : "total (incomplete)", "", "", "", "", te(tt.Q), te(tt.W), te(tt.dH),
                      ts(tt.dS), ts(tt.Sgen), te(tt.exergyDestroyed)});
    o << t.render();
    if (!tt.complete) {
        const auto done = std::count_if(r.steps.begin(), r.steps.end(), [](const StepResult& s) { return s.computed; });
        o << "totals are incomplete: they add only the " << done << " computed step" << (done == 1 ? "" : "s")
          << " of " << r.steps.size() << "\n";
    }
    o << "heating duty " << fixed(E(tt.heatingDuty), dE_) << " " << uE << ", cooling duty "
      << fixed(E(tt.coolingDuty), dE_) << " " << uE << "\n";

    o << utilitiesText(p, r);
    o << transferText(p, r);
    o << exergyText(p, r);

    // Errors and warnings first, notes apart: the levels core gave them.
    bool any = false;
    for (const auto& s : r.steps) {
        for (const auto& w : s.warnings) {
            if (!any) { o << "\nwarnings:\n"; any = true; }
            o << "  " << s.id << ": " << w << "\n";
        }
        if (s.error) {
            if (!any) { o << "\nwarnings:\n"; any = true; }
            o << "  ERROR " << s.error->text() << "\n";
        }
    }
    for (const auto& w : r.warnings) {
        if (!any) { o << "\nwarnings:\n"; any = true; }
        o << "  " << w << "\n";
    }
    bool anyNote = false;
    for (const auto& s : r.steps)
        for (const auto& n : s.notes) {
            if (!anyNote) { o << "\nnotes:\n"; anyNote = true; }
            o << "  " << s.id << ": " << n << "\n";
        }
    for (const auto& n : r.notes) {
        if (!anyNote) { o << "\nnotes:\n"; anyNote = true; }
        o << "  " << n << "\n";
    }
    // The cautions, each wrapped at about 100 columns: the standing one, the
    // substance's hazards, then what the process reaches (core's words).
    auto wrapped = [&](const std::string& text) {
        std::string line;
        std::istringstream words(text);
        std::string w;
        while (words >> w) {
            if (!line.empty() && line.size() + 1 + w.size() > 100) {
                o << line << "\n";
                line.clear();
            }
            line += (line.empty() ? "" : " ") + w;
        }
        o << line << "\n";
    };
    o << "\n";
    wrapped(std::string(generalCaution()));
    if (const std::string hz = hazardSentence(p.substance); !hz.empty()) wrapped("Caution - " + hz);
    const Display d{p.displayUnits, p.unitContext(), p.system == SystemKind::Closed};
    for (const std::string& c : processCautionSentences(processCautions(p, r), [&](double si, Dimension dim, bool gauge) {
             Display shown = d;
             if (dim == Dimension::Pressure) shown.ctx.gaugeDisplay = gauge;
             return shown.text(si, dim, dim == Dimension::Pressure ? 3 : 1);
         }))
        wrapped("Caution - " + c);
    return o.str();
}

std::string sweepText(const Project& p, const SweepResult& r) {
    const UnitSystem us = p.displayUnits;
    const UnitContext ctx = p.unitContext();
    auto unitOf = [&](Dimension d) {
        return d == Dimension::Dimensionless ? std::string() : " [" + unitLabel(displayUnit(d, us)) + "]";
    };
    std::ostringstream o;
    o << (p.meta.title.empty() ? std::string("(untitled worksheet)") : p.meta.title) << "\n";
    o << "sweep of " << (r.spec.step == "start" ? std::string("the start state") : "step \"" + r.spec.step + "\"")
      << ", " << r.spec.input << " from " << r.spec.from << " to " << r.spec.to << ", " << r.points.size()
      << " points (" << r.computed() << " computed)\n\n";
    Table t;
    t.head.push_back(r.spec.input + unitOf(r.inputDimension));
    t.rightAlign.push_back(true);
    for (const auto& out : r.outputs) {
        t.head.push_back(out.label + unitOf(out.dimension));
        t.rightAlign.push_back(true);
    }
    std::vector<double> mx(r.outputs.size() + 1, 0.0);
    for (const auto& pt : r.points) {
        mx[0] = std::max(mx[0], std::fabs(toDisplay(pt.x, r.inputDimension, us, ctx)));
        for (std::size_t i = 0; i < pt.values.size(); ++i)
            if (pt.values[i]) mx[i + 1] = std::max(mx[i + 1], std::fabs(toDisplay(*pt.values[i], r.outputs[i].dimension, us, ctx)));
    }
    for (const auto& pt : r.points) {
        std::vector<std::string> row{fixed(toDisplay(pt.x, r.inputDimension, us, ctx), decimalsFor(mx[0]))};
        if (pt.error) {
            row.push_back("ERROR (below)");
        } else {
            for (std::size_t i = 0; i < pt.values.size(); ++i)
                row.push_back(pt.values[i] ? fixed(toDisplay(*pt.values[i], r.outputs[i].dimension, us, ctx),
                                                   decimalsFor(mx[i + 1]))
                                           : "–");
        }
        t.rows.push_back(std::move(row));
    }
    o << t.render();
    bool any = false;
    for (const auto& pt : r.points) {
        if (!pt.error) continue;
        if (!any) { o << "\npoints not computed:\n"; any = true; }
        o << "  " << r.spec.input << " = " << fixed(toDisplay(pt.x, r.inputDimension, us, ctx), decimalsFor(mx[0]))
          << (r.inputDimension == Dimension::Dimensionless ? "" : " " + unitLabel(displayUnit(r.inputDimension, us)))
          << ": " << pt.error->text() << "\n";
    }
    return o.str();
}

}  // namespace heatchain::cli
