// IF97 region 1 (compressed liquid): Gibbs free energy, eq. 7 of IAPWS
// R7-97(2012), and its backward equations T(p,h) (eq. 11) and T(p,s) (eq. 13).
#include "models/if97_detail.hpp"

namespace heatchain::if97 {
namespace {
using detail::Term;

// IAPWS R7-97(2012), Table 2: I_i, J_i, n_i of eq. 7. Verified by Table 5.
constexpr Term kRegion1[34] = {
    {0, -2, 0.14632971213167},     {0, -1, -0.84548187169114},    {0, 0, -0.37563603672040e1},
    {0, 1, 0.33855169168385e1},    {0, 2, -0.95791963387872},     {0, 3, 0.15772038513228},
    {0, 4, -0.16616417199501e-1},  {0, 5, 0.81214629983568e-3},   {1, -9, 0.28319080123804e-3},
    {1, -7, -0.60706301565874e-3}, {1, -1, -0.18990068218419e-1}, {1, 0, -0.32529748770505e-1},
    {1, 1, -0.21841717175414e-1},  {1, 3, -0.52838357969930e-4},  {2, -3, -0.47184321073267e-3},
    {2, 0, -0.30001780793026e-3},  {2, 1, 0.47661393906987e-4},   {2, 3, -0.44141845330846e-5},
    {2, 17, -0.72694996297594e-15}, {3, -4, -0.31679644845054e-4}, {3, 0, -0.28270797985312e-5},
    {3, 6, -0.85205128120103e-9},  {4, -5, -0.22425281908000e-5}, {4, -2, -0.65171222895601e-6},
    {4, 10, -0.14341729937924e-12}, {5, -8, -0.40516996860117e-6}, {8, -11, -0.12734301741641e-8},
    {8, -6, -0.17424871230634e-9}, {21, -29, -0.68762131295531e-18}, {23, -31, 0.14478307828521e-19},
    {29, -38, 0.26335781662795e-22}, {30, -39, -0.11947622640071e-22}, {31, -40, 0.18228094581404e-23},
    {32, -41, -0.93537087292458e-25},
};

// IAPWS R7-97(2012), Table 6: eq. 11, T(p,h). Verified by Table 7.
constexpr Term kBackTph[20] = {
    {0, 0, -0.23872489924521e3}, {0, 1, 0.40421188637945e3},   {0, 2, 0.11349746881718e3},
    {0, 6, -0.58457616048039e1}, {0, 22, -0.15285482413140e-3}, {0, 32, -0.10866707695377e-5},
    {1, 0, -0.13391744872602e2}, {1, 1, 0.43211039183559e2},   {1, 2, -0.54010067170506e2},
    {1, 3, 0.30535892203916e2},  {1, 4, -0.65964749423638e1},  {1, 10, 0.93965400878363e-2},
    {1, 32, 0.11573647505340e-6}, {2, 10, -0.25858641282073e-4}, {2, 32, -0.40644363084799e-8},
    {3, 10, 0.66456186191635e-7}, {3, 32, 0.80670734103027e-10}, {4, 32, -0.93477771213947e-12},
    {5, 32, 0.58265442020601e-14}, {6, 32, -0.15020185953503e-16},
};

// IAPWS R7-97(2012), Table 8: eq. 13, T(p,s). Verified by Table 9.
constexpr Term kBackTps[20] = {
    {0, 0, 0.17478268058307e3},   {0, 1, 0.34806930892873e2},   {0, 2, 0.65292584978455e1},
    {0, 3, 0.33039981775489},     {0, 11, -0.19281382923196e-6}, {0, 31, -0.24909197244573e-22},
    {1, 0, -0.26107636489332},    {1, 1, 0.22592965981586},     {1, 2, -0.64256463395226e-1},
    {1, 3, 0.78876289270526e-2},  {1, 12, 0.35672110607366e-9}, {1, 31, 0.17332496994895e-23},
    {2, 0, 0.56608900654837e-3},  {2, 1, -0.32635483139717e-3}, {2, 2, 0.44778286690632e-4},
    {2, 9, -0.51322156908507e-9}, {2, 31, -0.42522657042207e-25}, {3, 10, 0.26400441360689e-12},
    {3, 32, 0.78124600459723e-28}, {4, 32, -0.30732199903668e-30},
};

// Reducing quantities of eq. 7: p* = 16.53 MPa, T* = 1386 K.
constexpr double kPstar = 16.53e6;
constexpr double kTstar = 1386.0;

}  // namespace

namespace {

// Eq. 7's reduced variables and the power tables of x = 7.1 − pi and
// y = tau − 1.222 that every sum of Table 2 runs over.
struct Reduced {
    double pi, tau, x, y;
    detail::PowTable<0, 32> px;
    detail::PowTable<-41, 17> py;
    Reduced(double T, double P) : pi(P / kPstar), tau(kTstar / T), x(7.1 - pi), y(tau - 1.222), px(x), py(y) {}
};

}  // namespace

Props region1(double T, double P) {
    const Reduced r(T, P);
    const double x = r.x, y = r.y;
    // Sums of n x^I y^J weighted by the exponents; derivatives follow by
    // dividing by x or y (d/dpi of x^I is -I x^(I-1)).
    const detail::SeriesSums m = detail::seriesSums<kRegion1>(r.px, r.py);
    detail::Gamma G;
    G.g = m.S;
    G.gp = -m.SI / x;
    G.gpp = m.SII / (x * x);
    G.gt = m.SJ / y;
    G.gtt = m.SJJ / (y * y);
    G.gpt = -m.SIJ / (x * y);
    return detail::propsFromGamma(T, P, r.pi, r.tau, G);
}

HS region1HS(double T, double P) {
    const Reduced r(T, P);
    double S, SJ;
    detail::seriesSumsHS<kRegion1>(r.px, r.py, S, SJ);
    // Table 3: h = R T tau gamma_tau, s = R (tau gamma_tau − gamma),
    // written as propsFromGamma writes them.
    const double gt = SJ / r.y;
    const double RT = R * T;
    return {RT * r.tau * gt, R * (r.tau * gt - S)};
}

HSCp region1HSCp(double T, double P) {
    const Reduced r(T, P);
    const detail::SeriesSums m = detail::seriesSumsHSCp<kRegion1>(r.px, r.py);
    detail::Gamma G;
    G.g = m.S;
    G.gt = m.SJ / r.y;
    G.gtt = m.SJJ / (r.y * r.y);
    return detail::hsCpFromGamma(T, r.tau, G);
}

double region1T_ph(double P, double h) {
    const double pi = P / 1e6;               // p* = 1 MPa
    const double eta1 = h / 2500e3 + 1.0;    // h* = 2500 kJ/kg
    return detail::series<kBackTph, 0, 6, 0, 32>(pi, eta1);  // theta = T / T*, T* = 1 K
}

double region1T_ps(double P, double s) {
    const double pi = P / 1e6;          // p* = 1 MPa
    const double sig2 = s / 1e3 + 2.0;  // s* = 1 kJ/(kg K)
    return detail::series<kBackTps, 0, 4, 0, 32>(pi, sig2);
}

}  // namespace heatchain::if97
