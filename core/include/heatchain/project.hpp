#pragma once
// The worksheet as the user wrote it: every quantity keeps the text the user
// typed (so writing is stable) beside its SI value. See
// shared design project-format.md, version 1.
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "heatchain/constants.hpp"
#include "heatchain/property_model.hpp"
#include "heatchain/substance.hpp"
#include "heatchain/units.hpp"
#include "heatchain/unknown_fields.hpp"

namespace heatchain {

// A quantity as typed ("6 barg") and its SI value.
struct Quantity {
    std::string text;
    double si = 0;
};

// A dimensionless number and its characters as typed, written back unchanged.
struct Number {
    double value = 0;
    // A JSON number's characters ("0.60"), or the text of a number the file
    // holds as a string ("0.72 ± 0.03", "65 %"); empty when made in code.
    std::string text;
    bool quoted = false;  // held as a string in the file (a tolerance, a unit), not as a JSON number

    // The number as the user typed it, for display: "0.60", "0.72 ± 0.03",
    // never with quotes; one made in code in its shortest form.
    std::string typed() const;
};

enum class SystemKind { Closed, SteadyFlow };
std::string_view systemId(SystemKind s);  // "closed", "steady-flow"

enum class StepKind {
    Heat, Cool, Melt, Freeze, Boil, Condense, Sublimate, Deposit,
    Compress, Expand, Throttle,
    Hold,  // closed systems: stays at its state for a duration (heat loss made up)
};
std::string_view stepKindId(StepKind k);  // "heat", "cool", ...
Result<StepKind> parseStepKind(std::string_view id);
bool isPhaseChangeKind(StepKind k);       // melt … deposit
bool isPressureChangeKind(StepKind k);    // compress, expand, throttle

enum class PathKind { Isothermal, Isentropic, Polytropic, Adiabatic };
std::string_view pathId(PathKind p);

enum class HeatingAt { ConstantPressure, ConstantVolume };

// A heat source or sink: a temperature, or a named utility.
struct Reservoir {
    std::optional<Quantity> T;
    std::optional<std::string> utility;
    UnknownFields extra;
};

struct StepTarget {
    std::optional<Quantity> T;
    std::optional<Quantity> P;
    std::optional<Quantity> duty;     // heat per kg·… as typed: energy (closed) or power (flow)
    std::optional<Number> quality;
    std::optional<Number> ratio;      // pressure ratio, > 1 (expand divides by it)
    bool rated = false;               // "rated": true — the end state the given exchanger area reaches
    std::optional<Quantity> time;     // closed systems: the end state after this time
    UnknownFields extra;

    // Nothing aimed at and nothing kept: a step without "to" (phase changes, hold).
    bool empty() const { return !T && !P && !duty && !quality && !ratio && !rated && !time && extra.empty(); }
};

// Heat transfer through an exchanger, jacket or coil (transfer.hpp uses it):
// an overall coefficient U — one value, or one per kind of zone — and the
// area, or the product UA instead of both.
struct HeatTransferSpec {
    std::optional<Quantity> U;                                  // one value for every zone
    std::vector<std::pair<std::string, Quantity>> zoneU;        // per zone: "liquid", "two-phase", ... (file order)
    std::optional<Quantity> area;
    std::optional<Quantity> UA;
    UnknownFields extra;
    UnknownFields Uextra;             // unknown keys of a per-zone U object
};

// Heat lost to the surroundings' temperature by a batch: UA to ambient.
struct HeatLossSpec {
    Quantity UA;
    UnknownFields extra;
};

struct Step {
    std::string id;
    StepKind kind = StepKind::Heat;
    StepTarget to;                        // written as "to" unless empty()
    std::optional<HeatingAt> at;          // heat / cool
    std::optional<Number> fraction;       // phase-change kinds
    std::optional<PathKind> path;         // compress / expand
    std::optional<Number> n;              // polytropic exponent
    std::optional<Number> efficiency;     // isentropic efficiency, (0, 1]
    std::optional<Reservoir> source;
    std::optional<Reservoir> sink;
    std::optional<std::string> note;
    std::optional<HeatTransferSpec> transfer;  // heat, cool and phase-change kinds, hold
    std::optional<Quantity> duration;     // hold
    std::optional<HeatLossSpec> heatLoss; // closed systems: replaces the project's
    UnknownFields extra;
};

// A plant utility a step can take its heat from or give it to,
// defined once in the project's top-level "utilities" list:
//   steam     condensing (or raised) steam at a pressure P; its saturation
//             temperature and latent heat come from the water reference model
//   sensible  a stream that changes temperature from `in` to `out` with a
//             constant cp (cooling water, hot oil, brine); optional density
//   fixed     a source or sink at one temperature T (furnace, ambient air)
enum class UtilityKind { Steam, Sensible, Fixed };
std::string_view utilityKindId(UtilityKind k);  // "steam", "sensible", "fixed"

struct Utility {
    std::string id;
    UtilityKind kind = UtilityKind::Fixed;
    std::optional<std::string> name;     // free text for people
    std::optional<Quantity> P;           // steam
    std::optional<Quantity> Tin, Tout;   // sensible ("in", "out")
    std::optional<Quantity> cp;          // sensible, J/(kg K)
    std::optional<Quantity> density;     // sensible, optional, kg/m3
    std::optional<Quantity> T;           // fixed
    std::optional<Quantity> flow;        // sensible, instead of out: kg/s through the exchanger
    UnknownFields extra;
};

struct StartSpec {
    std::optional<Quantity> T;
    std::optional<Quantity> P;
    std::optional<Number> quality;
    std::optional<Number> meltFraction;
    UnknownFields extra;
};

struct Basis {
    enum class Kind { Mass, Amount, MassFlow, MolarFlow } kind = Kind::Mass;
    Quantity amount;  // SI: kg, mol, kg/s or mol/s
    UnknownFields extra;
};
std::string_view basisKey(Basis::Kind k);  // "mass", "amount", "massFlow", "molarFlow"
Dimension basisDimension(Basis::Kind k);   // what its amount is measured in

struct Meta {
    std::string title, author, revision, created, modified, notes;
    UnknownFields extra;
};

// The dead state of exergy: the temperature and pressure of the surroundings.
struct Surroundings {
    Quantity T{"25 degC", 298.15};
    Quantity P{"1 atm", 101325.0};
    UnknownFields extra;
};

struct Project {
    int version = 1;
    Meta meta;
    UnitSystem displayUnits = UnitSystem::SI;
    UnknownFields displayExtra;
    SystemKind system = SystemKind::SteadyFlow;
    ModelKind model = ModelKind::Reference;
    // A library substance (written as its id), or a custom one (its
    // definition, kept as written, in substance.definition).
    Substance substance;
    Basis basis;
    // Gauge pressures are read against it; none: the standard atmosphere.
    std::optional<Quantity> atmosphere;
    std::optional<Surroundings> surroundings;  // none: 25 degC and 1 atm
    StartSpec start;
    std::vector<Step> steps;
    UnknownFields extra;                      // unknown top-level fields
    // Optional fields of version 1: utilities and the smallest
    // temperature difference a heat exchanger with a utility should keep.
    std::optional<std::vector<Utility>> utilities;  // an empty list given is written back
    const std::vector<Utility>& utilityList() const;  // none: empty
    std::optional<Quantity> minApproach;      // default kDefaultMinApproach
    std::optional<HeatLossSpec> heatLoss;     // closed systems: UA to the surroundings

    static constexpr double kDefaultMinApproach = 10.0;  // K, a common first-estimate design value (from memory)
    double minApproachK() const { return minApproach ? minApproach->si : kDefaultMinApproach; }
    const Utility* findUtility(std::string_view id) const;

    const Quantity& atmosphereOrDefault() const;      // "101.325 kPa" when none is given
    const Surroundings& surroundingsOrDefault() const;
    UnitContext unitContext() const { return UnitContext{atmosphereOrDefault().si}; }
    // kg or kg/s the extensive results are multiplied by.
    double massBasis() const;
    const Step* findStep(std::string_view id) const;
};

}  // namespace heatchain
