#pragma once
// Golden-section search for the least value of a function with one minimum
// on [a, b] (Kiefer 1953; Press et al., Numerical Recipes, 3rd ed.,
// sec. 10.2): each step keeps the part of the bracket holding the lower of
// two interior points placed at the golden ratio, so one new evaluation per
// step shrinks the bracket by 0.618.
#include <cmath>

namespace heatchain::detail {

struct Minimum {
    double x;  // the interior point with the lower value
    double f;
};

// Stops when b - a <= width or after maxIterations steps.
template <class F>
Minimum goldenSection(F&& f, double a, double b, double width, int maxIterations) {
    const double gr = 0.5 * (std::sqrt(5.0) - 1.0);
    double x1 = b - gr * (b - a), x2 = a + gr * (b - a);
    double f1 = f(x1), f2 = f(x2);
    for (int it = 0; it < maxIterations && std::fabs(b - a) > width; ++it) {
        if (f1 < f2) {
            b = x2;
            x2 = x1;
            f2 = f1;
            x1 = b - gr * (b - a);
            f1 = f(x1);
        } else {
            a = x1;
            x1 = x2;
            f1 = f2;
            x2 = a + gr * (b - a);
            f2 = f(x2);
        }
    }
    return f1 <= f2 ? Minimum{x1, f1} : Minimum{x2, f2};
}

}  // namespace heatchain::detail
