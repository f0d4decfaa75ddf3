#pragma once
// How far a gas at (T, P) is from ideal, by the generalised second-virial
// correlation of Pitzer and Curl with Abbott's fits (Smith, Van Ness &
// Abbott, Introduction to Chemical Engineering Thermodynamics, 7th ed.
// (2005), Sec. 3.6, eqs. 3.61, 3.65 and 3.66 (equation numbers from memory)):
//
//   Z = 1 + (B0 + ω B1) Pr / Tr,  B0 = 0.083 − 0.422 / Tr^1.6,  B1 = 0.139 − 0.172 / Tr^4.2
//
// It needs only the critical point and the acentric factor, which every
// library substance has, and stays a few arithmetic operations, so an
// ideal-gas model can judge its own error at every state it returns.
#include <cmath>

namespace heatchain::detail {

inline double abbottCompressibility(double T, double P, double Tc, double Pc, double omega) {
    const double Tr = T / Tc, Pr = P / Pc;
    const double lnTr = std::log(Tr);
    const double B0 = 0.083 - 0.422 * std::exp(-1.6 * lnTr);
    const double B1 = 0.139 - 0.172 * std::exp(-4.2 * lnTr);
    return 1.0 + (B0 + omega * B1) * Pr / Tr;
}

}  // namespace heatchain::detail
