// Tests of heatchain/heat_capacity.hpp: the closed-form integrals against an
// independent quadrature written here, continuity across pieces, and the
// least-squares table fit.
#include "heatchain/heat_capacity.hpp"

#include <cmath>
#include <functional>
#include <vector>

#include <gtest/gtest.h>

namespace heatchain {
namespace {

// Composite Gauss–Legendre quadrature (5 points a panel), written here so the
// check does not share code with the antiderivatives under test.
double integrate(const std::function<double(double)>& f, double a, double b, int panels = 400) {
    static const double x[5] = {0.0, -0.5384693101056831, 0.5384693101056831, -0.9061798459386640,
                                0.9061798459386640};
    static const double w[5] = {0.5688888888888889, 0.4786286704993665, 0.4786286704993665,
                                0.2369268850561891, 0.2369268850561891};
    const double hpanel = (b - a) / panels;
    double sum = 0;
    for (int i = 0; i < panels; ++i) {
        const double mid = a + (i + 0.5) * hpanel;
        for (int k = 0; k < 5; ++k) sum += w[k] * f(mid + 0.5 * hpanel * x[k]);
    }
    return sum * 0.5 * hpanel;
}

// Nitrogen, ideal gas, Shomate coefficients in J/(mol K), t = T/1000 K:
// NIST Chemistry WebBook, "Nitrogen", gas phase heat capacity (Shomate
// equation), pieces 100–500 K and 500–2000 K (after Chase, NIST-JANAF
// Thermochemical Tables, 4th ed., 1998). Typed from memory.
constexpr double kMolarMassN2 = 0.0280134;  // kg/mol, IUPAC atomic weights (from memory)
constexpr double kN2Low[5] = {28.98641, 1.853978, -9.647459, 16.63537, 0.000117};
constexpr double kN2High[5] = {19.50583, 19.88705, -8.598535, 1.369784, 0.527601};

// The Shomate form written out independently: cp in J/(kg K).
double shomateCp(const double* c, double T) {
    const double t = T / 1000.0;
    return (c[0] + c[1] * t + c[2] * t * t + c[3] * t * t * t + c[4] / (t * t)) / kMolarMassN2;
}
double nitrogenCp(double T) { return shomateCp(T <= 500.0 ? kN2Low : kN2High, T); }

HeatCapacity nitrogenVapour() {
    std::vector<HeatCapacity::Piece> pieces(2);
    pieces[0].Tmin = 100;
    pieces[0].Tmax = 500;
    pieces[1].Tmin = 500;
    pieces[1].Tmax = 2000;
    for (int i = 0; i < 2; ++i) {
        pieces[i].form = HeatCapacity::Form::Shomate;
        const double* c = i == 0 ? kN2Low : kN2High;
        for (int k = 0; k < 5; ++k) pieces[i].c.push_back(c[k] / kMolarMassN2);
    }
    auto r = HeatCapacity::fromPieces(pieces);
    EXPECT_TRUE(r.ok()) << (r.ok() ? "" : r.error().text());
    return r.ok() ? r.value() : HeatCapacity{};
}

TEST(HeatCapacity, ShomateMatchesJanafAt298K) {
    // NIST-JANAF Thermochemical Tables, 4th ed. (1998), N2 (ref. state):
    // Cp(298.15 K) = 29.124 J/(mol K) (from memory).
    const auto hc = nitrogenVapour();
    EXPECT_NEAR(hc.cp(298.15) * kMolarMassN2, 29.124, 0.002);
}

TEST(HeatCapacity, ShomateIntegralsMatchQuadrature) {
    const auto hc = nitrogenVapour();
    const double pairs[][2] = {{150, 450}, {298.15, 1000}, {450, 1800}, {120, 1990}};
    for (const auto& pr : pairs) {
        const double dh = integrate(nitrogenCp, pr[0], pr[1]);
        const double ds = integrate([](double T) { return nitrogenCp(T) / T; }, pr[0], pr[1]);
        // Split the quadrature at the piece boundary when the interval crosses it.
        double dhSplit = dh, dsSplit = ds;
        if (pr[0] < 500 && pr[1] > 500) {
            dhSplit = integrate(nitrogenCp, pr[0], 500) + integrate(nitrogenCp, 500, pr[1]);
            dsSplit = integrate([](double T) { return nitrogenCp(T) / T; }, pr[0], 500) +
                      integrate([](double T) { return nitrogenCp(T) / T; }, 500, pr[1]);
        }
        EXPECT_NEAR(hc.enthalpy(pr[1]) - hc.enthalpy(pr[0]), dhSplit, 1e-9 * std::abs(dhSplit));
        EXPECT_NEAR(hc.entropy(pr[1]) - hc.entropy(pr[0]), dsSplit, 1e-9 * std::abs(dsSplit));
    }
}

TEST(HeatCapacity, ZeroAtReferenceTemperature) {
    const auto hc = nitrogenVapour();
    EXPECT_NEAR(hc.enthalpy(HeatCapacity::referenceTemperature), 0.0, 1e-9);
    EXPECT_NEAR(hc.entropy(HeatCapacity::referenceTemperature), 0.0, 1e-12);
}

TEST(HeatCapacity, ContinuousAcrossPieces) {
    const auto hc = nitrogenVapour();
    const double eps = 1e-7;
    // Enthalpy and entropy are continuous by construction (integration constants).
    EXPECT_NEAR(hc.enthalpy(500 + eps) - hc.enthalpy(500 - eps), 2 * eps * hc.cp(500), 1e-6);
    EXPECT_NEAR(hc.entropy(500 + eps) - hc.entropy(500 - eps), 2 * eps * hc.cp(500) / 500, 1e-9);
    // The two published pieces nearly agree in cp at 500 K (NIST WebBook values above).
    EXPECT_NEAR(hc.cp(500 + eps), hc.cp(500 - eps), 1e-3 * hc.cp(500));
}

TEST(HeatCapacity, HeldFlatOutsideRange) {
    const auto hc = nitrogenVapour();
    EXPECT_DOUBLE_EQ(hc.cp(50), hc.cp(100));
    EXPECT_DOUBLE_EQ(hc.cp(3000), hc.cp(2000));
    // ∫cp dT beyond the range: cp(Tmax) (T − Tmax) on top of the value at Tmax.
    EXPECT_NEAR(hc.enthalpy(2500) - hc.enthalpy(2000), hc.cp(2000) * 500, 1e-9 * hc.cp(2000) * 500);
    EXPECT_NEAR(hc.entropy(50) - hc.entropy(100), hc.cp(100) * std::log(0.5), 1e-12 * hc.cp(100));
    EXPECT_FALSE(hc.inRange(50));
    EXPECT_TRUE(hc.inRange(700));
}

TEST(HeatCapacity, ConstantClosedForm) {
    // Closed form of the constant-cp model: Δh = cp ΔT, Δs = cp ln(T2/T1).
    const double cp = 4184.0;
    const auto hc = HeatCapacity::constant(cp);
    EXPECT_TRUE(hc.isConstant());
    EXPECT_NEAR(hc.enthalpy(373.15) - hc.enthalpy(273.15), cp * 100.0, 1e-12 * cp * 100);
    EXPECT_NEAR(hc.entropy(373.15) - hc.entropy(273.15), cp * std::log(373.15 / 273.15), 1e-12 * cp);
}

TEST(HeatCapacity, PolynomialIntegralsMatchQuadrature) {
    HeatCapacity::Piece p;
    p.form = HeatCapacity::Form::Polynomial;
    p.Tmin = 200;
    p.Tmax = 800;
    p.c = {1200.0, 0.8, -4e-4, 1.5e-7};  // an invented cubic for the arithmetic only
    auto hc = HeatCapacity::fromPieces({p});
    ASSERT_TRUE(hc.ok()) << hc.error().text();
    auto f = [](double T) { return 1200.0 + 0.8 * T - 4e-4 * T * T + 1.5e-7 * T * T * T; };
    const double dh = integrate(f, 250, 780), ds = integrate([&](double T) { return f(T) / T; }, 250, 780);
    EXPECT_NEAR(hc->enthalpy(780) - hc->enthalpy(250), dh, 1e-10 * dh);
    EXPECT_NEAR(hc->entropy(780) - hc->entropy(250), ds, 1e-10 * ds);
}

TEST(HeatCapacity, PiecesMustBeContiguous) {
    HeatCapacity::Piece a, b;
    a.form = b.form = HeatCapacity::Form::Constant;
    a.c = {1000};
    b.c = {1100};
    a.Tmin = 100;
    a.Tmax = 300;
    b.Tmin = 310;
    b.Tmax = 500;
    auto r = HeatCapacity::fromPieces({a, b});
    ASSERT_FALSE(r.ok());
    EXPECT_EQ(r.error().where, "pieces[1]");
    HeatCapacity::Piece bad;
    bad.form = HeatCapacity::Form::Shomate;
    bad.c = {1, 2, 3};
    bad.Tmin = 300;
    bad.Tmax = 400;
    EXPECT_FALSE(HeatCapacity::fromPieces({bad}).ok());
}

TEST(HeatCapacity, FitOfExactQuadraticHasNoResidual) {
    // cp = 1800 + 2.5 T − 1.2e-3 T² sampled exactly: the fit must return it.
    std::vector<double> T, cp;
    for (double t = 300; t <= 500; t += 20) {
        T.push_back(t);
        cp.push_back(1800 + 2.5 * t - 1.2e-3 * t * t);
    }
    auto hc = HeatCapacity::fitTable(T, cp);
    ASSERT_TRUE(hc.ok()) << hc.error().text();
    EXPECT_LT(hc->fitResidual(), 1e-9);
    for (double t : {300.0, 377.0, 500.0}) EXPECT_NEAR(hc->cp(t), 1800 + 2.5 * t - 1.2e-3 * t * t, 1e-8);
    EXPECT_DOUBLE_EQ(hc->Tmin(), 300);
    EXPECT_DOUBLE_EQ(hc->Tmax(), 500);
}

TEST(HeatCapacity, FitOfNoisyDataReportsTheNoise) {
    // Noise built orthogonal to 1, T, T² (Gram–Schmidt here): the least-squares
    // fit then recovers the quadratic exactly and the RMS residual equals the
    // RMS of the noise, a number known before the fit.
    const int n = 9;
    std::vector<double> T(n), e(n);
    for (int i = 0; i < n; ++i) {
        T[i] = 330 + 15.0 * i;
        e[i] = (i % 3 == 0 ? 7.0 : (i % 3 == 1 ? -4.0 : 2.5)) + 0.3 * i;
    }
    std::vector<std::vector<double>> basis;
    for (int k = 0; k < 3; ++k) {
        std::vector<double> q(n);
        for (int i = 0; i < n; ++i) q[i] = std::pow(T[i] / 400.0, k);
        for (const auto& b : basis) {
            double d = 0;
            for (int i = 0; i < n; ++i) d += q[i] * b[i];
            for (int i = 0; i < n; ++i) q[i] -= d * b[i];
        }
        double norm = 0;
        for (double x : q) norm += x * x;
        for (double& x : q) x /= std::sqrt(norm);
        basis.push_back(q);
    }
    for (const auto& b : basis) {
        double d = 0;
        for (int i = 0; i < n; ++i) d += e[i] * b[i];
        for (int i = 0; i < n; ++i) e[i] -= d * b[i];
    }
    double rms = 0;
    for (double x : e) rms += x * x;
    rms = std::sqrt(rms / n);
    ASSERT_GT(rms, 1.0);
    std::vector<double> cp(n);
    for (int i = 0; i < n; ++i) cp[i] = 2100 + 1.1 * T[i] + 4e-4 * T[i] * T[i] + e[i];
    auto hc = HeatCapacity::fitTable(T, cp);
    ASSERT_TRUE(hc.ok()) << hc.error().text();
    EXPECT_NEAR(hc->fitResidual(), rms, 1e-9 * rms);
    EXPECT_NEAR(hc->cp(400), 2100 + 1.1 * 400 + 4e-4 * 160000, 1e-8);
}

TEST(HeatCapacity, FitReducesDegreeForFewPoints) {
    // Two points: a straight line through both (project-format.md, "fitted to a polynomial").
    std::vector<double> T{300, 400}, cp{2000, 2200};
    auto hc = HeatCapacity::fitTable(T, cp);
    ASSERT_TRUE(hc.ok());
    EXPECT_NEAR(hc->cp(350), 2100, 1e-9);
    EXPECT_NEAR(hc->fitResidual(), 0.0, 1e-9);
    std::vector<double> one{300};
    std::vector<double> cpOne{1500};
    auto c = HeatCapacity::fitTable(one, cpOne);
    ASSERT_TRUE(c.ok());
    EXPECT_NEAR(c->cp(500), 1500, 1e-9);
}

TEST(HeatCapacity, FitRejectsBadTables) {
    std::vector<double> T{300, 400, 500}, cp{2000, 2200};
    EXPECT_FALSE(HeatCapacity::fitTable(T, cp).ok());
    std::vector<double> cpNeg{2000, -1, 2100};
    EXPECT_FALSE(HeatCapacity::fitTable(T, cpNeg).ok());
    std::vector<double> none;
    EXPECT_FALSE(HeatCapacity::fitTable(none, none).ok());
}

}  // namespace
}  // namespace heatchain
