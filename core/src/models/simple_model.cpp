// The simple models (ideal gas with incompressible condensed phases, and the
// generalised-virial variant): one class whose parts share its private phase
// tables and anchors. About 800 lines on purpose: building the anchors,
// each phase's state, the phase-change lines and the isobar cache all read the
// same private state, and splitting the class across files would expose it.
#include "heatchain/models/simple_model.hpp"

#include <algorithm>
#include <array>
#include <atomic>
#include <bit>
#include <cstdint>
#include <cmath>
#include <cstdio>
#include <memory>
#include <optional>
#include <string>

#include "heatchain/constants.hpp"
#include "heatchain/latent_heat.hpp"
#include "models/generalized_virial.hpp"
#include "numerics/root.hpp"

namespace heatchain {
namespace {

constexpr int kSolid = 0, kLiquid = 1, kVapor = 2;
constexpr int kMaxIterations = 100;

// Search bounds of the solver, not a claim of validity: states outside carry
// range flags, and cp outside a correlation's range is held flat (heat_capacity.cpp).
constexpr double kMinTemperature = 1.0;       // K
constexpr double kMaxTemperature = 6000.0;    // K, the upper end of the NIST-JANAF tables
constexpr double kMaxPressure = 100e6;        // Pa
// Distance from the melting anchor pressure beyond which a pressure-independent
// melting temperature is flagged (common practice: melting points move by
// roughly 0.1–1 K per 10 MPa for most substances).
constexpr double kMeltingLineSpan = 10e6;     // Pa
// An ideal-gas vapour is flagged where its compressibility factor, estimated
// by the generalised virial correlation (generalized_virial.hpp), departs
// from 1 by more than 2 %: there v, and h and s through their departures,
// are off by about that much, which is larger than the uncertainty of the
// heat-capacity data the model is built on (typically well under 1 %).
constexpr double kIdealGasDeparture = 0.02;
constexpr double kWatsonTolerance = 0.05;

std::string fmt(double x, const char* unit) {
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.6g %s", x, unit);
    return buf;
}

const char* phaseWord(int p) {
    switch (p) {
        case kSolid: return "solid";
        case kLiquid: return "liquid";
        default: return "vapour";
    }
}

// Static storage for State::source.
constexpr std::string_view kSourceText[2][4] = {
    {"constant heat capacity: incompressible solid", "constant heat capacity: incompressible liquid",
     "constant heat capacity: ideal gas", "constant heat capacity: ideal gas above the critical point"},
    {"temperature-dependent heat capacity: incompressible solid",
     "temperature-dependent heat capacity: incompressible liquid",
     "temperature-dependent heat capacity: ideal gas",
     "temperature-dependent heat capacity: ideal gas above the critical point"},
};

class SimpleModel final : public PropertyModel {
public:
    struct PhaseData {
        bool available = false;
        bool linked = false;
        std::string missing;  // why the phase is unavailable
        HeatCapacity cp;
        double a = 0;  // enthalpy constant, J/kg
        double b = 0;  // entropy constant, J/(kg K)
        // A constant cp (one constant piece) read once: inside its range
        // HeatCapacity gives c T + hOffset, c ln T + sOffset and c, and so do
        // the shortcuts below, term for term (the same numbers), without its
        // clamping and piece search.
        bool flat = false;
        double flatC = 0, flatH = 0, flatS = 0, flatTmin = 0, flatTmax = 0;
        double enthalpy(double T) const { return flat && T >= flatTmin && T <= flatTmax ? flatC * T + flatH : cp.enthalpy(T); }
        double entropy(double T) const {
            return flat && T >= flatTmin && T <= flatTmax ? flatC * std::log(T) + flatS : cp.entropy(T);
        }
        double heatCapacity(double T) const { return flat && T >= flatTmin && T <= flatTmax ? flatC : cp.cp(T); }
    };

    SimpleModel(Substance s, ModelKind kind) : sub_(std::move(s)), kind_(kind), id_(++modelCount) {}

    Status build();

    ModelKind kind() const override { return kind_; }
    std::string_view name() const override {
        return kind_ == ModelKind::ConstantCp ? "Constant heat capacity" : "Temperature-dependent heat capacity";
    }
    std::string rangeText() const override { return range_; }
    const Substance& substance() const override { return sub_; }
    std::string sourceText() const override {
        return "Incompressible condensed phases and ideal-gas vapour; phase lines from equal Gibbs "
               "energies (the Clausius–Clapeyron equation integrated exactly with the latent heat "
               "given by Kirchhoff's law); Watson relation (Watson 1943) as a cross-check of the "
               "latent heat.";
    }

    Result<State> phaseState(Phase phase, double T, double P) const override;
    Result<Phase> stablePhase(double T, double P) const override;
    Result<State> stateP(double P, Property which, double value) const override;
    TransitionsAtPressure transitionsAt(double P) const override { return isobar(P).tr; }
    Result<double> transitionTemperature(Transition t, double P) const override;
    Result<double> transitionPressure(Transition t, double T) const override;

    std::optional<std::pair<double, double>> criticalPoint() const override {
        if (!sub_.critical) return std::nullopt;
        return std::make_pair(sub_.critical->T, sub_.critical->P);
    }
    std::optional<std::pair<double, double>> triplePoint() const override {
        if (!hasTriple_) return std::nullopt;
        return std::make_pair(Tt_, Pt_);
    }

    double minTemperature() const override { return kMinTemperature; }
    double maxTemperature() const override { return kMaxTemperature; }
    double maxPressure() const override { return kMaxPressure; }

private:
    // Phase functions with the constants of the model.
    double H(int p, double T, double P) const {
        const auto& d = ph_[p];
        return d.a + d.enthalpy(T) + (p == kVapor ? 0.0 : v_ * (P - Pref_));
    }
    double S(int p, double T, double P) const {
        const auto& d = ph_[p];
        return d.b + d.entropy(T) - (p == kVapor ? R_ * std::log(P / Pref_) : 0.0);
    }
    double G(int p, double T, double P) const { return H(p, T, P) - T * S(p, T, P); }

    // Sets phase `to` so that it differs from the linked phase `from` by the
    // latent heat dh (to above from when dh > 0) at (T, P), with Δs = Δh/T.
    void link(int from, int to, double T, double P, double dhToMinusFrom);

    enum class LineOutcome { Found, PressureBelowLine, PressureAboveLine };
    struct LineT {
        LineOutcome outcome;
        double T;
    };
    // Temperature where g_lower = g_upper at pressure P, searched in [Tlo, Thi].
    LineT lineTemperature(int lower, int upper, double P, double Tlo, double Thi) const;
    // Pressure where the condensed phase `lower` and the vapour have equal g at T.
    Result<double> vapourLinePressure(int lower, double T) const;

    Status phaseAvailable(int p) const {
        if (ph_[p].available) return Ok{};
        return makeError(ph_[p].missing, sub_.id);
    }
    // The latent-heat cross-check of a vapour state at (T, P) against Watson.
    bool departsFromWatson(double T, double P) const;
    // Whether (T, P) is on the condensed side of the line between `lower`
    // (solid or liquid) and the vapour whose temperatures span [lo, hi].
    bool condensedSide(int lower, double T, double P, double lo, double hi) const;

    // The phase-change ends of one isobar, kept per thread in a small table
    // of recent pressures: an isobaric step asks hundreds of times at one P,
    // and a worksheet returns to the same few pressures (the points of a
    // compression curve recur in every cycle), so most asks find their ends
    // without the line search and the four end states being built again.
    struct Isobar {
        std::uint64_t model = 0;
        double P = -1;
        TransitionsAtPressure tr;
        std::array<std::array<State, 2>, 2> ends;  // [transition][lower, upper phase]
        bool ok = false;
    };
    const Isobar& isobar(double P) const;
    // The state of phase `ph` at P where `which` equals `value`, starting
    // from a state `from` of that phase on the same isobar; empty when it
    // does not converge or leaves [Tmin, Tmax].
    std::optional<State> invertOnIsobar(int p, double P, Property which, double value, const State& from,
                                        double Tmin, double Tmax) const;

    Substance sub_;
    ModelKind kind_;
    // Tells this model's cached isobar from another's (an address may be reused).
    static inline std::atomic<std::uint64_t> modelCount{0};
    std::uint64_t id_;
    std::array<PhaseData, 3> ph_;
    double R_ = 0;     // specific gas constant, J/(kg K)
    double v_ = 0;     // shared condensed specific volume, m3/kg
    double Pref_ = kStandardAtmosphere;
    bool hasMelting_ = false;
    double Tm_ = 0, Pm_ = 0;
    bool hasTriple_ = false;
    double Tt_ = 0, Pt_ = 0;
    double boilLo_ = kMinTemperature, boilHi_ = kMaxTemperature;  // boiling line search range
    double sublLo_ = kMinTemperature, sublHi_ = kMaxTemperature;  // sublimation line search range
    bool hasWatson_ = false;
    double watsonT1_ = 0, watsonDh1_ = 0;
    std::string range_;
};

void SimpleModel::link(int from, int to, double T, double P, double dh) {
    const double hTarget = H(from, T, P) + dh;
    const double sTarget = S(from, T, P) + dh / T;
    auto& d = ph_[to];
    d.a = 0;
    d.b = 0;
    d.a = hTarget - H(to, T, P);
    d.b = sTarget - S(to, T, P);
    d.linked = true;
}

Status SimpleModel::build() {
    const std::string where = sub_.id;
    if (!(sub_.molarMass > 0)) return makeError("the molar mass must be positive", where);
    R_ = sub_.gasConstant();
    const std::string origin = sub_.custom ? "in its definition" : "in the library";

    // Heat capacities, held constant in the constant-cp model at the phase's
    // anchor temperature (see simple_model.hpp).
    const double Tref = HeatCapacity::referenceTemperature;
    const std::optional<HeatCapacity>* cps[3] = {&sub_.cpSolid, &sub_.cpLiquid, &sub_.cpVapor};
    double anchorT[3] = {Tref, Tref, Tref};
    if (sub_.melting) anchorT[kSolid] = sub_.melting->T;
    else if (sub_.sublimation) anchorT[kSolid] = sub_.sublimation->T;
    if (sub_.melting && sub_.boiling) anchorT[kLiquid] = 0.5 * (sub_.melting->T + sub_.boiling->T);
    else if (sub_.melting) anchorT[kLiquid] = sub_.melting->T;
    else if (sub_.boiling) anchorT[kLiquid] = sub_.boiling->T;
    if (sub_.boiling) anchorT[kVapor] = sub_.boiling->T;
    else if (sub_.sublimation) anchorT[kVapor] = sub_.sublimation->T;
    for (int p = 0; p < 3; ++p) {
        auto& d = ph_[p];
        if (!cps[p]->has_value()) {
            d.missing = sub_.id + " has no " + phaseWord(p) + " heat capacity " + origin + "; a " +
                        phaseWord(p) + " state needs it";
            continue;
        }
        d.available = true;
        d.cp = kind_ == ModelKind::ConstantCp ? HeatCapacity::constant((*cps[p])->cp(anchorT[p]))
                                              : **cps[p];
        if (d.cp.isConstant() && !d.cp.pieces()[0].c.empty()) {
            const auto& piece = d.cp.pieces()[0];
            d.flat = true;
            d.flatC = piece.c[0];
            d.flatH = piece.hOffset;
            d.flatS = piece.sOffset;
            d.flatTmin = piece.Tmin;
            d.flatTmax = piece.Tmax;
        }
    }

    if (sub_.liquidDensity && *sub_.liquidDensity > 0) v_ = 1.0 / *sub_.liquidDensity;
    else if (sub_.solidDensity && *sub_.solidDensity > 0) v_ = 1.0 / *sub_.solidDensity;

    // Reference state and the links between phases (simple_model.hpp).
    int refPhase = -1;
    double T0 = Tref, P0 = kStandardAtmosphere;
    if (ph_[kLiquid].available) {
        refPhase = kLiquid;
        if (sub_.melting) T0 = sub_.melting->T, P0 = sub_.melting->P;
        else if (sub_.boiling) T0 = sub_.boiling->T, P0 = sub_.boiling->P;
    } else if (ph_[kSolid].available) {
        refPhase = kSolid;
        if (sub_.melting) T0 = sub_.melting->T, P0 = sub_.melting->P;
        else if (sub_.sublimation) T0 = sub_.sublimation->T, P0 = sub_.sublimation->P;
    } else if (ph_[kVapor].available) {
        refPhase = kVapor;
    } else {
        return makeError(sub_.id + " has no heat capacity for any phase " + origin +
                             "; the heat-capacity models need at least one",
                         where);
    }
    if (!(T0 > 0) || !(P0 > 0)) return makeError("the anchor temperature and pressure must be positive", where);
    Pref_ = P0;
    ph_[refPhase].a = -(ph_[refPhase].cp.enthalpy(T0));
    ph_[refPhase].b = -(ph_[refPhase].cp.entropy(T0));
    ph_[refPhase].linked = true;

    for (int pass = 0; pass < 3; ++pass) {
        auto tryLink = [&](int lo, int up, const std::optional<PhaseChangeData>& pc) {
            if (!pc || !ph_[lo].available || !ph_[up].available) return;
            if (ph_[lo].linked && !ph_[up].linked) link(lo, up, pc->T, pc->P, pc->enthalpy);
            else if (ph_[up].linked && !ph_[lo].linked) link(up, lo, pc->T, pc->P, -pc->enthalpy);
        };
        tryLink(kSolid, kLiquid, sub_.melting);
        tryLink(kLiquid, kVapor, sub_.boiling);
        // Boiling data take precedence; sublimation links only what is still loose.
        tryLink(kSolid, kVapor, sub_.sublimation);
    }
    for (int p = 0; p < 3; ++p) {
        auto& d = ph_[p];
        if (d.available && !d.linked) {
            d.available = false;
            d.missing = sub_.id + ": the " + std::string(phaseWord(p)) +
                        " cannot be related to the other phases without the latent heat between them (" +
                        (p == kVapor ? "a boiling or sublimation block" : "a melting block") + ")";
        }
    }

    hasMelting_ = sub_.melting && ph_[kSolid].available && ph_[kLiquid].available;
    if (hasMelting_) Tm_ = sub_.melting->T, Pm_ = sub_.melting->P;

    // Search ranges of the vapour lines: each ends where its latent heat
    // (Kirchhoff) reaches zero, the boiling line at the critical temperature.
    auto latent = [&](int lower, double T) { return H(kVapor, T, Pref_) - H(lower, T, Pref_); };
    if (ph_[kLiquid].available && ph_[kVapor].available) {
        boilLo_ = hasMelting_ ? Tm_ : kMinTemperature;
        boilHi_ = sub_.critical ? sub_.critical->T : kMaxTemperature;
        if (!(boilHi_ > boilLo_))
            return makeError("the critical temperature " + fmt(boilHi_, "K") + " is not above the melting temperature " +
                                 fmt(boilLo_, "K"),
                             where);
        const int n = 512;
        for (int i = 1; i <= n; ++i) {
            const double T = boilLo_ + (boilHi_ - boilLo_) * i / n;
            if (latent(kLiquid, T) <= 0) {
                boilHi_ = boilLo_ + (boilHi_ - boilLo_) * (i - 1) / n;
                break;
            }
        }
        if (!(latent(kLiquid, boilLo_) > 0))
            return makeError("the enthalpy of vaporisation implied by the heat capacities is not positive at " +
                                 fmt(boilLo_, "K"),
                             where);
    }
    if (hasMelting_ && ph_[kVapor].available) {
        auto Pt = vapourLinePressure(kLiquid, Tm_);
        if (!Pt) return makeError("no triple point: " + Pt.error().message, where);
        hasTriple_ = true;
        Tt_ = Tm_;
        Pt_ = *Pt;
    }
    if (ph_[kSolid].available && ph_[kVapor].available) {
        sublLo_ = kMinTemperature;
        sublHi_ = hasTriple_ ? Tt_ : kMaxTemperature;
        const int n = 512;
        for (int i = n - 1; i >= 0; --i) {
            const double T = sublLo_ + (sublHi_ - sublLo_) * i / n;
            if (latent(kSolid, T) <= 0) {
                sublLo_ = sublLo_ + (sublHi_ - sublLo_) * (i + 1) / n;
                break;
            }
        }
    }
    if (sub_.boiling && sub_.critical && sub_.boiling->T < sub_.critical->T && ph_[kLiquid].available &&
        ph_[kVapor].available) {
        hasWatson_ = true;
        watsonT1_ = sub_.boiling->T;
        watsonDh1_ = sub_.boiling->enthalpy;
    }

    range_ = std::string(name()) + " model of " + sub_.name + ": incompressible solid and liquid";
    range_ += v_ > 0 ? " (v = " + fmt(v_, "m3/kg") + ")" : " (volume neglected: no density given)";
    range_ += ", ideal-gas vapour";
    if (sub_.critical) range_ += " (flagged where its compressibility factor departs from 1 by more than 2 %)";
    if (kind_ == ModelKind::ConstantCp) {
        std::string list;
        for (int p = 0; p < 3; ++p) {
            if (!ph_[p].available) continue;
            list += (list.empty() ? "" : ", ") + std::string(phaseWord(p)) + " " + fmt(ph_[p].cp.cp(Tref), "J/(kg K)");
        }
        range_ += "; cp held at " + list;
    } else {
        range_ += "; heat capacities outside their published ranges are held at the end value and flagged";
    }
    range_ += "; solver bounds 1–6000 K, up to 100 MPa.";
    return Ok{};
}

SimpleModel::LineT SimpleModel::lineTemperature(int lower, int upper, double P, double Tlo, double Thi) const {
    // F = g_lower − g_upper rises with T: dF/dT = s_upper − s_lower = Δh/T > 0.
    auto F = [&](double T) { return G(lower, T, P) - G(upper, T, P); };
    double a = Tlo, b = Thi;
    double Fa = F(a), Fb = F(b);
    if (Fa > 0) return {LineOutcome::PressureBelowLine, a};
    if (Fb < 0) return {LineOutcome::PressureAboveLine, b};
    if (Fa == 0) return {LineOutcome::Found, a};
    if (Fb == 0) return {LineOutcome::Found, b};
    auto probe = [&](double T) {
        // F and its slope from one evaluation of each phase's h and s
        // (G = H - T S as in G(), so F is the same number F(T) gives).
        const double sl = S(lower, T, P), su = S(upper, T, P);
        return detail::NewtonProbe{(H(lower, T, P) - T * sl) - (H(upper, T, P) - T * su), su - sl};
    };
    const auto T = detail::safeguardedNewton(probe, a + (b - a) * Fa / (Fa - Fb), a, b, /*rising=*/true,
                                             {1e-14, 1e-14, 0.0, kMaxIterations});
    // Unconverged after a hundred steps the bracket has shrunk to well below 1e-12 K.
    return {LineOutcome::Found, T ? T->x : 0.5 * (a + b)};
}

Result<double> SimpleModel::vapourLinePressure(int lower, double T) const {
    // g_c(T, Pref) + v (P − Pref) = g_v(T, Pref) + R T ln(P/Pref). With y = ln(P/Pref):
    // f(y) = C + v Pref (e^y − 1) − R T y = 0, C = g_c − g_v at Pref. With v = 0
    // the root is C/(R T) exactly; otherwise Newton from there (f is convex and
    // falls on the branch where the vapour is less dense than the condensed phase).
    const double C = G(lower, T, Pref_) - G(kVapor, T, Pref_);
    const double RT = R_ * T;
    double y = C / RT;
    if (v_ > 0) {
        auto probe = [&](double yy) {
            const double e = std::exp(yy);
            return detail::NewtonProbe{C + v_ * Pref_ * (e - 1) - RT * yy, v_ * Pref_ * e - RT};
        };
        // ln P of either sign, f falling; beyond y = 700 P would overflow.
        const auto root = detail::newtonPolish(probe, y, {.residualTolerance = -1, .stepTolerance = 1e-15,
                                                          .maxIterations = kMaxIterations, .positive = false,
                                                          .rising = false, .stepFloor = 1.0, .below = 700});
        if (root) y = *root;
        if (!root || !(v_ * Pref_ * std::exp(y) < RT))
            return makeError("no " + std::string(lower == kSolid ? "sublimation" : "vapour") + " pressure at " +
                                 fmt(T, "K") + ": the vapour would be denser than the condensed phase",
                             sub_.id);
    }
    if (y > 700) return makeError("the vapour pressure at " + fmt(T, "K") + " exceeds any finite value", sub_.id);
    const double P = Pref_ * std::exp(y);
    if (!(P > 0)) return makeError("the vapour pressure at " + fmt(T, "K") + " is below 1e-300 Pa", sub_.id);
    return P;
}

bool SimpleModel::condensedSide(int lower, double T, double P, double lo, double hi) const {
    // F = g_lower − g_vapour rises with T on [lo, hi] (dF/dT = Δh/T > 0 there,
    // which is how lo and hi were chosen), so T lies at or below the line
    // temperature exactly when F(T) ≤ 0; the comparison allows F the
    // round-off of the two Gibbs energies, so a state computed on the line
    // counts as on it (the lower phase, as stablePhase promises). Outside
    // [lo, hi] the answers are those of lineTemperature's end outcomes.
    if (T > hi) return false;
    const double t = T < lo ? lo : T;
    const double gc = G(lower, t, P), gv = G(kVapor, t, P);
    const double F = gc - gv;
    if (T < lo) return !(F > 0);
    return F <= 1e-12 * (std::abs(gc) + std::abs(gv));
}

bool SimpleModel::departsFromWatson(double T, double P) const {
    if (!hasWatson_ || T < boilLo_ || T > boilHi_) return false;
    // Far below the dome (P < Psat/2) the answer is no. vapourLinePressure's
    // f(y) is convex and falls on its branch, so the point of its first
    // Newton step (the zero of the tangent at its start) lies at or below
    // the root, and its later steps only rise to it: where P is below half
    // of that bound (less a margin far above the round-off of the steps),
    // it is below half of Psat, and the rest of the iteration is not needed.
    if (v_ > 0) {
        const double C = G(kLiquid, T, Pref_) - G(kVapor, T, Pref_);
        const double RT = R_ * T;
        const double y0 = C / RT;
        if (y0 < 700) {
            const double e = std::exp(y0);
            const double f = C + v_ * Pref_ * (e - 1) - RT * y0;
            const double df = v_ * Pref_ * e - RT;
            if (df < 0 && P < 0.5 * Pref_ * std::exp(y0 - f / df) * (1 - 1e-9)) return false;
        }
    }
    auto Psat = vapourLinePressure(kLiquid, T);
    if (!Psat || P < 0.5 * *Psat) return false;  // far below the dome the latent heat does not matter
    const double kirchhoff = H(kVapor, T, *Psat) - H(kLiquid, T, *Psat);
    const double watson = watsonLatentHeat(watsonDh1_, watsonT1_, T, sub_.critical->T);
    return std::abs(kirchhoff - watson) > kWatsonTolerance * std::abs(watson);
}

Result<State> SimpleModel::phaseState(Phase phase, double T, double P) const {
    if (!std::isfinite(T) || !(T > 0)) return makeError("temperature " + fmt(T, "K") + " is not a positive number", sub_.id);
    if (!std::isfinite(P) || !(P > 0)) return makeError("pressure " + fmt(P, "Pa") + " is not a positive number", sub_.id);
    int p;
    switch (phase) {
        case Phase::Solid: p = kSolid; break;
        case Phase::Liquid: p = kLiquid; break;
        case Phase::Vapor:
        case Phase::Supercritical: p = kVapor; break;
        default:
            return makeError("phaseState takes a single phase, not " + std::string(phaseLabel(phase)), sub_.id);
    }
    if (!ph_[p].available) return makeError(ph_[p].missing, sub_.id);
    const auto& d = ph_[p];
    State st;
    st.T = T;
    st.P = P;
    st.phase = phase;
    st.h = H(p, T, P);
    st.s = S(p, T, P);
    st.cp = d.heatCapacity(T);
    if (p == kVapor) {
        st.v = R_ * T / P;
        st.u = st.h - R_ * T;  // u = h − P v = h − R T
        st.cv = st.cp - R_;
        st.w = std::sqrt(st.cp / st.cv * R_ * T);  // ideal gas: w² = γ R T
    } else {
        st.v = v_;
        st.u = st.h - P * v_;
        st.cv = st.cp;  // incompressible: cp = cv
    }
    st.source = kSourceText[kind_ == ModelKind::ConstantCp ? 0 : 1][phase == Phase::Supercritical ? 3 : p];

    std::uint32_t w = WarnNone;
    if (T < kMinTemperature) w |= WarnBelowTemperatureRange;
    if (T > kMaxTemperature) w |= WarnAboveTemperatureRange;
    if (P > kMaxPressure) w |= WarnAbovePressureRange;
    if (P < minPressure()) w |= WarnBelowPressureRange;
    if (kind_ == ModelKind::TemperatureDependentCp && !d.cp.inRange(T)) w |= WarnCpExtrapolated;
    if (sub_.critical) {
        const double Tc = sub_.critical->T, Pc = sub_.critical->P;
        if (p == kVapor) {
            const double Z = detail::abbottCompressibility(T, P, Tc, Pc, sub_.critical->acentricFactor);
            if (std::abs(Z - 1.0) > kIdealGasDeparture || departsFromWatson(T, P)) w |= WarnIdealGasAtHighPressure;
            if (std::abs(T / Tc - 1) < 0.05 && P > 0.5 * Pc) w |= WarnNearCritical;
        } else if (p == kLiquid) {
            if (T > Tc) w |= WarnAboveTemperatureRange;  // no liquid above the critical temperature
            else if (T > 0.95 * Tc && P > 0.5 * Pc) w |= WarnNearCritical;
        }
    }
    if (hasMelting_ && p != kVapor && std::abs(P - Pm_) > kMeltingLineSpan && (p == kSolid || T < 1.1 * Tm_))
        w |= WarnMeltingLineApprox;
    st.warnings = w;
    return st;
}

Result<double> SimpleModel::transitionTemperature(Transition t, double P) const {
    if (!std::isfinite(P) || !(P > 0)) return makeError("pressure " + fmt(P, "Pa") + " is not a positive number", sub_.id);
    switch (t) {
        case Transition::Melting: {
            if (auto ok = phaseAvailable(kSolid); !ok) return ok.error();
            if (auto ok = phaseAvailable(kLiquid); !ok) return ok.error();
            if (!hasMelting_) return makeError(sub_.id + " has no melting data (melting block)", sub_.id);
            if (hasTriple_ && P < Pt_)
                return makeError("no melting at " + fmt(P, "Pa") + ": below the model's triple-point pressure " +
                                     fmt(Pt_, "Pa") + " the solid sublimes",
                                 sub_.id);
            return Tm_;
        }
        case Transition::Boiling: {
            if (auto ok = phaseAvailable(kLiquid); !ok) return ok.error();
            if (auto ok = phaseAvailable(kVapor); !ok) return ok.error();
            const auto r = lineTemperature(kLiquid, kVapor, P, boilLo_, boilHi_);
            if (r.outcome == LineOutcome::PressureBelowLine)
                return makeError("no boiling at " + fmt(P, "Pa") + ": below the model's triple-point pressure " +
                                     fmt(hasTriple_ ? Pt_ : 0.0, "Pa") + " the solid sublimes",
                                 sub_.id);
            if (r.outcome == LineOutcome::PressureAboveLine) {
                if (sub_.critical && boilHi_ == sub_.critical->T)
                    return makeError("no boiling at " + fmt(P, "Pa") +
                                         ": above the model's vapour pressure at the critical temperature (Tc = " +
                                         fmt(sub_.critical->T, "K") + "); the fluid turns supercritical without boiling",
                                     sub_.id);
                return makeError("no boiling at " + fmt(P, "Pa") + ": above the end of the model's vapour-pressure curve at " +
                                     fmt(boilHi_, "K"),
                                 sub_.id);
            }
            return r.T;
        }
        case Transition::Sublimation: {
            if (auto ok = phaseAvailable(kSolid); !ok) return ok.error();
            if (auto ok = phaseAvailable(kVapor); !ok) return ok.error();
            const auto r = lineTemperature(kSolid, kVapor, P, sublLo_, sublHi_);
            if (r.outcome == LineOutcome::PressureAboveLine)
                return makeError("no sublimation at " + fmt(P, "Pa") + ": above the model's triple-point pressure " +
                                     fmt(Pt_, "Pa") + " the solid melts",
                                 sub_.id);
            if (r.outcome == LineOutcome::PressureBelowLine)
                return makeError("no sublimation at " + fmt(P, "Pa") + ": below the model's sublimation curve at " +
                                     fmt(sublLo_, "K"),
                                 sub_.id);
            return r.T;
        }
    }
    return makeError("unknown transition", sub_.id);
}

Result<double> SimpleModel::transitionPressure(Transition t, double T) const {
    if (!std::isfinite(T) || !(T > 0)) return makeError("temperature " + fmt(T, "K") + " is not a positive number", sub_.id);
    switch (t) {
        case Transition::Melting: {
            if (auto ok = phaseAvailable(kSolid); !ok) return ok.error();
            if (auto ok = phaseAvailable(kLiquid); !ok) return ok.error();
            if (!hasMelting_) return makeError(sub_.id + " has no melting data (melting block)", sub_.id);
            // The melting temperature does not depend on pressure in this model:
            // at Tm every pressure above the triple point lies on the line; the
            // anchor pressure is returned.
            if (std::abs(T - Tm_) > 1e-9 * Tm_)
                return makeError("no melting at " + fmt(T, "K") + ": this model melts only at " + fmt(Tm_, "K") +
                                     ", at any pressure",
                                 sub_.id);
            return hasTriple_ ? std::max(Pm_, Pt_) : Pm_;
        }
        case Transition::Boiling: {
            if (auto ok = phaseAvailable(kLiquid); !ok) return ok.error();
            if (auto ok = phaseAvailable(kVapor); !ok) return ok.error();
            if (sub_.critical && T > sub_.critical->T)
                return makeError("no boiling at " + fmt(T, "K") + ": above the critical temperature Tc = " +
                                     fmt(sub_.critical->T, "K"),
                                 sub_.id);
            if (T < boilLo_)
                return makeError("no boiling at " + fmt(T, "K") + ": below the model's triple point (" +
                                     fmt(boilLo_, "K") + "), where the solid sublimes",
                                 sub_.id);
            if (T > boilHi_)
                return makeError("no boiling at " + fmt(T, "K") + ": beyond the end of the model's vapour-pressure curve (" +
                                     fmt(boilHi_, "K") + ")",
                                 sub_.id);
            return vapourLinePressure(kLiquid, T);
        }
        case Transition::Sublimation: {
            if (auto ok = phaseAvailable(kSolid); !ok) return ok.error();
            if (auto ok = phaseAvailable(kVapor); !ok) return ok.error();
            if (T > sublHi_)
                return makeError("no sublimation at " + fmt(T, "K") + ": above the model's triple point (" +
                                     fmt(sublHi_, "K") + ")",
                                 sub_.id);
            if (T < sublLo_)
                return makeError("no sublimation at " + fmt(T, "K") + ": below the model's sublimation curve", sub_.id);
            return vapourLinePressure(kSolid, T);
        }
    }
    return makeError("unknown transition", sub_.id);
}

const SimpleModel::Isobar& SimpleModel::isobar(double P) const {
    // Four ways in each of 64 sets, chosen by the bits of P and the model's
    // number; a hit is the very isobar built before (the same numbers), a
    // miss rebuilds the way used least recently. 256 isobars of about 600
    // bytes hold the distinct pressures of a long worksheet (a hundred-step
    // cycle has about a hundred).
    constexpr int kSetBits = 6, kWays = 4;
    struct Set {
        std::array<Isobar, kWays> way;
        std::array<std::uint8_t, kWays> age{0, 1, 2, 3};  // 0: used last
    };
    using Table = std::array<Set, std::size_t(1) << kSetBits>;
    // On the heap on first use: a thread that never asks pays no 150 kB of
    // thread-local storage at its start.
    static thread_local std::unique_ptr<Table> table;
    static thread_local const Isobar* last = nullptr;  // most asks repeat the one before
    if (last && last->model == id_ && last->P == P) return *last;
    if (!table) table = std::make_unique<Table>();
    const std::uint64_t key = (std::bit_cast<std::uint64_t>(P) ^ (id_ * 0xD6E8FEB86659FD93ull)) * 0x9E3779B97F4A7C15ull;
    Set& set = (*table)[std::size_t(key >> (64 - kSetBits))];
    auto touch = [&set](int w) {
        for (auto& a : set.age)
            if (a < set.age[std::size_t(w)]) ++a;
        set.age[std::size_t(w)] = 0;
    };
    int victim = 0;
    for (int w = 0; w < kWays; ++w) {
        const Isobar& e = set.way[std::size_t(w)];
        if (e.model == id_ && e.P == P) {
            touch(w);
            last = &e;
            return e;
        }
        if (set.age[std::size_t(w)] > set.age[std::size_t(victim)]) victim = w;
    }
    touch(victim);
    Isobar& c = set.way[std::size_t(victim)];
    last = &c;
    c.model = id_;
    c.P = P;
    c.tr = PropertyModel::transitionsAt(P);
    c.ok = true;
    for (int i = 0; i < c.tr.count; ++i) {
        const auto& e = c.tr.entries[std::size_t(i)];
        auto lo = phaseState(lowerPhase(e.kind), e.T, P);
        auto up = phaseState(upperPhase(e.kind), e.T, P);
        if (!lo || !up) {
            c.ok = false;
            break;
        }
        c.ends[std::size_t(i)] = {*lo, *up};
    }
    return c;
}

std::optional<State> SimpleModel::invertOnIsobar(int p, double P, Property which, double value, const State& from,
                                                 double Tmin, double Tmax) const {
    const HeatCapacity& cp = ph_[p].cp;
    const bool byH = which == Property::Enthalpy;
    double T;
    if (cp.isConstant()) {
        // Closed forms along an isobar: h − h_from = cp (T − T_from) and
        // s − s_from = cp ln(T / T_from) for the incompressible phases and
        // the ideal gas alike (simple_model.hpp).
        const double c = ph_[p].heatCapacity(from.T);
        T = byH ? from.T + (value - from.h) / c : from.T * std::exp((value - from.s) / c);
    } else {
        // Newton on T with dh/dT = cp and ds/dT = cp/T, from the closed form
        // with cp at the known state: two or three steps.
        const double c0 = cp.cp(from.T);
        T = byH ? from.T + (value - from.h) / c0 : from.T * std::exp((value - from.s) / c0);
        // The entropy step f/(cp/T) is taken as (f·T)/cp, the same number as before.
        auto probe = [&](double t) {
            const double f = (byH ? H(p, t, P) : S(p, t, P)) - value;
            return detail::NewtonProbe{byH ? f : f * t, cp.cp(t)};
        };
        const auto root = detail::newtonPolish(probe, T, {-1, 1e-14, kMaxIterations});
        if (!root) return std::nullopt;
        T = *root;
    }
    if (!(T >= Tmin && T <= Tmax)) return std::nullopt;
    const Phase ph = p == kSolid ? Phase::Solid : (p == kLiquid ? Phase::Liquid : Phase::Vapor);
    auto stable = stablePhase(T, P);
    if (!stable) return std::nullopt;
    const Phase label = (ph == Phase::Vapor && *stable == Phase::Supercritical) ? Phase::Supercritical : ph;
    if (*stable != label) return std::nullopt;
    auto st = phaseState(label, T, P);
    if (!st) return std::nullopt;
    return *st;
}

Result<State> SimpleModel::stateP(double P, Property which, double value) const {
    // Along an isobar crossed by phase changes, the known ends of each
    // change tell which phase (or mixture) holds `value`; the state inside
    // a phase then follows in closed form (constant cp) or by Newton from
    // the nearest end. Anything else — no phase change on the isobar, a
    // value beyond the model's bounds, u or v — is the general walk's.
    if ((which != Property::Enthalpy && which != Property::Entropy) || !(P > 0) || !std::isfinite(P) ||
        !std::isfinite(value))
        return PropertyModel::stateP(P, which, value);
    const Isobar& c = isobar(P);
    if (!c.ok || c.tr.count == 0) return PropertyModel::stateP(P, which, value);
    auto phaseIndex = [](Phase ph) { return ph == Phase::Solid ? kSolid : (ph == Phase::Liquid ? kLiquid : kVapor); };
    for (int i = 0; i < c.tr.count; ++i) {
        const auto& e = c.tr.entries[std::size_t(i)];
        const State& lo = c.ends[std::size_t(i)][0];
        const State& up = c.ends[std::size_t(i)][1];
        // `which` is h or s here (above); read in place of propertyOf's call.
        const bool byH = which == Property::Enthalpy;
        const double a = byH ? lo.h : lo.s, b = byH ? up.h : up.s;
        if (value < a) {
            const double Tmin = i == 0 ? minTemperature() : c.tr.entries[std::size_t(i - 1)].T;
            if (auto st = invertOnIsobar(phaseIndex(lowerPhase(e.kind)), P, which, value, lo, Tmin, e.T)) return *st;
            return PropertyModel::stateP(P, which, value);
        }
        if (value <= b) return mix(lo, up, e.kind, b > a ? (value - a) / (b - a) : 0.0);
    }
    const auto& last = c.tr.entries[std::size_t(c.tr.count - 1)];
    if (auto st = invertOnIsobar(phaseIndex(upperPhase(last.kind)), P, which, value,
                                 c.ends[std::size_t(c.tr.count - 1)][1], last.T, maxTemperature()))
        return *st;
    return PropertyModel::stateP(P, which, value);
}

Result<Phase> SimpleModel::stablePhase(double T, double P) const {
    if (!std::isfinite(T) || !(T > 0)) return makeError("temperature " + fmt(T, "K") + " is not a positive number", sub_.id);
    if (!std::isfinite(P) || !(P > 0)) return makeError("pressure " + fmt(P, "Pa") + " is not a positive number", sub_.id);
    const bool s = ph_[kSolid].available, l = ph_[kLiquid].available, v = ph_[kVapor].available;
    if (v && sub_.critical && T > sub_.critical->T)
        return P >= sub_.critical->P ? Phase::Supercritical : Phase::Vapor;

    // A missing phase is not silently replaced by its neighbour where the
    // substance's own data say that phase would be there.
    auto missing = [&](int p) -> Result<Phase> {
        return makeError(ph_[p].missing + " (at " + fmt(T, "K") + " and " + fmt(P, "Pa") + ")", sub_.id);
    };

    // Below the triple-point pressure (or with no liquid): solid or vapour.
    if (s && v && (!l || (hasTriple_ && P < Pt_)))
        return condensedSide(kSolid, T, P, sublLo_, sublHi_) ? Phase::Solid : Phase::Vapor;
    if (s && l && hasMelting_ && T <= Tm_) return Phase::Solid;
    if (!s && (sub_.melting && T <= sub_.melting->T)) return missing(kSolid);
    if (l && v) return condensedSide(kLiquid, T, P, boilLo_, boilHi_) ? Phase::Liquid : Phase::Vapor;
    if (l) {
        if (sub_.boiling && T > sub_.boiling->T && P <= sub_.boiling->P) return missing(kVapor);
        return Phase::Liquid;
    }
    if (s) {
        if (sub_.melting && T > sub_.melting->T) return missing(kLiquid);
        if (sub_.sublimation && T > sub_.sublimation->T && P <= sub_.sublimation->P) return missing(kVapor);
        return Phase::Solid;
    }
    if (sub_.boiling && T <= sub_.boiling->T && P >= sub_.boiling->P) return missing(kLiquid);
    return Phase::Vapor;
}

}  // namespace

Result<std::shared_ptr<const PropertyModel>> makeSimpleModel(const Substance& substance, ModelKind kind) {
    if (kind != ModelKind::ConstantCp && kind != ModelKind::TemperatureDependentCp)
        return makeError("the heat-capacity models are constant-cp and temperature-dependent-cp", substance.id);
    auto model = std::make_shared<SimpleModel>(substance, kind);
    if (auto ok = model->build(); !ok) return ok.error();
    return std::shared_ptr<const PropertyModel>(std::move(model));
}

}  // namespace heatchain
