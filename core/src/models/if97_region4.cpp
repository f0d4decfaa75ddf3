// IF97 region 4 (saturation line), eqs. 29–31 of IAPWS R7-97(2012), and the
// boundary between regions 2 and 3 (B23), eqs. 5 and 6.
#include <cmath>

#include "models/if97_detail.hpp"

namespace heatchain::if97 {
namespace {
// IAPWS R7-97(2012), Table 34: n_1…n_10 of eq. 29. Verified by Tables 35, 36.
constexpr double n[11] = {0,
                          0.11670521452767e4,  -0.72421316703206e6, -0.17073846940092e2,
                          0.12020824702470e5,  -0.32325550322333e7, 0.14915108613530e2,
                          -0.48232657361591e4, 0.40511340542057e6,  -0.23855557567849,
                          0.65017534844798e3};

// IAPWS R7-97(2012), Table 1: n_1…n_5 of eqs. 5 and 6. Verified by the check
// value of Sec. 4 (623.15 K ↔ 16.5291643 MPa).
constexpr double b[6] = {0, 0.34805185628969e3, -0.11671859879975e1, 0.10192970039326e-2,
                         0.57254459862746e3, 0.13918839778870e2};
}  // namespace

double saturationPressure(double T) {
    // Eq. 30 with theta from eq. 29b; p* = 1 MPa, T* = 1 K.
    const double th = T + n[9] / (T - n[10]);
    const double A = th * th + n[1] * th + n[2];
    const double B = n[3] * th * th + n[4] * th + n[5];
    const double C = n[6] * th * th + n[7] * th + n[8];
    const double x = 2 * C / (-B + std::sqrt(B * B - 4 * A * C));
    return x * x * x * x * 1e6;
}

double saturationTemperature(double P) {
    // Eq. 31 with beta = (p/p*)^(1/4), eq. 29a.
    const double beta = std::sqrt(std::sqrt(P / 1e6));
    const double E = beta * beta + n[3] * beta + n[6];
    const double F = n[1] * beta * beta + n[4] * beta + n[7];
    const double G = n[2] * beta * beta + n[5] * beta + n[8];
    const double D = 2 * G / (-F - std::sqrt(F * F - 4 * E * G));
    const double s = n[10] + D;
    return 0.5 * (s - std::sqrt(s * s - 4 * (n[9] + n[10] * D)));
}

double saturationPressureAt623() {
    static const double p = saturationPressure(T13);
    return p;
}

double b23Pressure(double T) {
    return (b[1] + b[2] * T + b[3] * T * T) * 1e6;  // eq. 5
}

double b23Temperature(double P) {
    return b[4] + std::sqrt((P / 1e6 - b[5]) / b[3]);  // eq. 6
}

int regionTP(double T, double P) {
    if (!(P > 0) || T < Tmin || T > Tmax) return 0;
    if (T > T25) return P <= Pmax5 ? 5 : 0;
    if (P > Pmax) return 0;
    if (T <= T13) return P >= saturationPressure(T) ? 1 : 2;
    if (T <= T23max && P > b23Pressure(T)) return 3;
    return 2;
}

}  // namespace heatchain::if97
