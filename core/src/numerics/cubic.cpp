#include "numerics/cubic.hpp"

#include <algorithm>
#include <limits>
#include <cmath>
#include <numbers>

namespace heatchain::detail {

namespace {

// Newton on the cubic itself; stops when the step no longer shrinks, which
// bounds the work at a multiple root where convergence is only linear.
double polish(double z, double c2, double c1, double c0) {
    double lastStep = std::numeric_limits<double>::infinity();
    for (int i = 0; i < 4; ++i) {
        const double f = ((z + c2) * z + c1) * z + c0;
        const double d = (3.0 * z + 2.0 * c2) * z + c1;
        if (d == 0.0) break;
        const double step = f / d;
        if (!(std::abs(step) < lastStep)) break;
        z -= step;
        lastStep = std::abs(step);
        if (lastStep <= 1e-15 * std::max(1.0, std::abs(z))) break;
    }
    return z;
}

}  // namespace

CubicRoots solveCubic(double c2, double c1, double c0) {
    // Depressed form t^3 + p t + q = 0 with z = t - c2/3.
    const double shift = c2 / 3.0;
    const double p = c1 - c2 * shift;
    const double q = (2.0 * shift * shift - c1) * shift + c0;
    const double halfQ = 0.5 * q;
    const double thirdP = p / 3.0;
    const double disc = halfQ * halfQ + thirdP * thirdP * thirdP;

    CubicRoots r;
    if (disc > 0.0) {
        const double sq = std::sqrt(disc);
        // Choose the sign that avoids cancellation, then get the partner from
        // u * w = -p/3.
        const double u = std::cbrt(-halfQ + (halfQ <= 0 ? sq : -sq));
        const double t = (u != 0.0) ? u - thirdP / u : 0.0;
        r.z[0] = polish(t - shift, c2, c1, c0);
        r.count = 1;
        return r;
    }
    if (thirdP == 0.0) {  // triple root
        r.z[0] = r.z[1] = r.z[2] = -shift;
        r.count = 3;
        return r;
    }
    const double m = 2.0 * std::sqrt(-thirdP);
    const double arg = std::clamp(3.0 * q / (p * m), -1.0, 1.0);
    const double phi = std::acos(arg) / 3.0;
    constexpr double third = 2.0 * std::numbers::pi / 3.0;
    for (int k = 0; k < 3; ++k) r.z[k] = polish(m * std::cos(phi - third * k) - shift, c2, c1, c0);
    std::sort(r.z, r.z + 3);
    r.count = 3;
    return r;
}

}  // namespace heatchain::detail
