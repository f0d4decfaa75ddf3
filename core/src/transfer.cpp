// Exchanger area of a steady-flow step, zone by zone along its T–Q curve,
// and the time of a batch step through its jacket or coil. The formulas and
// their sources are in transfer.hpp.
#include "heatchain/transfer.hpp"

#include <algorithm>
#include <cmath>
#include <string>

#include "heatchain/solver.hpp"

namespace heatchain {

namespace {

std::string singleZone(Phase p) {
    switch (p) {
        case Phase::Solid: return "solid";
        case Phase::Liquid: return "liquid";
        default: return "vapour";  // vapour and supercritical
    }
}

std::string lineZone(Phase p) {
    switch (p) {
        case Phase::SolidLiquid: return "solid-liquid";
        case Phase::SolidVapor: return "solid-vapour";
        default: return "two-phase";
    }
}

// The phase two different phase lines share (the span between them).
Phase between(Phase a, Phase b) {
    auto has = [&](Phase line, Phase single) {
        switch (line) {
            case Phase::SolidLiquid: return single == Phase::Solid || single == Phase::Liquid;
            case Phase::LiquidVapor: return single == Phase::Liquid || single == Phase::Vapor;
            case Phase::SolidVapor: return single == Phase::Solid || single == Phase::Vapor;
            default: return line == single;
        }
    };
    for (Phase p : {Phase::Solid, Phase::Liquid, Phase::Vapor})
        if (has(a, p) && has(b, p)) return p;
    return Phase::Vapor;
}

std::string inQuotes(std::string_view s) { return "\"" + std::string(s) + "\""; }

// The U of a zone, or an error naming the missing key.
Result<double> zoneU(const HeatTransferSpec& spec, const std::string& key, const std::string& label,
                     const std::string& where) {
    if (spec.U) return spec.U->si;
    for (const auto& [zone, q] : spec.zoneU)
        if (zone == key) return q.si;
    std::string given;
    for (const auto& [zone, q] : spec.zoneU) given += (given.empty() ? "" : ", ") + zone;
    return makeError("transfer.U gives no value for the " + inQuotes(key) + " zone (" + label +
                         "); this step has one; add " + inQuotes(key) + " to U (it gives " + given + ")",
                     where);
}

// Utility temperature at cumulative duty Q.
double sideT(const TransferSide& side, double Q) {
    if (!side.linear || side.Q1 == side.Q0) return side.T;
    const double f = std::clamp((Q - side.Q0) / (side.Q1 - side.Q0), 0.0, 1.0);
    return side.T0 + (side.T1 - side.T0) * f;
}

// The points a segment's area and time are summed over: its sampled curve.
std::vector<CurvePoint> pointsOf(const SegmentResult& g) { return g.curve; }

// Entropy change of a flowing sensible utility over one piece of a batch
// step, ∫ ṁ c_p g(T) dt with g = ln(T_out/T_in) and its outlet
// T_out = T_in − ε (T_in − T) following the material's T (the
// capacity-ratio-zero exchanger above). Over the piece T and the heat are
// linear in s ∈ [0, 1], and dt = ΔQ ds / q(T(s)), q = α − β T the net rate,
// which vanishes at T* = α/β. Taking g(T*) out,
//   ∫ g dt = g(T*) Δt + ΔQ ∫₀¹ (g(T) − g(T*)) / q(T) ds,
// leaves a smooth integrand even where the piece ends close to T*, and
// five-point Gauss–Legendre quadrature is exact to round-off on it (nodes
// and weights: Abramowitz & Stegun, Handbook of Mathematical Functions,
// table 25.4).
double flowingUtilityEntropy(const TransferSide& side, double eff, double alpha, double beta, double T1, double T2,
                             double dQ, double dt) {
    static constexpr double kNode[5] = {0.0, 0.5384693101056831, -0.5384693101056831, 0.9061798459386640,
                                        -0.9061798459386640};
    static constexpr double kWeight[5] = {0.5688888888888889, 0.4786286704993665, 0.4786286704993665,
                                          0.2369268850561891, 0.2369268850561891};
    if (!(beta > 0) || eff == 0) return 0.0;  // no exchange: the utility passes unchanged
    auto g = [&](double T) { return std::log((side.T - eff * (side.T - T)) / side.T); };
    const double Tsettle = alpha / beta, gSettle = g(Tsettle);
    double sum = 0;
    for (int k = 0; k < 5; ++k) {
        const double T = T1 + (T2 - T1) * 0.5 * (1.0 + kNode[k]);
        sum += kWeight[k] * 0.5 * (g(T) - gSettle) / (alpha - beta * T);
    }
    return side.flowCp * (gSettle * dt + dQ * sum);
}

}  // namespace

std::string zoneKeyOf(Phase start, Phase end) {
    const bool a = isTwoPhase(start), b = isTwoPhase(end);
    if (a && b) return start == end ? lineZone(start) : singleZone(between(start, end));
    if (a) return singleZone(end);
    return singleZone(start);
}

double logMeanTemperatureDifference(double dT1, double dT2) {
    if (!(dT1 > 0) || !(dT2 > 0)) return 0.0;
    const double r = dT2 / dT1 - 1.0;
    // Near equal ends the quotient loses digits: ΔT_lm = ΔT1 · r / ln(1 + r),
    // with r / ln(1 + r) = 1 + r/2 − r²/12 + r³/24 − … (series of the logarithm).
    if (std::fabs(r) < 1e-4) return dT1 * (1.0 + r / 2.0 - r * r / 12.0 + r * r * r / 24.0);
    return (dT2 - dT1) / std::log(dT2 / dT1);
}

Result<StepTransfer> sizeStep(const HeatTransferSpec& spec, const StepResult& step, const TransferSide& side,
                              const std::string& where) {
    StepTransfer t;
    const bool heating = step.Q > 0;
    const bool uaOnly = spec.UA && !spec.U && spec.zoneU.empty();
    for (const SegmentResult& g : step.segments) {
        if (g.Q == 0) continue;
        TransferZone z;
        z.label = g.label;
        z.key = zoneKeyOf(g.start.phase, g.end.phase);
        z.Q = g.Q;
        double U = 1.0;  // UA only: the sum below is then the UA needed
        if (!uaOnly) {
            auto u = zoneU(spec, z.key, g.label, where);
            if (!u) return u.error();
            U = *u;
        }
        const std::vector<CurvePoint> pts = pointsOf(g);
        double area = 0;
        for (std::size_t i = 0; i + 1 < pts.size(); ++i) {
            const double dQ = pts[i + 1].Q - pts[i].Q;
            if (dQ == 0) continue;
            const double Tu1 = sideT(side, pts[i].Q), Tu2 = sideT(side, pts[i + 1].Q);
            const double d1 = heating ? Tu1 - pts[i].T : pts[i].T - Tu1;
            const double d2 = heating ? Tu2 - pts[i + 1].T : pts[i + 1].T - Tu2;
            const double lm = logMeanTemperatureDifference(d1, d2);
            if (!(lm > 0)) {
                const bool atStart = !(d1 > 0);
                const double Tm = atStart ? pts[i].T : pts[i + 1].T;
                const double Tu = atStart ? Tu1 : Tu2;
                char buf[160];
                std::snprintf(buf, sizeof buf, "%.6g K against the utility's %.6g K", Tm, Tu);
                return makeError("no finite exchanger reaches this end state: in the " + g.label +
                                     " zone the temperature difference falls to zero (material at " + buf +
                                     "); aim short of the utility's temperature",
                                 where);
            }
            area += std::fabs(dQ) / (U * lm);
        }
        z.area = uaOnly ? 0.0 : area;
        z.U = uaOnly ? 0.0 : U;
        z.LMTD = area > 0 ? std::fabs(g.Q) / (U * area) : 0.0;
        t.UA += U * area;
        if (!uaOnly) t.area = t.area.value_or(0.0) + area;
        t.zones.push_back(std::move(z));
    }
    if (!uaOnly && !t.area) t.area = 0.0;
    t.meanDeltaT = t.UA > 0 ? std::fabs(step.Q) / t.UA : 0.0;
    return t;
}

Result<StepBatch> batchTime(const HeatTransferSpec& spec, const StepResult& step, const TransferSide& side,
                            double lossUA, double T0, const std::string& where, StepTransfer* transfer) {
    StepBatch b;
    StepTransfer tv;
    double uaTime = 0;  // ∫ UA dt, for the time-weighted UA
    bool started = false;
    for (const SegmentResult& g : step.segments) {
        const std::string key = zoneKeyOf(g.start.phase, g.end.phase);
        double UA = 0, U = 0;
        if (spec.UA) {
            UA = spec.UA->si;
        } else {
            auto u = zoneU(spec, key, g.label, where);
            if (!u) return u.error();
            U = *u;
            UA = U * (spec.area ? spec.area->si : 0.0);
        }
        // Heat rate into the material through the surface, less the loss,
        // as α − β T (both rates are linear in the material's T).
        double alpha = 0, beta = 0, eff = 1.0;
        if (side.constantTemperature) {
            alpha = UA * side.T;
            beta = UA;
        } else {
            eff = 1.0 - std::exp(-UA / side.flowCp);
            alpha = side.flowCp * eff * side.T;
            beta = side.flowCp * eff;
        }
        const double UAsurface = UA;  // W/K of the jacket or coil
        alpha += lossUA * T0;
        beta += lossUA;
        auto net = [&](double T) { return alpha - beta * T; };
        auto utilityRate = [&](double T) { return net(T) + lossUA * (T - T0); };
        const std::vector<CurvePoint> pts = pointsOf(g);
        double zoneTime = 0, zoneHeat = 0;
        for (std::size_t i = 0; i < pts.size(); ++i) {
            if (!started) {
                b.profile.push_back({0.0, pts[i].T, utilityRate(pts[i].T),
                                     side.constantTemperature ? side.T : side.T - utilityRate(pts[i].T) / side.flowCp});
                b.peakDuty = std::fabs(utilityRate(pts[i].T));
                started = true;
            }
            if (i + 1 >= pts.size()) break;
            const double dQ = pts[i + 1].Q - pts[i].Q;
            if (dQ == 0) continue;
            const double q1 = net(pts[i].T), q2 = net(pts[i + 1].T);
            // The net rate must push the material the way the step goes, all along.
            if (!(q1 / dQ > 0) || !(q2 / dQ > 0)) {
                const double Tstop = std::fabs(beta) > 0 ? alpha / beta : pts[i].T;
                char buf[200];
                std::snprintf(buf, sizeof buf, "%.6g K", Tstop);
                return makeError(std::string("the batch never gets there: through this surface the material settles at ") +
                                     buf + (lossUA > 0 ? " (where the utility's heat balances the loss to the surroundings)"
                                                       : " (the utility's temperature)") +
                                     ", short of the step's end in the " + g.label + " zone",
                                 where);
            }
            double dt = 0;
            const double r = (q2 - q1) / q1;
            if (std::fabs(r) < 1e-6)
                dt = dQ / q1 * (1.0 - r / 2.0 + r * r / 3.0);  // ln(1 + r)/r, series
            else
                dt = dQ * std::log(q2 / q1) / (q2 - q1);
            // Heat lost over the piece: the loss λ(T − T0) is K − (λ/β) q in
            // terms of the net rate q, so ∫ loss dt = K Δt − (λ/β) ΔQ.
            const double lost = beta > 0 ? (lossUA * alpha / beta - lossUA * T0) * dt - (lossUA / beta) * dQ
                                         : lossUA * (pts[i].T - T0) * dt;
            if (pts[i + 1].T != pts[i].T) b.timeConstants += std::log(q1 / q2);
            if (!side.constantTemperature)
                b.utilityEntropy += flowingUtilityEntropy(side, eff, alpha, beta, pts[i].T, pts[i + 1].T, dQ, dt);
            b.duration += dt;
            b.heatLost += lost;
            b.utilityHeat += dQ + lost;
            zoneTime += dt;
            zoneHeat += dQ + lost;
            uaTime += UAsurface * dt;
            const double rate = utilityRate(pts[i + 1].T);
            b.peakDuty = std::max(b.peakDuty, std::fabs(rate));
            b.profile.push_back({b.duration, pts[i + 1].T, rate,
                                 side.constantTemperature ? side.T : side.T - rate / side.flowCp});
        }
        if (g.Q != 0) {
            // The zone's mean temperature difference over its time.
            TransferZone z;
            z.label = g.label;
            z.key = key;
            z.Q = g.Q;
            z.U = U;
            z.area = spec.area ? spec.area->si : 0.0;
            z.LMTD = zoneTime > 0 && UAsurface > 0 ? std::fabs(zoneHeat) / (UAsurface * zoneTime) : 0.0;
            tv.zones.push_back(std::move(z));
        }
    }
    b.meanDuty = b.duration > 0 ? std::fabs(b.utilityHeat) / b.duration : 0.0;
    if (transfer) {
        tv.UA = b.duration > 0 ? uaTime / b.duration : 0.0;
        if (spec.area) tv.area = spec.area->si;
        tv.meanDeltaT = tv.UA > 0 ? b.meanDuty / tv.UA : 0.0;
        *transfer = std::move(tv);
    }
    return b;
}

StepBatch holdBatch(double duration, double T, double lossUA, double T0, double Tutility) {
    StepBatch b;
    const double rate = lossUA * (T - T0);  // what the utility makes up
    b.duration = duration;
    b.utilityHeat = rate * duration;
    b.heatLost = rate * duration;
    b.peakDuty = std::fabs(rate);
    b.meanDuty = std::fabs(rate);
    b.profile = {{0.0, T, rate, Tutility}, {duration, T, rate, Tutility}};
    return b;
}

}  // namespace heatchain
