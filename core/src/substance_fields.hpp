#pragma once
// Reading the fields of a substance definition (substance.cpp reads the
// definition; the library files and a project's custom substance share it):
// the JSON path of each field as "phases.liquid.cp[2]", unknown keys refused,
// quantities with their units, and the heat-capacity forms (a constant, a
// table, a polynomial or Shomate correlation, in pieces).
#include <initializer_list>
#include <optional>
#include <string>
#include <string_view>

#include <nlohmann/json.hpp>

#include "heatchain/heat_capacity.hpp"
#include "heatchain/result.hpp"
#include "heatchain/units.hpp"

namespace heatchain::detail::substance_fields {

using Json = nlohmann::ordered_json;

// "where.key", the path of a field.
std::string join(std::string_view where, std::string_view key);

// Unknown keys are errors: a misspelt "enthalpy" would otherwise drop data silently.
Status checkKeys(const Json& obj, std::string_view where, std::initializer_list<std::string_view> known);

Result<const Json*> objectAt(const Json& parent, std::string_view key, std::string_view where, bool required);

Result<std::string> stringAt(const Json& parent, std::string_view key, std::string_view where, bool required);

// A quantity string "<number> <unit>", or a JSON number for dimensionless fields.
Result<double> quantityOf(const Json& value, Dimension d, const std::string& path, const UnitContext& uc);

Result<std::optional<double>> optionalQuantity(const Json& parent, std::string_view key, Dimension d,
                                               std::string_view where, const UnitContext& uc);

Result<double> requiredQuantity(const Json& parent, std::string_view key, Dimension d, std::string_view where,
                                const UnitContext& uc);

// r, or an error at `path` when it is not above zero.
Result<double> positive(Result<double> r, const std::string& path);

// A finite JSON number.
Result<double> coefficientOf(const Json& value, const std::string& path);

Result<double> temperatureAt(const Json& parent, std::string_view key, std::string_view where, const UnitContext& uc);

// A heat capacity in any of its forms; M converts per-mole values.
Result<HeatCapacity> parseHeatCapacity(const Json& cp, const std::string& path, double M, const UnitContext& uc);

}  // namespace heatchain::detail::substance_fields
