#pragma once
// Ice Ih: the Gibbs function of IAPWS R10-06(2009) and the melting and
// sublimation curves of IAPWS R14-08(2011). SI units (K, Pa, J/kg, m3/kg).
//
// R10-06's Gibbs function is fixed so that liquid water at the triple point
// has u = 0 and s = 0 (the IAPWS-95 convention), which is also IF97's
// reference state: ice and IF97 liquid share one reference without offsets.

namespace heatchain::ice {

// Gibbs function and its first and second derivatives at (T, P).
struct Gibbs {
    double g = 0, gT = 0, gP = 0, gTT = 0, gTP = 0, gPP = 0;
};

struct Props {
    double T = 0, P = 0;
    double v = 0, h = 0, s = 0, u = 0, cp = 0, cv = 0, w = 0;
};

// R10-06(2009) eq. 1 with Table 2; valid 0 K < T ≤ 273.16 K, P ≤ 210 MPa.
Gibbs gibbs(double T, double P);
Props props(double T, double P);

inline constexpr double kMaxPressure = 210e6;  // R10-06(2009), Sec. 4: range of validity

// IAPWS R14-08(2011) curves.
// Ice Ih–liquid melting pressure, eq. 1; 251.165 K ≤ T ≤ 273.16 K.
double meltingPressure(double T);
// Sublimation pressure, eq. 6; 50 K ≤ T ≤ 273.16 K.
double sublimationPressure(double T);
// Inverses by Newton iteration on the same equations (bounded; NaN outside).
double meltingTemperature(double P);
double sublimationTemperature(double P);

// Range ends of the curves (R14-08(2011), Sec. 3 and 5).
inline constexpr double kMeltTmin = 251.165;  // ice Ih–ice III–liquid triple point
inline constexpr double kSublTmin = 50.0;
double meltingPressureMax();  // meltingPressure(251.165 K) ≈ 208.566 MPa

}  // namespace heatchain::ice
