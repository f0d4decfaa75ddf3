// Process cautions; see cautions.hpp for the thresholds and their sources.
#include "heatchain/cautions.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

namespace heatchain {

ProcessCautions processCautions(const Project& project, const SequenceResult& r) {
    double Tmin = std::numeric_limits<double>::infinity();
    double Tmax = -std::numeric_limits<double>::infinity();
    double Pmax = 0;
    double sourceTmax = -std::numeric_limits<double>::infinity();
    double sinkTmax = -std::numeric_limits<double>::infinity();
    bool vapourOfWater = false;
    auto point = [&](double T, double P) {
        if (!std::isfinite(T)) return;
        Tmin = std::min(Tmin, T);
        Tmax = std::max(Tmax, T);
        if (std::isfinite(P)) Pmax = std::max(Pmax, P);
    };
    auto state = [&](const State& s) {
        point(s.T, s.P);
        // A saturated liquid (x = 0) holds no vapour yet.
        const bool vapour = s.phase == Phase::Vapor || s.phase == Phase::Supercritical ||
                            (s.phase == Phase::LiquidVapor && s.quality.value_or(1.0) > 0.0);
        if (std::isfinite(s.T) && project.substance.id == "water" && vapour) vapourOfWater = true;
    };
    if (!r.startError) state(r.start);
    for (const StepResult& st : r.steps) {
        if (!st.computed) continue;
        state(st.start);
        state(st.end);
        for (const SegmentResult& g : st.segments)
            for (const CurvePoint& c : g.curve) point(c.T, c.P);
        if (st.reservoirT) {
            double& hottest = st.Q < 0 ? sinkTmax : sourceTmax;  // a cooling step's reservoir is its sink
            hottest = std::max(hottest, *st.reservoirT);
        }
    }
    ProcessCautions c;
    if (Tmin < kCryogenicBelow_K) c.coldest_K = Tmin;
    if (Tmax > kHotAbove_K) c.hottest_K = Tmax;
    if (sourceTmax > kHotAbove_K) c.hottestSource_K = sourceTmax;
    if (sinkTmax > kHotAbove_K) c.hottestSink_K = sinkTmax;
    c.steam = vapourOfWater && c.hottest_K.has_value();
    if (Pmax - project.atmosphereOrDefault().si > kPressureAboveGauge_Pa) c.highestP_Pa = Pmax;
    return c;
}

std::string_view generalCaution() {
    return "Heatchain computes idealised process paths. Pressure equipment, steam, cryogens and hot surfaces are "
           "governed by local codes and licensed practice; have results checked by a qualified engineer.";
}

std::vector<std::string> processCautionSentences(const ProcessCautions& c, const QuantityWords& quantity) {
    auto T = [&](double K) { return quantity(K, Dimension::Temperature, false); };
    std::vector<std::string> lines;
    if (c.coldest_K)
        lines.push_back("Cryogenic temperatures: the material reaches " + T(*c.coldest_K) +
                        ". Cold burns and frostbite on contact, embrittlement of ordinary carbon steel, and pressure "
                        "rise when cold liquid is trapped and warms; boil-off can displace the oxygen of a room.");
    if (c.hottest_K || c.hottestSource_K || c.hottestSink_K) {
        std::string text = c.steam ? "Steam and hot surfaces" : "Hot surfaces";
        text += " above about 60 °C: ";
        std::string what;
        auto add = [&](const std::string& part) { what += (what.empty() ? "" : ", ") + part; };
        if (c.hottest_K) add("the material reaches " + T(*c.hottest_K));
        if (c.hottestSource_K) add("heat sources up to " + T(*c.hottestSource_K));
        if (c.hottestSink_K) add("sinks up to " + T(*c.hottestSink_K));
        text += what + ". Contact burns; insulate or guard surfaces people can touch";
        if (c.steam) text += ", and treat any steam release as a scalding hazard";
        text += '.';
        lines.push_back(std::move(text));
    }
    if (c.highestP_Pa)
        lines.push_back("High pressure: up to " + quantity(*c.highestP_Pa, Dimension::Pressure, false) + " (" +
                        quantity(*c.highestP_Pa, Dimension::Pressure, true) +
                        "). Above about 0.5 bar gauge pressure-equipment rules commonly apply to vessels and piping; "
                        "stored energy is released violently on failure. Relief, design pressure and inspection "
                        "follow the applicable code.");
    return lines;
}

}  // namespace heatchain
