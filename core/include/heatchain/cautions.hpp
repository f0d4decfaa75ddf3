#pragma once
// Process conditions along a solved sequence that can hurt someone: what
// every view cautions about (the messages panel, the report's title block,
// the command line's ledger). Core finds them once; views word them.
#include <functional>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "heatchain/project.hpp"
#include "heatchain/solver.hpp"

namespace heatchain {

// Thresholds. Common practice, not a code; each view says to follow the
// applicable code and licensed practice.
// - Cryogenic: below −150 °C (123.15 K), the usual boundary of cryogenics.
// - Hot surfaces: above about 60 °C skin-contact burns become likely within
//   seconds to a minute (the burn thresholds of ISO 13732-1:2006 depend on
//   the surface material and the contact time; 60 °C is a round figure).
// - Pressure: above 0.5 bar gauge, the scope of the EU Pressure Equipment
//   Directive 2014/68/EU, Art. 1(1) (maximum allowable pressure PS greater
//   than 0.5 bar).
inline constexpr double kCryogenicBelow_K = 123.15;
inline constexpr double kHotAbove_K = 333.15;
inline constexpr double kPressureAboveGauge_Pa = 0.5e5;

struct ProcessCautions {
    std::optional<double> coldest_K;        // the material's lowest T, when below kCryogenicBelow_K
    std::optional<double> hottest_K;        // the material's highest T, when above kHotAbove_K
    std::optional<double> hottestSource_K;  // the hottest source of a heating step, when above kHotAbove_K
    std::optional<double> hottestSink_K;    // the hottest sink of a cooling step, when above kHotAbove_K
    bool steam = false;  // water as vapour (superheated, supercritical, or x > 0) while the material is hot
    std::optional<double> highestP_Pa;      // absolute; when above the atmosphere by more than kPressureAboveGauge_Pa
    bool any() const { return coldest_K || hottest_K || hottestSource_K || hottestSink_K || highestP_Pa; }
};

// Judged on every computed state along the path (each step's start and end
// and every point of its curves) and on each step's source or sink.
ProcessCautions processCautions(const Project& project, const SequenceResult& result);

// The standing caution every result carries.
std::string_view generalCaution();
// One sentence per caution that applies (cryogenic, hot surfaces, high
// pressure), in that order, the same words in every view; `quantity` writes
// a value as the view shows it (a temperature; a pressure, absolute or as a
// gauge reading).
using QuantityWords = std::function<std::string(double si, Dimension d, bool gauge)>;
std::vector<std::string> processCautionSentences(const ProcessCautions& cautions, const QuantityWords& quantity);

}  // namespace heatchain
