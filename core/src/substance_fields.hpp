#pragma once
// Reading a substance definition (substance.cpp reads the whole definition;
// the library files and a project's custom substance share it) and the
// fields it is made of: unknown keys refused, quantities with their units,
// and the heat-capacity forms (a constant, a table, a polynomial or Shomate
// correlation, in pieces). Everything reads through JsonReader with the
// JSON path of the field from the root of the text it came from, so an
// error names that path and its line:column; it is thrown as ReadFailure.
#include <initializer_list>
#include <optional>
#include <string>
#include <string_view>

#include "heatchain/heat_capacity.hpp"
#include "heatchain/substance.hpp"
#include "heatchain/units.hpp"
#include "json_reader.hpp"

namespace heatchain::detail {

// The definition object `v` found at `path`; quantities are read in r.units.
// Marks the substance custom (the library's loader unmarks its own).
Substance readSubstanceDefinition(const JsonReader& r, const Json& v, const JsonPath& path);

namespace substance_fields {

// Unknown keys are errors: a misspelt "enthalpy" would otherwise drop data silently.
void checkKeys(const JsonReader& r, const Json& obj, const JsonPath& path,
               std::initializer_list<std::string_view> known);

// The object under `key`, or null when it is absent and not required.
const Json* objectAt(const JsonReader& r, const Json& parent, const JsonPath& path, std::string_view key,
                     bool required);

// The string under `key`, or empty when it is absent and not required.
std::string stringAt(const JsonReader& r, const Json& parent, const JsonPath& path, std::string_view key,
                     bool required);

// A quantity string "<number> <unit>", or a JSON number for dimensionless fields.
double quantityOf(const JsonReader& r, const Json& value, const JsonPath& path, Dimension d);

std::optional<double> optionalQuantity(const JsonReader& r, const Json& parent, const JsonPath& path,
                                       std::string_view key, Dimension d);

double requiredQuantity(const JsonReader& r, const Json& parent, const JsonPath& path, std::string_view key,
                        Dimension d);

double temperatureAt(const JsonReader& r, const Json& parent, const JsonPath& path, std::string_view key);

// x, or an error at `path` when it is not above zero.
double positive(const JsonReader& r, double x, const JsonPath& path);

// A finite JSON number.
double coefficientOf(const JsonReader& r, const Json& value, const JsonPath& path);

// A heat capacity in any of its forms; M converts per-mole values.
HeatCapacity readHeatCapacity(const JsonReader& r, const Json& cp, const JsonPath& path, double M);

}  // namespace substance_fields
}  // namespace heatchain::detail
