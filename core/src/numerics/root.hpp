#pragma once
// Bracketed one-dimensional root finding, shared by every inversion in core:
//  - brent: Brent's method (Brent 1973, "Algorithms for Minimization without
//    Derivatives", ch. 4) when only f is known;
//  - safeguardedNewton: Newton steps when the model gives f and its slope
//    from one evaluation (dh/dT = cp, Clapeyron, Gibbs–Helmholtz), kept
//    inside a bracket that shrinks on the sign of f, with a bisection
//    wherever Newton would leave the bracket or has no usable slope; an
//    end may be open, and the bracket then grows outward from the start;
//  - newtonPolish: plain Newton from a close start, no bracket;
//  - newton2: Newton on two equations in two unknowns, each step passed
//    through the caller's limit (a phase-equilibrium pair, (rho, T));
//  - bisect: halving for a monotone test that may jump or be infinite,
//    where no interpolation helps.
// All stop after a bounded number of steps.
#include <algorithm>
#include <array>
#include <cmath>
#include <limits>
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

// One evaluation for safeguardedNewton at x.
struct NewtonProbe {
    double f = std::numeric_limits<double>::quiet_NaN();      // residual; NaN: not defined at x
    double slope = std::numeric_limits<double>::quiet_NaN();  // df/dx; NaN or the wrong sign: bisect
    // Where f is not defined (a phase has no root there, a line ends): +1
    // when the root lies above x, -1 when below; 0 gives up.
    int rootSide = 0;

    NewtonProbe() = default;  // nothing known: give up
    NewtonProbe(double residual, double derivative) : f(residual), slope(derivative) {}
    static NewtonProbe rootAbove() {
        NewtonProbe p;
        p.rootSide = +1;
        return p;
    }
    static NewtonProbe rootBelow() {
        NewtonProbe p;
        p.rootSide = -1;
        return p;
    }
};

struct NewtonOptions {
    double stepTolerance = 1e-12;     // converged when |step| <= stepTolerance * |x|
    double bracketTolerance = 1e-13;  // converged when hi - lo <= bracketTolerance * |hi|
    double residualTolerance = 0;     // converged when |f| <= residualTolerance
    int maxIterations = 100;
    // Newton in ln x for a positive x that spans decades (a vapour
    // pressure): the probe's slope is df/d(ln x), a step multiplies x by
    // e^step, cut to e^±maxLnStep, stepTolerance is absolute in ln x, and a
    // bisection takes the geometric mean. The bracket may then be open
    // (lo = 0 or hi = +inf): where a bisection is due while one end is
    // still open, the next point is hi·openFactor or lo/openFactor, so the
    // bracket grows outward from the start until probes bound it (bracket
    // expansion, Press et al., Numerical Recipes, 3rd ed., sec. 9.1).
    bool logScale = false;
    double maxLnStep = std::numeric_limits<double>::infinity();
    double openFactor = 0.5;
};

struct NewtonRoot {
    enum class End {
        Residual,    // |f| within the residual tolerance at x
        Step,        // the Newton step from the last point probed was small; x is where it leads
        Bracket,     // the bracket closed around x
        Iterations,  // the iteration bound was reached; x is the last point probed
    };
    double x;
    End end;
    bool probed;  // x is the last point probed (its state is the caller's last one)
    bool converged() const { return end != End::Iterations; }
};

// Root of f in (lo, hi) from the start x, for an f that rises with x
// (`rising`) or falls. Converged by the residual or a closed bracket at the
// last point probed, by a small Newton step at the point it leads to.
// Nothing when a probe gives no residual and no side, or the start bracket
// is empty.
template <class Probe>
std::optional<NewtonRoot> safeguardedNewton(Probe&& probe, double x, double lo, double hi, bool rising,
                                            const NewtonOptions& opt = {}) {
    if (!(hi > lo)) return std::nullopt;
    auto middle = [&] {
        if (!opt.logScale) return 0.5 * (lo + hi);
        if (!(lo > 0)) return hi * opt.openFactor;
        if (std::isinf(hi)) return lo / opt.openFactor;
        return std::sqrt(lo * hi);
    };
    double last = x;
    for (int it = 0; it < opt.maxIterations; ++it) {
        if (!(x > lo && x < hi)) x = middle();
        const NewtonProbe p = probe(x);
        last = x;
        double next;
        if (!std::isfinite(p.f)) {
            if (p.rootSide == 0) return std::nullopt;
            if (p.rootSide > 0) lo = x; else hi = x;
            next = middle();
        } else {
            if (std::fabs(p.f) <= opt.residualTolerance) return NewtonRoot{x, NewtonRoot::End::Residual, true};
            if ((p.f > 0) == rising) hi = x; else lo = x;
            const bool usable = std::isfinite(p.slope) && (rising ? p.slope > 0 : p.slope < 0);
            if (!usable) {
                next = middle();
            } else if (opt.logScale) {
                const double step = -p.f / p.slope;
                if (std::fabs(step) <= opt.stepTolerance)
                    return NewtonRoot{x * std::exp(step), NewtonRoot::End::Step, step == 0};
                next = x * std::exp(std::clamp(step, -opt.maxLnStep, opt.maxLnStep));
            } else {
                next = x - p.f / p.slope;
                if (std::fabs(next - x) <= opt.stepTolerance * std::fabs(x))
                    return NewtonRoot{next, NewtonRoot::End::Step, next == x};
            }
            if (!(next > lo && next < hi)) next = middle();
        }
        const double width = hi - lo;  // infinite while the bracket is open above
        if (std::isfinite(width) && width <= opt.bracketTolerance * std::fabs(hi))
            return NewtonRoot{x, NewtonRoot::End::Bracket, true};
        x = next;
    }
    return NewtonRoot{last, NewtonRoot::End::Iterations, true};
}

// Plain Newton from a close start (a backward equation, a closed form), with
// no bracket: stops with the point probed when |f| <= residualTolerance, or
// with the point reached when a step was at most stepTolerance·max(stepFloor,
// |x|) there; nothing when x leaves its domain ((0, ∞), or (−∞, below) for a
// variable of either sign), the slope is not of the expected sign (rising or
// falling) and finite, or the iterations run out. A negative tolerance
// switches its test off.
struct PolishOptions {
    double residualTolerance = -1;
    double stepTolerance = -1;
    int maxIterations = 8;
    bool positive = true;   // x is a positive variable (a temperature); else any sign (a logarithm)
    bool rising = true;     // f rises with x (slope > 0) or falls
    double stepFloor = 0;   // the step test's scale near x = 0, for a variable of either sign
    double below = std::numeric_limits<double>::infinity();  // x must stay below (e.g. ln P under overflow)
};

template <class Probe>
std::optional<double> newtonPolish(Probe&& probe, double x, const PolishOptions& opt) {
    auto inDomain = [&](double v) { return (opt.positive ? v > 0 : v < opt.below) && std::isfinite(v); };
    for (int it = 0; it < opt.maxIterations; ++it) {
        if (!inDomain(x)) return std::nullopt;
        const NewtonProbe p = probe(x);
        if (std::fabs(p.f) <= opt.residualTolerance) return x;
        if (!(opt.rising ? p.slope > 0 : p.slope < 0) || !std::isfinite(p.slope)) return std::nullopt;
        const double step = p.f / p.slope;
        x -= step;
        if ((!opt.positive || x > 0) && std::fabs(step) <= opt.stepTolerance * std::max(opt.stepFloor, std::fabs(x)))
            return x;
    }
    return std::nullopt;
}

// Newton's method on two equations F(x) = 0 in two unknowns, the linear
// step J dx = -F solved by Cramer's rule. The caller's probe gives F and the
// Jacobian J at x, or says the residuals are small enough there (`done`), or
// gives up (NaN in F). Each step passes through limit(x, dx), which may
// shorten dx in place (keep densities ordered, stay near a good start) or
// return false to give up. Returns x where the probe said done, or x after a
// step with |dx_i| <= stepTolerance·|x_i| for both unknowns; nothing when it
// gives up, J is singular, or the iterations run out.
struct Newton2Probe {
    std::array<double, 2> f{std::numeric_limits<double>::quiet_NaN(), std::numeric_limits<double>::quiet_NaN()};
    std::array<std::array<double, 2>, 2> j{};  // j[r][c] = dF_r/dx_c
    bool done = false;
};

struct Newton2Options {
    double stepTolerance = -1;  // negative: no step test
    int maxIterations = 20;
};

template <class Probe, class Limit>
std::optional<std::array<double, 2>> newton2(Probe&& probe, std::array<double, 2> x, Limit&& limit,
                                             const Newton2Options& opt) {
    for (int it = 0; it < opt.maxIterations; ++it) {
        const Newton2Probe p = probe(std::as_const(x));
        if (p.done) return x;
        if (!std::isfinite(p.f[0]) || !std::isfinite(p.f[1])) return std::nullopt;
        const auto& j = p.j;
        const double det = j[0][0] * j[1][1] - j[0][1] * j[1][0];
        if (!(std::fabs(det) > 0) || !std::isfinite(det)) return std::nullopt;
        std::array<double, 2> dx{-(p.f[0] * j[1][1] - p.f[1] * j[0][1]) / det,
                                 -(j[0][0] * p.f[1] - j[1][0] * p.f[0]) / det};
        if (!limit(std::as_const(x), dx)) return std::nullopt;
        const bool small = std::fabs(dx[0]) <= opt.stepTolerance * std::fabs(x[0]) &&
                           std::fabs(dx[1]) <= opt.stepTolerance * std::fabs(x[1]);
        x[0] += dx[0];
        x[1] += dx[1];
        if (small) return x;
    }
    return std::nullopt;
}

// Bisection of [lo, hi] on a test that holds below some point and fails
// above it (a monotone quantity against a target), for a quantity that may
// jump or be infinite where interpolation has nothing to work with. Halves
// until hi - lo <= width or after maxIterations halvings; returns the final
// (lo, hi), the point lying between them. below(lo) is assumed to hold and
// below(hi) to fail; neither is evaluated.
template <class Below>
std::pair<double, double> bisect(Below&& below, double lo, double hi, double width, int maxIterations) {
    for (int it = 0; it < maxIterations && hi - lo > width; ++it) {
        const double mid = 0.5 * (lo + hi);
        if (below(mid)) lo = mid;
        else hi = mid;
    }
    return {lo, hi};
}

}  // namespace heatchain::detail
