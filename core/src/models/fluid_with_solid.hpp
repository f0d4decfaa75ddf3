#pragma once
// What a fluid equation of state with a solid attached to it shares, whatever
// the equation: the real-fluid (Peng–Robinson) and the ammonia reference
// (Tillner-Roth et al. 1993) models both derive from this class.
//
// The solid. Its temperature dependence is the solid cp integrated from the
// melting anchor (Tm, Pm), where it lies below the liquid by the enthalpy of
// fusion; its pressure dependence is the equation's liquid at Tm:
//   h_s(T,P) = h_l(Tm,P) - Δh_fus + ∫_Tm^T cp_s dT,
//   s_s(T,P) = s_l(Tm,P) - Δh_fus/Tm + ∫_Tm^T cp_s/T dT.
// Then g_s(Tm,P) = g_l(Tm,P) at every P, so the melting temperature is
// exactly pressure-independent and melting is exactly reversible
// (Δs = Δh/Tm) at any pressure; the implied solid volume is
//   v_s = ∂g_s/∂P = v_l(Tm,P) + (T - Tm) (∂v_l/∂T)_P at Tm.
// The price is that the solid's density is the liquid's (states far from the
// anchor pressure carry WarnMeltingLineApprox).
//
// Sublimation is equal Gibbs energy of the equation's vapour and this solid:
// the exact integral of the Clapeyron equation with Δh_sub = h_v - h_s along
// the model's own line, so s_v - s_s = Δh/T there.
//
// The isobar walk (stateP) is PropertyModel's, with the single-phase spans
// solved by a safeguarded Newton on T at the tolerances the model sets.
#include <cstdint>
#include <optional>
#include <string>
#include <string_view>
#include <utility>

#include "heatchain/heat_capacity.hpp"
#include "heatchain/property_model.hpp"

namespace heatchain::detail {

class FluidWithSolidModel : public PropertyModel {
public:
    Result<Phase> stablePhase(double T, double P) const final;
    Result<double> transitionTemperature(Transition t, double P) const final;
    Result<double> transitionPressure(Transition t, double T) const final;
    TransitionsAtPressure transitionsAt(double P) const final;

    std::optional<std::pair<double, double>> criticalPoint() const final { return std::make_pair(Tc_, Pc_); }
    std::optional<std::pair<double, double>> triplePoint() const final {
        if (!hasLowerLimit_) return std::nullopt;
        return std::make_pair(Ttp_, Ptp_);
    }
    double minTemperature() const final { return Tmin_; }

protected:
    // Gibbs energy, volume and enthalpy per kg.
    struct GibbsV {
        double g, v, h;
    };
    // The equation's liquid at (Tm, P): h and s per kg with the model's
    // offsets, v per kg, (∂v/∂T)_P per kg, and flags of the liquid root.
    struct MeltingLiquid {
        double h, s, v, dvdT;
        std::uint32_t warnings;
    };

    // ---- Hooks of the equation ------------------------------------------
    virtual Result<MeltingLiquid> meltingLiquid(double P) const = 0;
    // Gibbs energy of the vapour (nullopt when the equation has no vapour
    // root at (T, P)).
    virtual std::optional<GibbsV> vapourGibbs(double T, double P) const = 0;
    // The stable fluid below the critical temperature, where no solid is.
    virtual Result<Phase> subcriticalFluidPhase(double T, double P) const = 0;
    virtual Result<double> boilingTemperature(double P) const = 0;
    virtual Result<double> boilingPressure(double T) const = 0;

    // "real-fluid model", "ammonia reference model": for messages.
    virtual std::string_view modelLabel() const = 0;
    std::string who() const;

    Result<State> solidState(double T, double P) const;
    Result<GibbsV> solidGibbs(double T, double P) const;
    Result<double> sublimationPressure(double T) const;
    Result<double> sublimationTemperature(double P) const;
    // The span solve of the isobar walk: the span's phase from the phase
    // changes around it, then a safeguarded Newton on T.
    Result<std::optional<State>> solveOnIsobarSpan(const IsobarSpan& span, Property which,
                                                   double value) const override;

    // ---- Set by the model's factory -------------------------------------
    double Tc_ = 0, Pc_ = 0;
    double Rs_ = 0;  // specific gas constant, J/(kg K)
    bool hasMelting_ = false, hasSolid_ = false;
    HeatCapacity cpS_;
    double Tm_ = 0, Pm_ = 0, dhFus_ = 0;
    bool hasLowerLimit_ = false;  // a lower end (model triple point) of the liquid–vapour line
    double Ttp_ = 0, Ptp_ = 0;
    double Tmin_ = 0;
    std::string_view solidSource_;
    // Relative Newton step at which a sublimation line counts as found, and
    // the bracket and step tolerances of the isobar spans.
    double lineTolerance_ = 1e-12;
    double spanBracketTolerance_ = 1e-12, spanStepTolerance_ = 1e-11;
};

}  // namespace heatchain::detail
