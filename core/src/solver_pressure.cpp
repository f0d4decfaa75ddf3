// Pressure steps: compress and expand (isentropic, adiabatic with an
// isentropic efficiency, isothermal, polytropic) and throttle (constant
// enthalpy), each one segment.
#include <algorithm>
#include <cmath>
#include <string>

#include "heatchain/rules.hpp"
#include "solver_internal.hpp"

namespace heatchain::solver_detail {

Result<Outcome> pressureChange(const Ctx& c, const Step& step, std::size_t idx, const State& a, double Qcum) {
    const bool compress = step.kind == StepKind::Compress;
    const bool throttle = step.kind == StepKind::Throttle;
    double P2 = 0;
    if (step.to.P) {
        P2 = step.to.P->si;
    } else if (step.to.ratio && !throttle) {
        const double r = step.to.ratio->value;
        if (auto problem = checkBounded(BoundedField::Ratio, r)) return stepError(step, idx, *problem);
        P2 = compress ? a.P * r : a.P / r;
    } else {
        return stepError(step, idx, std::string(stepKindId(step.kind)) +
                                        (throttle ? " step needs to.P" : " step needs to.P or to.ratio"));
    }
    if (throttle && c.closed)
        return stepError(step, idx, "throttling is a flow process; it needs a steady-flow system");
    if (std::fabs(P2 - a.P) <= 1e-12 * a.P)
        return nullStep(c, a, Qcum, "the target " + c.P(P2) + " is the pressure the material is already at");
    if (compress && !(P2 > a.P))
        return stepError(step, idx, "compressing to " + c.P(P2) + " would lower the pressure (it starts at " + c.P(a.P) + "); use an expand step");
    if (!compress && !(P2 < a.P))
        return stepError(step, idx, std::string(throttle ? "throttling" : "expanding") + " to " + c.P(P2) +
                                        " would raise the pressure (it starts at " + c.P(a.P) + ")");
    Outcome o;
    const int n = std::max(2, c.points);
    auto Pk = [&](int k) { return a.P * std::pow(P2 / a.P, double(k) / (n - 1)); };
    SegmentResult seg;
    seg.start = a;

    if (throttle) {
        auto end = c.model.statePH(P2, a.h);
        if (!end) return stepError(step, idx, end.error().message);
        o.end = *end;
        // The state was solved for h = h1; the solver's last-digit residual
        // (1e-15 relative) is not a result and would show as ΔH 7e-15 kW.
        o.end.h = a.h;
        o.adiabatic = true;
        seg.label = "throttling (constant enthalpy)";
        if (c.points > 0)
            for (int k = 0; k < n; ++k) {
                auto s = k == 0 ? Result<State>(a) : (k == n - 1 ? Result<State>(o.end) : c.model.statePH(Pk(k), a.h));
                if (s) seg.curve.push_back({s->T, s->s, Qcum, s->P, s->h});
            }
        const double dT = o.end.T - a.T;
        if (std::fabs(dT) > 1e-3)
            o.notes.push_back(std::string("Joule–Thomson effect: the temperature ") + (dT < 0 ? "falls" : "rises") +
                              " by " + c.dT(std::fabs(dT), 3));
    } else {
        const PathKind path = step.path ? *step.path : (step.efficiency ? PathKind::Adiabatic : PathKind::Isentropic);
        const std::string what = compress ? "compression" : "expansion";
        const Property energy = c.closed ? Property::InternalEnergy : Property::Enthalpy;
        auto E = [&](const State& s) { return c.closed ? s.u : s.h; };
        switch (path) {
            case PathKind::Isentropic:
            case PathKind::Adiabatic: {
                const double eta = path == PathKind::Adiabatic ? (step.efficiency ? step.efficiency->value : 1.0) : 1.0;
                if (auto problem = checkBounded(BoundedField::Efficiency, eta)) return stepError(step, idx, *problem);
                auto endAt = [&](double P) -> Result<State> {
                    auto s = c.model.statePS(P, a.s);
                    if (!s || eta == 1.0) return s;
                    const double e = compress ? E(a) + (E(*s) - E(a)) / eta : E(a) - eta * (E(a) - E(*s));
                    return c.model.stateP(P, energy, e);
                };
                auto end = endAt(P2);
                if (!end) return stepError(step, idx, end.error().message);
                o.end = *end;
                o.adiabatic = true;
                seg.label = eta == 1.0 ? "isentropic " + what
                                       : "adiabatic " + what + " (η = " + num(eta, 3) + ")";
                // The drawn path between the ends: entropy generated evenly
                // per logarithmic pressure step, s linear in ln P. That is the
                // path of constant polytropic efficiency for an ideal gas of
                // constant cp, and it never lowers s (adiabatic, S_gen >= 0).
                // One (P, s) inversion per point; the path at eta = 1 is the
                // isentrope itself.
                if (c.points > 0) {
                    const double lnRatio = std::log(P2 / a.P);
                    for (int k = 0; k < n; ++k) {
                        Result<State> s = a;
                        if (k == n - 1) {
                            s = o.end;
                        } else if (k > 0) {
                            const double P = Pk(k);
                            s = c.model.statePS(P, a.s + (o.end.s - a.s) * std::log(P / a.P) / lnRatio);
                        }
                        if (s) seg.curve.push_back({s->T, s->s, Qcum, s->P, s->h});
                    }
                }
                break;
            }
            case PathKind::Isothermal: {
                auto end = c.model.stateTP(a.T, P2);
                if (!end) return stepError(step, idx, end.error().message);
                o.end = *end;
                seg.label = "isothermal " + what;
                o.Q = c.m * a.T * (o.end.s - a.s);
                if (c.points > 0)
                    for (int k = 0; k < n; ++k) {
                        auto s = k == 0 ? Result<State>(a) : (k == n - 1 ? Result<State>(o.end) : c.model.stateTP(a.T, Pk(k)));
                        if (s) seg.curve.push_back({s->T, s->s, Qcum + c.m * a.T * (s->s - a.s), s->P, s->h});
                    }
                break;
            }
            case PathKind::Polytropic: {
                if (!step.n) return stepError(step, idx, "a polytropic path needs the exponent n");
                const double nn = step.n->value;
                if (auto problem = checkBounded(BoundedField::PolytropicExponent, nn)) return stepError(step, idx, *problem);
                auto vAt = [&](double P) { return a.v * std::pow(a.P / P, 1.0 / nn); };
                auto end = c.model.stateP(P2, Property::Volume, vAt(P2));
                if (!end) return stepError(step, idx, end.error().message);
                o.end = *end;
                seg.label = "polytropic " + what + " (n = " + num(nn, 4) + ")";
                // Work of the internally reversible path P v^n = const.
                auto work = [&](double P, double v) {
                    if (std::fabs(nn - 1.0) < 1e-12) {
                        return c.closed ? -a.P * a.v * std::log(v / a.v) : a.P * a.v * std::log(P / a.P);
                    }
                    return c.closed ? (P * v - a.P * a.v) / (nn - 1.0) : nn / (nn - 1.0) * (P * v - a.P * a.v);
                };
                o.W = c.m * work(P2, o.end.v);
                o.Q = c.m * (E(o.end) - E(a)) - o.W;
                if (c.points > 0)
                    for (int k = 0; k < n; ++k) {
                        const double P = Pk(k);
                        auto s = k == 0 ? Result<State>(a) : (k == n - 1 ? Result<State>(o.end) : c.model.stateP(P, Property::Volume, vAt(P)));
                        if (s) seg.curve.push_back({s->T, s->s, Qcum + c.m * (E(*s) - E(a)) - c.m * work(s->P, s->v), s->P, s->h});
                    }
                break;
            }
        }
        if (o.adiabatic) {
            o.Q = 0;
            o.W = c.m * (E(o.end) - E(a));
        } else if (path == PathKind::Isothermal) {
            o.W = c.m * (E(o.end) - E(a)) - o.Q;
        }
        // Saturated liquid (x = 0) and saturated vapour (x = 1) are one
        // phase at the edge of the dome, the design inlets of a feed pump
        // and of a refrigeration compressor; only a mixture strictly inside
        // is two-phase.
        auto mixture = [](const State& s) {
            return s.phase == Phase::LiquidVapor && s.quality && *s.quality > 1e-9 && *s.quality < 1.0 - 1e-9;
        };
        if (mixture(o.end))
            o.warnings.push_back("discharge is two-phase (quality " + num(*o.end.quality, 3) + ")");
        if (compress && mixture(a))
            o.warnings.push_back("compressing a two-phase mixture (quality " + num(*a.quality, 3) +
                                 "): liquid in a compressor damages it");
    }
    seg.end = o.end;
    seg.Q = o.Q;
    o.segments.push_back(std::move(seg));
    return o;
}

}  // namespace heatchain::solver_detail
