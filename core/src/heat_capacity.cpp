#include "heatchain/heat_capacity.hpp"

#include <algorithm>
#include <cmath>
#include <string>

#include <Eigen/Dense>

namespace heatchain {
namespace {

// Antiderivatives of one piece's own formula (no offsets, no clamping).
//   Polynomial: ∫ Σ c_k T^k dT = Σ c_k T^(k+1)/(k+1);  ∫ cp/T dT = c0 ln T + Σ_{k≥1} c_k T^k / k.
//   Shomate (NIST WebBook / NIST-JANAF form, t = T/1000 K):
//     ∫ cp dT = 1000 (A t + B t²/2 + C t³/3 + D t⁴/4 − E/t)
//     ∫ cp/T dT = A ln t + B t + C t²/2 + D t³/3 − E/(2 t²)
double rawCp(const HeatCapacity::Piece& p, double T) {
    switch (p.form) {
        case HeatCapacity::Form::Constant:
            return p.c.empty() ? 0.0 : p.c[0];
        case HeatCapacity::Form::Polynomial: {
            double sum = 0.0;  // Horner
            for (auto it = p.c.rbegin(); it != p.c.rend(); ++it) sum = sum * T + *it;
            return sum;
        }
        case HeatCapacity::Form::Shomate: {
            const double t = T / 1000.0;
            return p.c[0] + t * (p.c[1] + t * (p.c[2] + t * p.c[3])) + p.c[4] / (t * t);
        }
    }
    return 0.0;
}

double rawEnthalpy(const HeatCapacity::Piece& p, double T) {
    switch (p.form) {
        case HeatCapacity::Form::Constant:
            return (p.c.empty() ? 0.0 : p.c[0]) * T;
        case HeatCapacity::Form::Polynomial: {
            double sum = 0.0;
            for (std::size_t k = p.c.size(); k-- > 0;) sum = sum * T + p.c[k] / double(k + 1);
            return sum * T;
        }
        case HeatCapacity::Form::Shomate: {
            const double t = T / 1000.0;
            return 1000.0 * (t * (p.c[0] + t * (p.c[1] / 2 + t * (p.c[2] / 3 + t * p.c[3] / 4))) - p.c[4] / t);
        }
    }
    return 0.0;
}

double rawEntropy(const HeatCapacity::Piece& p, double T) {
    switch (p.form) {
        case HeatCapacity::Form::Constant:
            return (p.c.empty() ? 0.0 : p.c[0]) * std::log(T);
        case HeatCapacity::Form::Polynomial: {
            double sum = 0.0;
            for (std::size_t k = p.c.size(); k-- > 1;) sum = sum * T + p.c[k] / double(k);
            return p.c.empty() ? 0.0 : p.c[0] * std::log(T) + sum * T;
        }
        case HeatCapacity::Form::Shomate: {
            const double t = T / 1000.0;
            return p.c[0] * std::log(t) + t * (p.c[1] + t * (p.c[2] / 2 + t * p.c[3] / 3)) -
                   p.c[4] / (2 * t * t);
        }
    }
    return 0.0;
}

std::size_t expectedCoefficients(HeatCapacity::Form f) {
    switch (f) {
        case HeatCapacity::Form::Constant: return 1;
        case HeatCapacity::Form::Shomate: return 5;
        case HeatCapacity::Form::Polynomial: return 0;  // any number ≥ 1
    }
    return 0;
}

}  // namespace

HeatCapacity HeatCapacity::constant(double cp, double Tmin, double Tmax) {
    HeatCapacity out;
    Piece p;
    p.Tmin = Tmin;
    p.Tmax = Tmax;
    p.form = Form::Constant;
    p.c = {cp};
    out.pieces_.push_back(p);
    // Offsets put the zero of enthalpy and entropy at the reference temperature.
    out.pieces_[0].hOffset = -rawEnthalpy(p, referenceTemperature);
    out.pieces_[0].sOffset = -rawEntropy(p, referenceTemperature);
    return out;
}

Result<HeatCapacity> HeatCapacity::fromPieces(std::vector<Piece> pieces) {
    if (pieces.empty()) return makeError("a heat capacity needs at least one piece");
    for (std::size_t i = 0; i < pieces.size(); ++i) {
        auto& p = pieces[i];
        const std::string where = "pieces[" + std::to_string(i) + "]";
        const std::size_t n = expectedCoefficients(p.form);
        if ((n != 0 && p.c.size() != n) || p.c.empty())
            return makeError("wrong number of coefficients (" + std::to_string(p.c.size()) + ")", where);
        for (double c : p.c)
            if (!std::isfinite(c)) return makeError("a coefficient is not a finite number", where);
        if (!(p.Tmin < p.Tmax) || std::isnan(p.Tmin) || std::isnan(p.Tmax))
            return makeError("Tmin must be below Tmax", where);
        if (p.form == Form::Shomate && !(p.Tmin > 0))
            return makeError("a Shomate piece needs Tmin > 0 K (it has a 1/T² term)", where);
        if (i > 0) {
            const double prevMax = pieces[i - 1].Tmax;
            // Published pieces meet at a shared boundary; allow only rounding.
            if (std::abs(p.Tmin - prevMax) > 1e-9 * std::max(1.0, prevMax))
                return makeError("pieces must be contiguous: Tmin " + std::to_string(p.Tmin) +
                                     " K does not meet the previous Tmax " + std::to_string(prevMax) + " K",
                                 where);
            p.Tmin = prevMax;
        }
    }
    HeatCapacity out;
    out.pieces_ = std::move(pieces);
    // Continuity of ∫cp dT and ∫cp/T dT at every internal boundary.
    auto& ps = out.pieces_;
    ps[0].hOffset = 0.0;
    ps[0].sOffset = 0.0;
    for (std::size_t i = 1; i < ps.size(); ++i) {
        const double Tb = ps[i].Tmin;
        ps[i].hOffset = ps[i - 1].hOffset + rawEnthalpy(ps[i - 1], Tb) - rawEnthalpy(ps[i], Tb);
        ps[i].sOffset = ps[i - 1].sOffset + rawEntropy(ps[i - 1], Tb) - rawEntropy(ps[i], Tb);
    }
    // Then shift all so that both integrals vanish at the reference temperature.
    const double h0 = out.enthalpy(referenceTemperature);
    const double s0 = out.entropy(referenceTemperature);
    for (auto& p : ps) {
        p.hOffset -= h0;
        p.sOffset -= s0;
    }
    for (std::size_t i = 0; i < ps.size(); ++i) {
        const double lo = ps[i].Tmin > 0 ? out.cp(ps[i].Tmin) : ps[i].c[0];
        const double hi = std::isfinite(ps[i].Tmax) ? out.cp(ps[i].Tmax) : lo;
        if (!(lo > 0) || !(hi > 0))
            return makeError("the heat capacity is not positive at the ends of its range",
                             "pieces[" + std::to_string(i) + "]");
    }
    return out;
}

Result<HeatCapacity> HeatCapacity::fitTable(std::span<const double> T, std::span<const double> cp, int degree) {
    if (T.size() != cp.size())
        return makeError("the table has " + std::to_string(T.size()) + " temperatures but " +
                         std::to_string(cp.size()) + " heat capacities");
    if (T.empty()) return makeError("the table is empty");
    if (degree < 0) return makeError("the fit degree must not be negative");
    std::vector<double> sorted(T.begin(), T.end());
    for (std::size_t i = 0; i < T.size(); ++i) {
        if (!std::isfinite(T[i]) || !(T[i] > 0))
            return makeError("temperature " + std::to_string(i) + " is not a positive absolute temperature");
        if (!std::isfinite(cp[i]) || !(cp[i] > 0))
            return makeError("heat capacity " + std::to_string(i) + " is not positive");
    }
    std::sort(sorted.begin(), sorted.end());
    const auto distinct = std::unique(sorted.begin(), sorted.end()) - sorted.begin();
    // A polynomial of degree d needs d + 1 distinct points.
    degree = std::min<int>(degree, int(distinct) - 1);

    // Columns are powers of T / Tscale (values of order one) so the normal
    // problem stays well conditioned; coefficients are rescaled afterwards.
    const double Tscale = sorted.back();
    const Eigen::Index n = Eigen::Index(T.size());
    Eigen::MatrixXd A(n, degree + 1);
    Eigen::VectorXd b(n);
    for (Eigen::Index i = 0; i < n; ++i) {
        double x = 1.0;
        for (int k = 0; k <= degree; ++k) {
            A(i, k) = x;
            x *= T[std::size_t(i)] / Tscale;
        }
        b(i) = cp[std::size_t(i)];
    }
    const Eigen::VectorXd a = A.colPivHouseholderQr().solve(b);
    const Eigen::VectorXd r = A * a - b;

    Piece p;
    p.form = Form::Polynomial;
    p.Tmin = sorted.front();
    p.Tmax = sorted.back();
    if (p.Tmin == p.Tmax) {
        // One temperature only: a constant, valid at that temperature.
        p.Tmax = p.Tmin * (1 + 1e-12);
    }
    double scale = 1.0;
    for (int k = 0; k <= degree; ++k) {
        p.c.push_back(a(k) / scale);
        scale *= Tscale;
    }
    auto out = fromPieces({p});
    if (!out) return makeError("the fitted polynomial " + out.error().message);
    out->fitResidual_ = std::sqrt(r.squaredNorm() / double(n));
    return out;
}

// Outside the outermost pieces cp is held at its boundary value: a published
// correlation is not extrapolated (a Shomate 1/T² term or a fitted quadratic can
// turn negative far from its data). Models flag such states WarnCpExtrapolated.
const HeatCapacity::Piece& HeatCapacity::pieceFor(double T) const {
    for (const auto& p : pieces_)
        if (T <= p.Tmax) return p;
    return pieces_.back();
}

double HeatCapacity::cp(double T) const {
    if (pieces_.empty()) return 0.0;
    const double Tc = std::clamp(T, Tmin(), Tmax());
    return rawCp(pieceFor(Tc), Tc);
}

// h or s at T: the fitted integral inside [Tmin, Tmax]; beyond it, the end's
// cp held constant, dh = cp dT and ds = cp dT / T (`beyond` gives the factor
// of cp from the range's end Tc to T).
template <class Raw, class Beyond>
double HeatCapacity::integral(double T, Raw raw, double Piece::*offset, Beyond beyond) const {
    if (pieces_.empty()) return 0.0;
    const double Tc = std::clamp(T, Tmin(), Tmax());
    const auto& p = pieceFor(Tc);
    double v = raw(p, Tc) + p.*offset;
    if (T != Tc) v += cp(Tc) * beyond(T, Tc);
    return v;
}

double HeatCapacity::enthalpy(double T) const {
    return integral(T, rawEnthalpy, &Piece::hOffset, [](double t, double tc) { return t - tc; });
}

double HeatCapacity::entropy(double T) const {
    return integral(T, rawEntropy, &Piece::sOffset, [](double t, double tc) { return std::log(t / tc); });
}

bool HeatCapacity::isConstant() const {
    return pieces_.size() == 1 && pieces_[0].form == Form::Constant;
}

double HeatCapacity::Tmin() const { return pieces_.empty() ? 0.0 : pieces_.front().Tmin; }
double HeatCapacity::Tmax() const {
    return pieces_.empty() ? std::numeric_limits<double>::infinity() : pieces_.back().Tmax;
}

}  // namespace heatchain
