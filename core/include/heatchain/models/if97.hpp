#pragma once
// Low-level IAPWS-IF97 (IAPWS R7-97(2012)): pure functions, SI units (K, Pa,
// J/kg, m3/kg), no allocation. The property model in water_model.hpp builds on
// these; tests check each function against the release's verification tables.
//
// Coefficients sit in the .cpp files beside their table numbers. They are
// verified by the computer-program verification tables of the same release
// (tests/core/if97_test.cpp): a region that reproduces its table to the
// printed digits has the right coefficients.

namespace heatchain::if97 {

// ---- Constants of the formulation (IAPWS R7-97(2012), eqs. 1–3) ----------
inline constexpr double R = 461.526;        // specific gas constant, J/(kg K), eq. 1
inline constexpr double Tc = 647.096;       // critical temperature, K, eq. 2
inline constexpr double Pc = 22.064e6;      // critical pressure, Pa, eq. 3
inline constexpr double rhoc = 322.0;       // critical density, kg/m3, eq. 4
inline constexpr double Tt = 273.16;        // triple-point temperature, K (Sec. 2.2)
inline constexpr double Pt = 611.657;       // triple-point pressure, Pa (Sec. 2.2)

// Region limits (R7-97(2012), Sec. 4 and Fig. 1).
inline constexpr double Tmin = 273.15;      // lower temperature of regions 1 and 2
inline constexpr double T13 = 623.15;       // boundary between regions 1 and 3
inline constexpr double T23min = 623.15;    // B23 spans 623.15 K …
inline constexpr double T23max = 863.15;    // … to 863.15 K
inline constexpr double T25 = 1073.15;      // boundary between regions 2 and 5
inline constexpr double Tmax = 2273.15;     // upper temperature of region 5
inline constexpr double Pmax = 100e6;       // upper pressure of regions 1–3
inline constexpr double Pmax5 = 50e6;       // upper pressure of region 5
// Saturation pressure at 623.15 K (region 4, eq. 30), where the liquid side
// leaves region 1 for region 3; the release quotes 16.5292 MPa.
double saturationPressureAt623();

// Single-phase properties per kilogram.
struct Props {
    double T = 0;   // K
    double P = 0;   // Pa
    double v = 0;   // m3/kg
    double h = 0;   // J/kg
    double s = 0;   // J/(kg K)
    double u = 0;   // J/kg
    double cp = 0;  // J/(kg K)
    double cv = 0;  // J/(kg K)
    double w = 0;   // m/s
};

// ---- Forward equations ----------------------------------------------------
Props region1(double T, double P);             // eq. 7, Table 2

// Specific enthalpy and entropy alone (the sums the other properties need
// are skipped): the same values as region1 / region2 give.
struct HS {
    double h = 0;  // J/kg
    double s = 0;  // J/(kg K)
};
HS region1HS(double T, double P);
HS region2HS(double T, double P);
// h, s and cp alone, for a Newton step on an isobar (dh/dT = cp): the same
// values as region1 / region2 give, without v, u, cv and w.
struct HSCp {
    double h = 0;   // J/kg
    double s = 0;   // J/(kg K)
    double cp = 0;  // J/(kg K)
};
HSCp region1HSCp(double T, double P);
HSCp region2HSCp(double T, double P);
Props region2(double T, double P);             // eq. 15, Tables 10 and 11
Props region2Metastable(double T, double P);   // eq. 18, Tables 16 and 17
Props region3(double rho, double T);           // eq. 28, Table 30 (density input)
Props region5(double T, double P);             // eq. 32, Tables 37 and 38

// Region 3 at (T, P): the density root of eq. 28 on the requested branch.
// `liquidSide` picks the dense root where the isotherm has two (T < Tc);
// above Tc the root is unique. Returns false when no root is found.
enum class Branch { Liquid, Vapor };
bool region3Density(double T, double P, Branch branch, double& rho);

// Region 3 at (P, h) or (P, s): Newton on eq. 28 in (rho, T) from the start
// (rho, T) (e.g. the SR3-03 backward equations), stopping when p and h or s
// agree to kRegion3SolveTol relative. Returns false when it does not
// converge in a bounded number of steps; the properties come back in `out`.
enum class Given { Enthalpy, Entropy };
inline constexpr double kRegion3SolveTol = 1e-11;
bool region3Solve(double P, double value, Given given, double& rho, double& T, Props& out);

// ---- Region 4 and the B23 boundary -----------------------------------------
double saturationPressure(double T);     // eq. 30, Table 34; 273.15 K ≤ T ≤ Tc
double saturationTemperature(double P);  // eq. 31, Table 34; 611.213 Pa ≤ P ≤ Pc
double b23Pressure(double T);            // eq. 5, Table 1
double b23Temperature(double P);         // eq. 6, Table 1

// ---- Backward equations ------------------------------------------------------
double region1T_ph(double P, double h);  // eq. 11, Table 6
double region1T_ps(double P, double s);  // eq. 13, Table 8
double b2bcPressure(double h);           // eq. 20, Table 19
double b2bcEnthalpy(double P);           // eq. 21, Table 19
double region2T_ph(double P, double h);  // eqs. 22–24, Tables 20–22 (2a/2b/2c)
double region2T_ps(double P, double s);  // eqs. 25–27, Tables 25–27 (2a/2b/2c)

// Region 3 backward equations of IAPWS SR3-03(2014) (subregions 3a/3b).
// Their results agree with eq. 28 only to the release's tolerances (about
// 25 mK and 0.01 % in v); the water model refines them with Newton steps.
inline constexpr double kS3ab = 4.41202148223476e3;  // s_3ab = s_c, J/(kg K), SR3-03(2014): the 3a/3b boundary for (p,s)
double region3abEnthalpy(double P);            // h_3ab(p), SR3-03 eq. 1, Table 1
double region3T_ph(double P, double h);        // eqs. 2–3, Tables 3–4
double region3v_ph(double P, double h);        // eqs. 4–5, Tables 6–7
double region3T_ps(double P, double s);        // eqs. 6–7, Tables 10–11
double region3v_ps(double P, double s);        // eqs. 8–9, Tables 13–14
double region3SaturationPressure_h(double h);  // p_3sat(h), eq. 10, Table 17
double region3SaturationPressure_s(double s);  // p_3sat(s), eq. 11, Table 19

// ---- Region selection from (T, P) ---------------------------------------------
// 1, 2, 3 or 5 by the boundaries of Fig. 1; 0 outside the formulation's range.
// On the saturation line (T < 623.15 K) it returns 1 (the liquid side).
int regionTP(double T, double P);

}  // namespace heatchain::if97
