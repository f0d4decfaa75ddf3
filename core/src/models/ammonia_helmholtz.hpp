#pragma once
// The fundamental equation of ammonia of Tillner-Roth, Harms-Watzenberg &
// Baehr (1993): dimensionless Helmholtz energy phi = phi0(delta, tau) +
// phir(delta, tau), delta = rho / rho_c, tau = T_c / T, and the properties
// that follow from its derivatives. Internal to core; the property model in
// ammonia.cpp is its only user.
namespace heatchain::detail::nh3 {

// Constants of the equation (Tillner-Roth et al. 1993; the same figures are
// printed by python3-iapws 1.5.2 as NH3.Tc, NH3.rhoc, NH3.M,
// NH3._constants["R"]). The equation is fitted with this R and M, so they
// stay with it rather than with the library's molar mass.
inline constexpr double Tc = 405.40;          // K
inline constexpr double rhoc = 225.0;         // kg/m3
inline constexpr double M = 17.03026e-3;      // kg/mol
inline constexpr double Rmolar = 8.314471;    // J/(mol K)
inline constexpr double R = Rmolar / M;       // J/(kg K)
// Triple point of the equation's range (Tillner-Roth et al. 1993; NH3.Tt).
inline constexpr double Ttriple = 195.495;    // K

// phi and its derivatives at one (delta, tau). The ideal and residual parts
// are kept apart because p, cp and the saturation conditions use only the
// residual density derivatives.
struct Helmholtz {
    double phi0 = 0, phi0_t = 0, phi0_tt = 0;  // ideal part; its delta derivatives are 1/delta, -1/delta^2
    double phir = 0, phir_d = 0, phir_dd = 0, phir_t = 0, phir_tt = 0, phir_dt = 0;
};

// Residual part only (saturation and density solves need nothing else).
struct Residual {
    double phir = 0, phir_d = 0, phir_dd = 0;
};

// Everything, at (delta, tau). No allocation.
Helmholtz evaluate(double delta, double tau);
// Residual part and its first two delta derivatives at (delta, tau); the
// tau powers are the expensive part, so they come precomputed per tau.
struct TauPowers {
    double tau = 0;
    double p[21];  // n_i tau^t_i of each residual term
};
TauPowers tauPowers(double tau);
Residual residual(double delta, const TauPowers& tp);

// Dimensionless combinations used everywhere.
// Reduced pressure p / (rho_c R T) = delta (1 + delta phir_d).
inline double reducedPressure(double delta, const Residual& r) { return delta * (1.0 + delta * r.phir_d); }
// Its delta derivative, (dp/drho)_T / (R T) = 1 + 2 delta phir_d + delta^2 phir_dd.
inline double reducedPressureSlope(double delta, const Residual& r) {
    return 1.0 + 2.0 * delta * r.phir_d + delta * delta * r.phir_dd;
}
// The density-dependent part of g/(R T): ln delta + phir + delta phir_d (the
// tau-only terms of phi0 are the same in both phases at one T).
inline double reducedGibbsDensityPart(double delta, double lnDelta, const Residual& r) {
    return lnDelta + r.phir + delta * r.phir_d;
}

}  // namespace heatchain::detail::nh3
