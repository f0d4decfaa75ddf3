#pragma once
// One interface for every property model: constant cp, temperature-dependent
// cp, Peng–Robinson, IAPWS-IF97 with ice Ih. A model supplies single-phase
// states from (T, P) and its phase-change lines; the base class derives every
// other input pair (P,h), (P,s), (P,u), (P,v), (T,v), states on phase lines,
// from those, and a model may override any of them with a faster or more
// exact path (IF97's backward equations).
#include <array>
#include <functional>
#include <memory>
#include <optional>
#include <utility>
#include <string>
#include <string_view>

#include "heatchain/result.hpp"
#include "heatchain/state.hpp"
#include "heatchain/substance.hpp"

namespace heatchain {

enum class ModelKind { ConstantCp, TemperatureDependentCp, RealFluid, Reference };

std::string_view modelId(ModelKind k);  // "constant-cp", "temperature-dependent-cp", "real-fluid", "reference"
Result<ModelKind> parseModelKind(std::string_view id);

enum class Transition { Melting, Boiling, Sublimation };
std::string_view transitionLabel(Transition t);  // "melting", "boiling", "sublimation"

// The lower and higher phase of a transition: Melting is Solid → Liquid,
// Boiling is Liquid → Vapor, Sublimation is Solid → Vapor.
Phase lowerPhase(Transition t);
Phase upperPhase(Transition t);
Phase mixturePhase(Transition t);

// A specific property that can be held fixed while solving for a state.
enum class Property { Enthalpy, Entropy, InternalEnergy, Volume };

// The phase changes met when heating at constant pressure P, in order of
// rising temperature (at most two: melting then boiling, or sublimation).
struct TransitionsAtPressure {
    struct Entry {
        Transition kind;
        double T;
    };
    std::array<Entry, 2> entries{};
    int count = 0;
};

class PropertyModel {
public:
    virtual ~PropertyModel() = default;

    virtual ModelKind kind() const = 0;
    virtual std::string_view name() const = 0;       // "IAPWS-IF97", "Peng–Robinson (1978)", ...
    virtual std::string rangeText() const = 0;       // stated validity range, for people
    virtual const Substance& substance() const = 0;
    // The published sources of the model equations (not the substance data).
    virtual std::string sourceText() const = 0;

    // ---- Primitives every model supplies --------------------------------
    // State of the given single phase at (T, P), which may be metastable;
    // used for the ends of a phase change and for sensible segments.
    virtual Result<State> phaseState(Phase phase, double T, double P) const = 0;
    // The phase that is stable at (T, P) (never a two-phase value); on a
    // phase line returns the lower phase.
    virtual Result<Phase> stablePhase(double T, double P) const = 0;
    // Phase-change temperature at P and pressure at T; an error when the line
    // does not exist there (above the critical point, below the triple point).
    virtual Result<double> transitionTemperature(Transition t, double P) const = 0;
    virtual Result<double> transitionPressure(Transition t, double T) const = 0;

    // ---- Derived; overridable -------------------------------------------
    virtual Result<State> stateTP(double T, double P) const;
    // State on a phase line at pressure P (or temperature T) with the given
    // share of the upper phase (quality or melt fraction), 0–1.
    virtual Result<State> stateOnLineP(Transition t, double P, double fraction) const;
    virtual Result<State> stateOnLineT(Transition t, double T, double fraction) const;
    // State at pressure P with one specific property fixed; finds two-phase
    // states on the lines the isobar crosses.
    virtual Result<State> stateP(double P, Property which, double value) const;
    Result<State> statePH(double P, double h) const { return stateP(P, Property::Enthalpy, h); }
    Result<State> statePS(double P, double s) const { return stateP(P, Property::Entropy, s); }
    // State at temperature T with specific volume v (closed rigid vessel).
    virtual Result<State> stateTV(double T, double v) const;

    virtual TransitionsAtPressure transitionsAt(double P) const;

    // The critical and triple points as the model sees them (they may differ
    // slightly from the library's values for a cubic equation of state).
    virtual std::optional<std::pair<double, double>> criticalPoint() const;  // (T, P)
    virtual std::optional<std::pair<double, double>> triplePoint() const;    // (T, P)

    // Lowest and highest temperature and highest pressure the solver may try.
    virtual double minTemperature() const = 0;
    virtual double maxTemperature() const = 0;
    virtual double maxPressure() const = 0;
    virtual double minPressure() const { return 1e-3; }

    // Mixture of the two ends of a transition (linear in h, s, u, v).
    static State mix(const State& lower, const State& upper, Transition t, double fraction);

protected:
    // Value of `which` in state s.
    static double propertyOf(const State& s, Property which);

    // One single-phase span [Ta, Tb] of the isobar at P: the `index`-th of
    // the transitions->count + 1 spans between the phase changes the isobar
    // crosses (transitionsAt), in rising temperature.
    struct IsobarSpan {
        double P = 0, Ta = 0, Tb = 0;
        int index = 0;
        const TransitionsAtPressure* transitions = nullptr;
        bool first() const { return index == 0; }
        bool last() const { return index == transitions->count; }
    };
    // The isobar walk's per-model hook (stateP walks the spans and the phase
    // changes between them; this solves one span): the state in the span
    // whose `which` equals `value`, nullopt when the span does not hold it
    // (the walk goes on), or an error that ends the walk. For h and s the
    // walk skips a span when the value lies above the upper end of the phase
    // change that closes it. The default
    // brackets the span by its ends and solves by Brent, asking the model
    // for the stable phase where the span's phase is not one throughout.
    virtual Result<std::optional<State>> solveOnIsobarSpan(const IsobarSpan& span, Property which,
                                                           double value) const;

    // The temperature on one phase's isobar where `which` equals `value`, by
    // a safeguarded Newton on T: `at(T)` gives the state, [Ta, Tb] holds the
    // root (sa, sb are its end states); the slope is cp for h and cp/T for s,
    // a secant for u and v; a step that leaves the bracket halves it instead.
    // Converged when the bracket is narrower than bracketTol·T or a step
    // smaller than stepTol·T; at most 100 steps, else an error naming `what`
    // and P.
    static Result<State> solveTemperatureInBracket(const std::function<Result<State>(double)>& at, Property which,
                                                   double value, double Ta, double Tb, const State& sa,
                                                   const State& sb, double bracketTol, double stepTol,
                                                   std::string_view what, double P);
};

// The name of the substance's own reference-quality equation of state, when
// the library has one (water: IAPWS-IF97; ammonia: Tillner-Roth et al.
// 1993); `reference` then uses it instead of Peng–Robinson.
std::optional<std::string_view> referenceEquation(const Substance& substance);

// Builds the model of the given kind for a substance, or says why it cannot
// ("the reference model of nitrogen is Peng–Robinson", "water needs …").
Result<std::shared_ptr<const PropertyModel>> makeModel(ModelKind kind, const Substance& substance);

}  // namespace heatchain
