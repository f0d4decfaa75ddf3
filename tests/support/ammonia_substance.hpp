#pragma once
// Ammonia built in code for the real-fluid tests, so they do not wait for the
// library file (resources/substances/ammonia.json, written on another branch).
// Every constant names its source.
#include <cmath>

#include "heatchain/substance.hpp"

namespace heatchain::testing {

inline Substance ammoniaForTests(bool withSolid = true) {
    Substance s;
    s.id = "ammonia";
    s.name = "Ammonia";
    s.formula = "NH3";
    // Molar mass, critical point: Tillner-Roth, Harms-Watzenberg & Baehr,
    // DKV-Tagungsbericht 20 (1993) 167–181 (the ammonia equation python3-iapws
    // implements; the same values are printed by iapws.ammonia.NH3: M, Tc, Pc).
    s.molarMass = 17.03026e-3;
    // Acentric factor 0.256: Poling, Prausnitz & O'Connell, 5th ed., App. A (from memory).
    s.critical = CriticalPoint{405.40, 11.333e6, 0.256, 225.0};
    // Ideal-gas cp: NIST Chemistry WebBook, ammonia gas-phase Shomate
    // coefficients, 298–1400 K (from memory): A 19.99563, B 49.77119,
    // C -15.37599, D 1.921168, E 0.189174 (J/(mol K), t = T/1000 K).
    // Used here down to 195 K (extrapolated; the reference test compares it
    // with the oracle's ideal-gas cp).
    const double m = s.molarMass;
    HeatCapacity::Piece p;
    p.Tmin = 195.0;
    p.Tmax = 1400.0;
    p.form = HeatCapacity::Form::Shomate;
    p.c = {19.99563 / m, 49.77119 / m, -15.37599 / m, 1.921168 / m, 0.189174 / m};
    s.cpVapor = HeatCapacity::fromPieces({p}).value();
    // Normal boiling point 239.82 K, triple point 195.49 K 6.09 kPa:
    // Tillner-Roth et al. (1993) as printed by iapws.ammonia.NH3 (Tb, Tt);
    // the triple pressure from memory.
    s.boiling = PhaseChangeData{239.82, 101325.0, 1.3696e6};  // latent heat 23.33 kJ/mol, NIST WebBook (from memory)
    s.triple = TriplePoint{195.49, 6.09e3};
    if (withSolid) {
        // Melting at the triple point, enthalpy of fusion 5.655 kJ/mol:
        // NIST Chemistry WebBook, ammonia condensed phase (from memory).
        s.melting = PhaseChangeData{195.49, 101325.0, 5.655e3 / m};
        // Solid cp about 2.1 kJ/(kg K) near the melting point (from memory,
        // order of magnitude only; the tests using it check laws, not values).
        s.cpSolid = HeatCapacity::constant(2100.0, 100.0, 195.49);
    }
    return s;
}

}  // namespace heatchain::testing
