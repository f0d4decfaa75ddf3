#pragma once
// Physical constants, each defined once with its source.

namespace heatchain {

// Molar gas constant, J/(mol K). Exact since the 2019 SI redefinition:
// CODATA 2018 recommended values (Tiesinga et al., Rev. Mod. Phys. 93, 025010
// (2021)), R = N_A k with N_A and k exact.
inline constexpr double kGasConstant = 8.314462618;

// Standard atmosphere, Pa (exact by definition; NIST SP 811 (2008), B.8).
inline constexpr double kStandardAtmosphere = 101325.0;

}  // namespace heatchain
