#pragma once
// Bracketed one-dimensional root finding, shared by every inversion in core.
// Brent's method (Brent 1973, "Algorithms for Minimization without
// Derivatives", ch. 4): never leaves the bracket, bounded iterations.
#include <cmath>
#include <optional>
#include <utility>

namespace heatchain::detail {

struct RootOptions {
    double xTolerance = 1e-12;  // relative to |x|, plus an absolute floor below
    double xAbsolute = 1e-12;
    int maxIterations = 200;
};

// Finds x in [a, b] with f(x) = 0 given f(a), f(b) of opposite signs (or one
// of them zero). Returns nullopt when the bracket is invalid or f returns a
// non-finite value.
template <class F>
std::optional<double> brent(F&& f, double a, double b, double fa, double fb,
                            const RootOptions& opt = {}) {
    if (!std::isfinite(fa) || !std::isfinite(fb)) return std::nullopt;
    if (fa == 0) return a;
    if (fb == 0) return b;
    if ((fa > 0) == (fb > 0)) return std::nullopt;
    double c = a, fc = fa, d = b - a, e = d;
    for (int i = 0; i < opt.maxIterations; ++i) {
        if ((fb > 0) == (fc > 0)) {
            c = a;
            fc = fa;
            d = e = b - a;
        }
        if (std::fabs(fc) < std::fabs(fb)) {
            a = b; b = c; c = a;
            fa = fb; fb = fc; fc = fa;
        }
        const double tol = 2.0 * opt.xTolerance * std::fabs(b) + 0.5 * opt.xAbsolute;
        const double m = 0.5 * (c - b);
        if (std::fabs(m) <= tol || fb == 0) return b;
        if (std::fabs(e) >= tol && std::fabs(fa) > std::fabs(fb)) {
            double p, q, r;
            const double s = fb / fa;
            if (a == c) {
                p = 2.0 * m * s;
                q = 1.0 - s;
            } else {
                q = fa / fc;
                r = fb / fc;
                p = s * (2.0 * m * q * (q - r) - (b - a) * (r - 1.0));
                q = (q - 1.0) * (r - 1.0) * (s - 1.0);
            }
            if (p > 0) q = -q; else p = -p;
            if (2.0 * p < std::fmin(3.0 * m * q - std::fabs(tol * q), std::fabs(e * q))) {
                e = d;
                d = p / q;
            } else {
                d = m;
                e = m;
            }
        } else {
            d = m;
            e = m;
        }
        a = b;
        fa = fb;
        b += (std::fabs(d) > tol) ? d : (m > 0 ? tol : -tol);
        fb = f(b);
        if (!std::isfinite(fb)) return std::nullopt;
    }
    return b;  // best estimate after the iteration bound
}

}  // namespace heatchain::detail
