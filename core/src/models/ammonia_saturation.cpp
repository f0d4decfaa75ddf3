// Density roots and saturation of the Tillner-Roth et al. (1993) ammonia
// equation (ammonia_saturation.hpp).
#include "models/ammonia_saturation.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include "numerics/root.hpp"

namespace heatchain::detail::nh3 {

std::optional<double> solveDelta(const TauPowers& tp, double pi, Branch b, double lo, double hi, double start) {
    double f = 0, dJ = 0;  // at the last density probed
    auto probe = [&](double d) {
        const Residual r = residual(d, tp);
        f = reducedPressure(d, r) - pi;
        dJ = reducedPressureSlope(d, r);
        // Inside the spinodal the pressure falls with density: the branch's
        // root lies on the side the branch comes from.
        if (!(dJ > 0)) return b == Branch::Liquid ? NewtonProbe::rootAbove() : NewtonProbe::rootBelow();
        return NewtonProbe{f, dJ};
    };
    const auto d = safeguardedNewton(probe, std::clamp(start, lo, hi), lo, hi, /*rising=*/true,
                                     {1e-15, 4e-16, 0.0, 300});
    if (!d || !d->converged()) return std::nullopt;
    if (d->end != NewtonRoot::End::Bracket) return d->x;
    // The bracket closed. It closed on a root only if the pressure matches
    // there; otherwise on a spinodal.
    if (dJ > 0 && std::abs(f) <= 1e-12 * pi) return d->x;
    return std::nullopt;
}

std::optional<Sat> satByPressure(double T, double divider, double piStart, double dlStart, double dvStart) {
    const double tau = Tc / T;
    const TauPowers tp = tauPowers(tau);
    double pi = piStart, dl = dlStart, dv = dvStart;  // at the last pressure probed
    bool both = false;                               // both roots exist there
    auto probe = [&](double p) {
        pi = p;
        const auto v = solveDelta(tp, pi, Branch::Vapour, 0.0, divider, dv);
        if (!v) {
            both = false;
            return NewtonProbe::rootBelow();  // above the vapour spinodal
        }
        const auto l = solveDelta(tp, pi, Branch::Liquid, divider, kDeltaMax, dl);
        if (!l) {
            both = false;
            return NewtonProbe::rootAbove();  // below the liquid spinodal
        }
        both = true;
        dv = *v;
        dl = *l;
        const Residual rv = residual(dv, tp), rl = residual(dl, tp);
        const double dg = reducedGibbsDensityPart(dv, std::log(dv), rv) - reducedGibbsDensityPart(dl, std::log(dl), rl);
        return NewtonProbe{dg, pi * (1.0 / dv - 1.0 / dl)};  // d(dg)/d ln pi
    };
    // Newton in ln pi, the bracket open at both ends until probes bound it,
    // doubling or halving pi from the last bound.
    const auto x = safeguardedNewton(probe, piStart, 0.0, std::numeric_limits<double>::infinity(), /*rising=*/true,
                                     {1e-14, 1e-15, 0.0, 200, /*logScale=*/true,
                                      std::numeric_limits<double>::infinity(), 0.5});
    if (!x || !x->converged() || !both) return std::nullopt;
    const double piSat = x->end == NewtonRoot::End::Step ? x->x : pi;
    return Sat{piSat * rhoc * R * T, dl, dv};
}

std::optional<Sat> satNewton(double T, double dl, double dv) {
    const double tau = Tc / T;
    const TauPowers tp = tauPowers(tau);
    // Unknowns (dl, dv); equations F1 = Jv - Jl, F2 = Kv - Kl, with
    // dJ/ddelta = J' and dK/ddelta = J'/delta.
    auto probe = [&](const std::array<double, 2>& d) {
        const Residual rl = residual(d[0], tp), rv = residual(d[1], tp);
        const double Jdl = reducedPressureSlope(d[0], rl), Jdv = reducedPressureSlope(d[1], rv);
        Newton2Probe p;
        if (!(Jdl > 0 && Jdv > 0)) return p;  // a density inside the spinodal: give up
        p.f = {reducedPressure(d[1], rv) - reducedPressure(d[0], rl),
               reducedGibbsDensityPart(d[1], std::log(d[1]), rv) - reducedGibbsDensityPart(d[0], std::log(d[0]), rl)};
        p.j = {{{-Jdl, Jdv}, {-Jdl / d[0], Jdv / d[1]}}};
        return p;
    };
    // Halve a step until the liquid stays denser than the vapour, the vapour
    // positive and the liquid inside the searched range.
    auto limit = [](const std::array<double, 2>& d, std::array<double, 2>& step) {
        double lam = 1.0;
        double nl = d[0] + step[0], nv = d[1] + step[1];
        for (int k = 0; k < 30 && !(nl > nv && nv > 0 && nl < kDeltaMax); ++k) {
            lam *= 0.5;
            nl = d[0] + lam * step[0];
            nv = d[1] + lam * step[1];
        }
        step = {lam * step[0], lam * step[1]};
        return nl > nv && nv > 0;
    };
    const auto d = newton2(probe, {dl, dv}, limit, {1e-13, 40});
    if (!d) return std::nullopt;
    const double J = reducedPressure((*d)[1], residual((*d)[1], tp));
    return Sat{J * rhoc * R * T, (*d)[0], (*d)[1]};
}

const Ancillary& ancillary() {
    static const Ancillary table = [] {
        Ancillary a;
        const double x0 = Ancillary::xOf(Ancillary::Tlow);
        const double xn = Ancillary::xOf(Tc - 0.01);  // stop short of the merging densities
        // Continuation from the cold end, where the liquid is near delta = 3.2
        // and the vapour nearly ideal; each node starts from the last one and
        // splits its two roots at the previous mean density (inside the
        // unstable region).
        double piPrev = 0, dlPrev = 3.2, dvPrev = 0;
        for (int k = 0; k < Ancillary::N; ++k) {
            const double x = x0 + (xn - x0) * k / (Ancillary::N - 1);
            const double T = Tc * (1.0 - x * x * x);
            const double divider = k == 0 ? 1.0 : 0.5 * (dlPrev + dvPrev);
            double pi0 = piPrev > 0 ? piPrev : 1e-3, dv0 = dvPrev > 0 ? dvPrev : 1e-3;
            auto s = satByPressure(T, divider, pi0, dlPrev, dv0);
            if (!s) return a;  // a.ok stays false; the factory reports it
            a.x[k] = x;
            a.T[k] = T;
            a.lnP[k] = std::log(s->P);
            a.dl[k] = s->dl;
            a.dv[k] = s->dv;
            piPrev = s->P / (rhoc * R * T);
            dlPrev = s->dl;
            dvPrev = s->dv;
        }
        a.ok = true;
        return a;
    }();
    return table;
}

}  // namespace heatchain::detail::nh3
