#pragma once
// Density roots and the saturation line of the Tillner-Roth et al. (1993)
// ammonia equation (ammonia_helmholtz.hpp): the numerical side of the
// ammonia reference model (ammonia.cpp), kept apart from the model's phases.
#include <algorithm>
#include <array>
#include <cmath>
#include <optional>

#include "models/ammonia_helmholtz.hpp"

namespace heatchain::detail::nh3 {

// Largest reduced density searched (delta = 6 is 1350 kg/m3, beyond the
// liquid at 196 K and 1000 MPa).
constexpr double kDeltaMax = 6.0;

enum class Branch { Vapour, Liquid, Single };

// Reduced density delta with reduced pressure J(delta) = pi on one branch,
// by Newton kept inside a bracket [lo, hi]. The branch decides which side a
// point of the unstable region (dJ/ddelta <= 0) belongs to: for the vapour
// root it bounds from above, for the liquid root from below. Bounded; returns
// nullopt when the bracket closes on a spinodal (no root on that branch).
std::optional<double> solveDelta(const TauPowers& tp, double pi, Branch b, double lo, double hi, double start);

struct Sat {
    double P = 0;                 // Pa
    double dl = 0, dv = 0;        // reduced densities
};

// Saturation at tau by Newton on ln pi (pi the reduced pressure) with equal
// Gibbs energies: d(g/RT)/dpi = 1/delta at fixed T, so the difference's
// slope in ln pi is pi (1/dv - 1/dl). Each pressure gets the two roots on either side of
// `divider`, a reduced density inside the unstable region. Robust (a missing
// root moves the pressure bracket) but slower than satNewton below; used to
// build the ancillary table and as the fallback.
std::optional<Sat> satByPressure(double T, double divider, double piStart, double dlStart, double dvStart);

// Saturation at T by Newton on the two reduced densities (dl, dv) with
// equal reduced pressures J and equal density parts K of g/RT (the method of
// Akasaka, J. Therm. Sci. Technol. 3 (2008) 442–451). dK/ddelta = J'/delta.
std::optional<Sat> satNewton(double T, double dl, double dv);

// Ancillary saturation table made here from the equation itself (not a
// published fit): ln P, delta_l and delta_v at nodes uniform in
// x = (1 - T/Tc)^(1/3), which crowds them towards the critical point where
// the densities change fastest, from 185 K up. Linear interpolation gives
// starting guesses good to about 1e-4 (checked in
// tests/core/ammonia_model_test.cpp); every answer is then solved exactly.
struct Ancillary {
    static constexpr int N = 160;
    static constexpr double Tlow = 185.0;
    std::array<double, N> x{}, T{}, lnP{}, dl{}, dv{};
    bool ok = false;

    static double xOf(double T) { return std::cbrt(std::max(0.0, 1.0 - T / Tc)); }

    // Interpolation position for T: index i and weight w between nodes i, i+1.
    // Nodes run from high x (low T) to low x (near Tc).
    void locate(double Tq, int& i, double& w) const {
        const double xq = xOf(Tq);
        const double x0 = x[0], xn = x[N - 1];
        double pos = (x0 - xq) / (x0 - xn) * (N - 1);
        pos = std::clamp(pos, 0.0, double(N - 1) - 1e-9);
        i = int(pos);
        w = pos - i;
    }
    double lnPAt(double Tq) const {
        int i; double w; locate(Tq, i, w);
        return (1 - w) * lnP[i] + w * lnP[i + 1];
    }
    double dlAt(double Tq) const {
        int i; double w; locate(Tq, i, w);
        return (1 - w) * dl[i] + w * dl[i + 1];
    }
    double dvAt(double Tq) const {
        int i; double w; locate(Tq, i, w);
        return std::exp((1 - w) * std::log(dv[i]) + w * std::log(dv[i + 1]));
    }
    // Inverse: temperature where the table's ln P equals lnq (ln P rises with T).
    double TAt(double lnq) const {
        if (lnq <= lnP[0]) return T[0];
        if (lnq >= lnP[N - 1]) return T[N - 1];
        int a = 0, b = N - 1;
        while (b - a > 1) {
            const int m = (a + b) / 2;
            if (lnP[m] <= lnq) a = m; else b = m;
        }
        const double w = (lnq - lnP[a]) / (lnP[b] - lnP[a]);
        return (1 - w) * T[a] + w * T[b];
    }
};

// The table, built from the equation on first use (thread-safe static).
const Ancillary& ancillary();

}  // namespace heatchain::detail::nh3
