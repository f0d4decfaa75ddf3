#pragma once
// Real roots of a monic cubic z^3 + c2 z^2 + c1 z + c0 = 0, closed form
// (Cardano for one real root, the trigonometric form for three), each root
// polished by Newton steps on the undepressed polynomial so that a root near
// a double or triple root (a cubic equation of state near its critical
// point) keeps full use of double precision.
namespace heatchain::detail {

struct CubicRoots {
    double z[3] = {0, 0, 0};  // ascending
    int count = 0;            // 1 or 3 (repeated roots are listed repeatedly)
};

CubicRoots solveCubic(double c2, double c1, double c0);

}  // namespace heatchain::detail
