// IF97 region 2 (vapour): Gibbs free energy as ideal-gas part plus residual
// part, eq. 15 of IAPWS R7-97(2012), and the supplementary equation for the
// metastable-vapour region, eq. 18.
#include <cmath>

#include "models/if97_detail.hpp"

namespace heatchain::if97 {
namespace {
using detail::Term;

struct IdealTerm {
    int J;
    double n;
};

// IAPWS R7-97(2012), Table 10: J°_i, n°_i of the ideal-gas part, eq. 16.
// Verified by Table 15.
constexpr IdealTerm kIdeal[9] = {
    {0, -0.96927686500217e1}, {1, 0.10086655968018e2},  {-5, -0.56087911283020e-2},
    {-4, 0.71452738081455e-1}, {-3, -0.40710498223928}, {-2, 0.14240819171444e1},
    {-1, -0.43839511319450e1}, {2, -0.28408632460772},  {3, 0.21268463753307e-1},
};

// IAPWS R7-97(2012), Table 11: I_i, J_i, n_i of the residual part, eq. 17.
// Verified by Table 15.
constexpr Term kResidual[43] = {
    {1, 0, -0.17731742473213e-2},  {1, 1, -0.17834862292358e-1},  {1, 2, -0.45996013696365e-1},
    {1, 3, -0.57581259083432e-1},  {1, 6, -0.50325278727930e-1},  {2, 1, -0.33032641670203e-4},
    {2, 2, -0.18948987516315e-3},  {2, 4, -0.39392777243355e-2},  {2, 7, -0.43797295650573e-1},
    {2, 36, -0.26674547914087e-4}, {3, 0, 0.20481737692309e-7},   {3, 1, 0.43870667284435e-6},
    {3, 3, -0.32277677238570e-4},  {3, 6, -0.15033924542148e-2},  {3, 35, -0.40668253562649e-1},
    {4, 1, -0.78847309559367e-9},  {4, 2, 0.12790717852285e-7},   {4, 3, 0.48225372718507e-6},
    {5, 7, 0.22922076337661e-5},   {6, 3, -0.16714766451061e-10}, {6, 16, -0.21171472321355e-2},
    {6, 35, -0.23895741934104e2},  {7, 0, -0.59059564324270e-17}, {7, 11, -0.12621808899101e-5},
    {7, 25, -0.38946842435739e-1}, {8, 8, 0.11256211360459e-10},  {8, 36, -0.82311340897998e1},
    {9, 13, 0.19809712802088e-7},  {10, 4, 0.10406965210174e-18}, {10, 10, -0.10234747095929e-12},
    {10, 14, -0.10018179379511e-8}, {16, 29, -0.80882908646985e-10}, {16, 50, 0.10693031879409},
    {18, 57, -0.33662250574171},   {20, 20, 0.89185845355421e-24}, {20, 35, 0.30629316876232e-12},
    {20, 48, -0.42002467698208e-5}, {21, 21, -0.59056029685639e-25}, {22, 53, 0.37826947613457e-5},
    {23, 39, -0.12768608934681e-14}, {24, 26, 0.73087610595061e-28}, {24, 40, 0.55414715350778e-16},
    {24, 58, -0.94369707241210e-6},
};

// IAPWS R7-97(2012), Table 17: residual part of the metastable-vapour
// equation, eq. 19. Verified by Table 18.
constexpr Term kMetaResidual[13] = {
    {1, 0, -0.73362260186506e-2}, {1, 2, -0.88223831943146e-1}, {1, 5, -0.72334555213245e-1},
    {1, 11, -0.40813178534455e-2}, {2, 1, 0.20097803380207e-2}, {2, 7, -0.53045921898642e-1},
    {2, 16, -0.76190409086970e-2}, {3, 4, -0.63498037657313e-2}, {3, 16, -0.86043093028588e-1},
    {4, 7, 0.75321581522770e-2},  {4, 10, -0.79238375446139e-2}, {5, 9, -0.22888160778447e-3},
    {5, 10, -0.26456501482810e-2},
};

// Table 16 of R7-97(2012): the metastable equation's ideal-gas part uses
// Table 10 except for n°_1 and n°_2.
constexpr double kMetaN01 = -0.96937268393049e1;
constexpr double kMetaN02 = 0.10087275970006e2;

// Reducing quantities of eq. 15: p* = 1 MPa, T* = 540 K.
constexpr double kPstar = 1e6;
constexpr double kTstar = 540.0;

// Eq. 15's reduced variables, eq. 16's ideal-gas part with its tau
// derivatives (n01, n02 as given: the metastable-vapour form has its own),
// and the power tables of pi and y = tau − 0.5 for eq. 17's residual part.
template <int MaxI, int MaxJ>
struct Reduced {
    double pi, tau, y;
    double g0, g0t, g0tt;
    detail::PowTable<0, MaxI> pp;
    detail::PowTable<0, MaxJ> py;

    Reduced(double T, double P, double n01, double n02)
        : pi(P / kPstar), tau(kTstar / T), y(tau - 0.5), g0(std::log(pi)), g0t(0), g0tt(0), pp(pi), py(y) {
        const detail::PowTable<-7, 3> pt(tau);
        for (int i = 0; i < 9; ++i) {
            const double n = i == 0 ? n01 : (i == 1 ? n02 : kIdeal[i].n);
            const int J = kIdeal[i].J;
            g0 += n * pt[J];
            g0t += n * J * pt[J - 1];
            g0tt += n * J * (J - 1) * pt[J - 2];
        }
    }
};

template <const auto& Res, int MaxI, int MaxJ>
Props evaluate(double T, double P, double n01, double n02) {
    const Reduced<MaxI, MaxJ> r(T, P, n01, n02);
    const detail::SeriesSums m = detail::seriesSums<Res>(r.pp, r.py);
    const double pi = r.pi, y = r.y;
    detail::Gamma G;
    G.g = r.g0 + m.S;
    G.gp = 1.0 / pi + m.SI / pi;
    G.gpp = -1.0 / (pi * pi) + m.SII / (pi * pi);
    G.gt = r.g0t + m.SJ / y;
    G.gtt = r.g0tt + m.SJJ / (y * y);
    G.gpt = m.SIJ / (pi * y);
    return detail::propsFromGamma(T, P, pi, r.tau, G);
}

// h and s alone, written as evaluate() and propsFromGamma write them.
template <const auto& Res, int MaxI, int MaxJ>
HS evaluateHS(double T, double P, double n01, double n02) {
    const Reduced<MaxI, MaxJ> r(T, P, n01, n02);
    double S, SJ;
    detail::seriesSumsHS<Res>(r.pp, r.py, S, SJ);
    const double g = r.g0 + S;
    const double gt = r.g0t + SJ / r.y;
    const double RT = R * T;
    return {RT * r.tau * gt, R * (r.tau * gt - g)};
}

// h, s and cp alone, written as evaluate() and propsFromGamma write them.
template <const auto& Res, int MaxI, int MaxJ>
HSCp evaluateHSCp(double T, double P, double n01, double n02) {
    const Reduced<MaxI, MaxJ> r(T, P, n01, n02);
    const detail::SeriesSums m = detail::seriesSumsHSCp<Res>(r.pp, r.py);
    detail::Gamma G;
    G.g = r.g0 + m.S;
    G.gt = r.g0t + m.SJ / r.y;
    G.gtt = r.g0tt + m.SJJ / (r.y * r.y);
    return detail::hsCpFromGamma(T, r.tau, G);
}

}  // namespace

HSCp region2HSCp(double T, double P) {
    return evaluateHSCp<kResidual, 24, 58>(T, P, kIdeal[0].n, kIdeal[1].n);
}

Props region2(double T, double P) {
    return evaluate<kResidual, 24, 58>(T, P, kIdeal[0].n, kIdeal[1].n);
}

HS region2HS(double T, double P) {
    return evaluateHS<kResidual, 24, 58>(T, P, kIdeal[0].n, kIdeal[1].n);
}

Props region2Metastable(double T, double P) {
    return evaluate<kMetaResidual, 5, 16>(T, P, kMetaN01, kMetaN02);
}

}  // namespace heatchain::if97
