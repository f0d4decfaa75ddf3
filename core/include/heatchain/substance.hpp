#pragma once
// A pure substance: its constants, its per-phase heat capacities, and the
// published source of every value. The built-in library is read from the
// JSON files in resources/substances/, embedded in the binaries.
#include <memory>
#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <vector>

#include <nlohmann/json_fwd.hpp>

#include "heatchain/heat_capacity.hpp"
#include "heatchain/result.hpp"
#include "heatchain/units.hpp"

namespace heatchain {

struct CriticalPoint {
    double T = 0;              // K
    double P = 0;              // Pa
    double acentricFactor = 0; // Pitzer's omega
    std::optional<double> rho; // kg/m3, where known
};

struct TriplePoint {
    double T = 0;  // K
    double P = 0;  // Pa
};

// A phase change at a stated temperature and pressure with its latent heat.
struct PhaseChangeData {
    double T = 0;         // K
    double P = 101325.0;  // Pa
    double enthalpy = 0;  // J/kg, latent heat at (T, P)
};

// Optional Peng–Robinson refinements.
struct PengRobinsonData {
    std::optional<double> twuL, twuM, twuN;  // Twu (1991) alpha parameters
    std::optional<double> volumeShift;       // Péneloux c, m3/mol
};

// One line of the "sources" shown in the About box and the report.
struct SourceNote {
    std::string field;  // e.g. "critical", "cp.vapor", "melting"
    std::string text;   // e.g. "Poling, Prausnitz & O'Connell, 5th ed., App. A"
    // False when the value was typed from the cited publication without a
    // second check against it or against a reference equation: the report
    // says "not independently confirmed" beside it.
    bool confirmed = true;
};
// "Critical point", "Liquid phase", ... for a SourceNote::field; the field
// itself when it is not one the library uses.
std::string sourceFieldLabel(std::string_view field);

// What can hurt people handling the substance, by the classes a safety data
// sheet uses; qualitative only (the report and the CLI print a caution per
// class and defer to the supplier's sheet and the applicable code).
enum class Hazard { Toxic, Corrosive, Flammable, Asphyxiant, Oxidiser, Carcinogen };
std::string_view hazardId(Hazard h);       // "toxic", "corrosive", ... (the file's spelling)
std::string_view hazardCaution(Hazard h);  // one clause, lower case, for people
// "Ammonia: toxic by inhalation: …; flammable: …." or empty when none.
std::string hazardSentence(const struct Substance& s);

// A custom substance's definition as it was written (its JSON object), kept
// opaque: the project writer writes it back unchanged, resolveProject reads
// it again under a new atmosphere, and core looks up its optional sections
// ("uncertainty"). Copies share it; it is never changed in place.
class SubstanceDefinition {
public:
    std::string compact() const;  // compact JSON text, e.g. a cache key
    friend bool operator==(const SubstanceDefinition& a, const SubstanceDefinition& b);

    struct Kept;  // the JSON object itself (substance.cpp)

private:
    friend struct SubstanceDefinitionAccess;
    std::shared_ptr<const Kept> kept_;
};

struct Substance {
    std::string id;       // "water", "carbon-dioxide", or a custom id
    std::string name;     // "Water", "Carbon dioxide"
    std::string formula;  // "H2O"
    std::string casNumber;
    bool custom = false;
    std::optional<SubstanceDefinition> definition;  // a custom substance as written in its project

    double molarMass = 0;  // kg/mol

    std::optional<CriticalPoint> critical;
    std::optional<TriplePoint> triple;
    std::optional<PhaseChangeData> melting;      // normal melting point and enthalpy of fusion
    std::optional<PhaseChangeData> boiling;      // vaporisation anchor: usually the normal boiling point
    std::optional<PhaseChangeData> sublimation;  // for substances without a liquid at 1 atm (CO2)

    std::optional<HeatCapacity> cpSolid;
    std::optional<HeatCapacity> cpLiquid;
    std::optional<HeatCapacity> cpVapor;  // ideal-gas heat capacity

    std::optional<double> liquidDensity;  // kg/m3, for condensed-phase specific volume
    std::optional<double> solidDensity;   // kg/m3

    std::optional<PengRobinsonData> pengRobinson;

    std::vector<Hazard> hazards;

    std::vector<SourceNote> sources;

    double gasConstant() const;  // specific gas constant R / M, J/(kg K)
    // Its name for people; its id when the definition gives no name.
    const std::string& displayName() const { return name.empty() ? id : name; }
};

// Reads one substance definition (the library's JSON or a project file's
// custom substance object) given as a value. `where` is the key it sits
// under ("substance"), the first element of every error's JSON path
// ("substance.melting.T"); empty, the paths start at the object. A value has
// no text, so its errors carry no line:column: the project file's reader
// and the library's read the same definition with both.
Result<Substance> parseSubstance(const nlohmann::ordered_json& j, std::string_view where,
                                 const UnitContext& context = {});

class SubstanceLibrary {
public:
    // The library embedded in the binary, loaded once on first use. A broken
    // embedded file is a build defect, caught by the tests.
    static const SubstanceLibrary& builtin();

    static Result<SubstanceLibrary> fromJsonTexts(std::span<const std::string_view> texts);

    const Substance* find(std::string_view id) const;
    std::span<const Substance> all() const { return substances_; }

private:
    std::vector<Substance> substances_;
};

}  // namespace heatchain
