#include "ledger_text.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <sstream>
#include <vector>

#include "heatchain/units.hpp"

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
        t.rows.push_back({s.id, std::string(stepKindId(s.kind)), fixed(T(s.end.T), 2), fixed(P(s.end.P), 4),
                          phaseText(s.end), fixed(E(s.Q), dE_), fixed(E(s.W), dE_), fixed(E(s.dH), dE_),
                          fixed(S(s.dS), dS_), fixed(S(s.Sgen), dS_), fixed(E(s.exergyDestroyed), dE_)});
        if (s.segments.size() > 1)
            for (const auto& g : s.segments)
                t.rows.push_back({"", "  " + g.label, fixed(T(g.end.T), 2), fixed(P(g.end.P), 4), phaseText(g.end),
                                  fixed(E(g.Q), dE_)});
    }
    const auto& tt = r.totals;
    t.rows.push_back({"total", "", "", "", "", fixed(E(tt.Q), dE_), fixed(E(tt.W), dE_), fixed(E(tt.dH), dE_),
                      fixed(S(tt.dS), dS_), fixed(S(tt.Sgen), dS_), fixed(E(tt.exergyDestroyed), dE_)});
    o << t.render();
    o << "heating duty " << fixed(E(tt.heatingDuty), dE_) << " " << uE << ", cooling duty "
      << fixed(E(tt.coolingDuty), dE_) << " " << uE << "\n";

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
    o << "\nIdealised process paths. Pressure equipment, steam, cryogens and hot surfaces are governed by\n"
         "local codes and licensed practice; have results checked by a qualified engineer.\n";
    return o.str();
}

}  // namespace heatchain::cli
