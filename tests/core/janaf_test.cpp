// Ideal-gas heat capacity of the built-in library against the NIST-JANAF
// Thermochemical Tables, 4th ed. (M. W. Chase Jr., J. Phys. Chem. Ref. Data,
// Monograph 9, 1998). For each gas the library's vapour HeatCapacity gives
// cp(T) x M, H(T) - H(298.15 K) and S(T) - S(298.15 K); the tables give Cp°,
// S° and H° - H°(298.15 K) at 0.1 MPa. Requirement: agreement within 0.5 %.
//
// The table values below were typed from memory of the printed tables (marked
// so beside each table); a reviewer should confirm them against the tables.
// Two entries that memory did not reproduce consistently with their table
// neighbours are left out (NaN) and say why.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <limits>
#include <string>
#include <vector>

#include "heatchain/substance.hpp"

namespace {

using heatchain::Substance;
using heatchain::SubstanceLibrary;

constexpr double kTref = 298.15;          // K, reference temperature of the tables
constexpr double kTolerance = 0.005;       // 0.5 %, the library's stated requirement
constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

struct JanafRow {
    double T;   // K
    double cp;  // Cp°, J/(mol K)
    double S;   // S°, J/(mol K)
    double dH;  // H° - H°(298.15 K), kJ/mol
};

struct JanafTable {
    const char* id;     // library id
    const char* table;  // which NIST-JANAF table
    std::vector<JanafRow> rows;
};

// NIST-JANAF Thermochemical Tables, 4th ed., 1998 (from memory).
const std::vector<JanafTable>& tables() {
    static const std::vector<JanafTable> t = {
        {"nitrogen", "NIST-JANAF Thermochemical Tables, 4th ed., 1998, Nitrogen (N2) ideal gas table",
         {{298.15, 29.124, 191.609, 0.0},
          {400, 29.249, 200.181, 2.971},
          {500, 29.580, 206.739, 5.911},
          {600, 30.110, 212.176, 8.894},
          // S°(800 K) left out: the value recalled (220.907) is inconsistent
          // with the table's own 600 K and 1000 K entries by about 0.1 J/(mol K).
          {800, 31.434, kNaN, 15.046},
          {1000, 32.697, 228.170, 21.463},
          {1500, 34.852, 241.880, 38.405}}},
        {"oxygen", "NIST-JANAF Thermochemical Tables, 4th ed., 1998, Oxygen (O2) ideal gas table",
         {{298.15, 29.376, 205.147, 0.0},
          {400, 30.106, 213.871, 3.025},
          {500, 31.091, 220.693, 6.084},
          {600, 32.090, 226.451, 9.244},
          {800, 33.733, 235.921, 15.835},
          {1000, 34.870, 243.578, 22.707},
          {1500, 36.547, 258.068, 40.600}}},
        {"carbon-dioxide", "NIST-JANAF Thermochemical Tables, 4th ed., 1998, Carbon Dioxide (CO2) ideal gas table",
         {{298.15, 37.129, 213.795, 0.0},
          {400, 41.325, 225.307, 4.003},
          {500, 44.627, 234.901, 8.305},
          {600, 47.321, 243.283, 12.907},
          {800, 51.434, 257.494, 22.806},
          {1000, 54.308, 269.299, 33.397},
          {1500, 58.379, 292.199, 61.705}}},
        {"water", "NIST-JANAF Thermochemical Tables, 4th ed., 1998, Water (H2O) ideal gas table",
         {{298.15, 33.590, 188.834, 0.0},
          {400, 34.262, 198.787, 3.452},
          {500, 35.226, 206.534, 6.925},
          {600, 36.325, 213.052, 10.501},
          {800, 38.721, 223.826, 18.002},
          {1000, 41.268, 232.738, 26.000},
          {1500, 47.073, 250.620, 48.151}}},
        {"methane", "NIST-JANAF Thermochemical Tables, 4th ed., 1998, Methane (CH4) ideal gas table",
         {{298.15, 35.639, 186.251, 0.0},
          // H°-H°(298.15) at 400 K left out: the value recalled (3.886 kJ/mol)
          // exceeds the trapezoid bound from the table's own Cp° entries.
          {400, 40.500, 197.356, kNaN},
          {500, 46.342, 207.014, 8.200},
          {600, 52.227, 215.987, 13.130},
          {800, 62.944, 232.464, 24.675},
          {1000, 71.795, 247.549, 38.179},
          // Cp°(1500 K) left out: the value recalled (86.122) is not confirmed.
          {1500, kNaN, 279.705, 78.115}}},
    };
    return t;
}

double relative(double value, double reference) { return std::abs(value / reference - 1.0); }

// Compares one gas against its table and returns the largest relative deviation.
double compareWithTable(const JanafTable& table) {
    const Substance* gas = SubstanceLibrary::builtin().find(table.id);
    if (gas == nullptr) {
        ADD_FAILURE() << table.id << " is not in the built-in library";
        return 1.0;
    }
    if (!gas->cpVapor) {
        ADD_FAILURE() << table.id << " has no ideal-gas heat capacity";
        return 1.0;
    }
    const auto& cp = *gas->cpVapor;
    const double M = gas->molarMass;  // kg/mol
    const double S298 = table.rows.front().S;
    double worst = 0.0;
    for (const JanafRow& row : table.rows) {
        SCOPED_TRACE(std::string(table.table) + ", T = " + std::to_string(row.T) + " K");
        if (!std::isnan(row.cp)) {
            const double cpMolar = cp.cp(row.T) * M;  // J/(mol K)
            EXPECT_LE(relative(cpMolar, row.cp), kTolerance) << "Cp: " << cpMolar << " vs " << row.cp;
            worst = std::max(worst, relative(cpMolar, row.cp));
        }
        if (row.T == kTref) continue;  // differences are zero at the reference
        if (!std::isnan(row.dH)) {
            const double dH = (cp.enthalpy(row.T) - cp.enthalpy(kTref)) * M / 1000.0;  // kJ/mol
            EXPECT_LE(relative(dH, row.dH), kTolerance) << "H-H298: " << dH << " vs " << row.dH;
            worst = std::max(worst, relative(dH, row.dH));
        }
        if (!std::isnan(row.S)) {
            const double dS = (cp.entropy(row.T) - cp.entropy(kTref)) * M;  // J/(mol K)
            const double dSref = row.S - S298;
            EXPECT_LE(relative(dS, dSref), kTolerance) << "S-S298: " << dS << " vs " << dSref;
            worst = std::max(worst, relative(dS, dSref));
        }
    }
    std::printf("[ janaf    ] %-15s largest relative deviation %.3f %%\n", table.id, 100.0 * worst);
    ::testing::Test::RecordProperty(std::string("worst_") + table.id, std::to_string(100.0 * worst) + " %");
    return worst;
}

TEST(Janaf, NitrogenIdealGas) { EXPECT_LE(compareWithTable(tables()[0]), kTolerance); }
TEST(Janaf, OxygenIdealGas) { EXPECT_LE(compareWithTable(tables()[1]), kTolerance); }
TEST(Janaf, CarbonDioxideIdealGas) { EXPECT_LE(compareWithTable(tables()[2]), kTolerance); }
TEST(Janaf, WaterIdealGas) { EXPECT_LE(compareWithTable(tables()[3]), kTolerance); }
TEST(Janaf, MethaneIdealGas) { EXPECT_LE(compareWithTable(tables()[4]), kTolerance); }

// Law: the integrals are the integrals of cp. dH/dT = cp and T dS/dT = cp,
// checked by central differences at the table temperatures, for every piece
// of every gas above (a Shomate integral with a wrong sign or offset fails).
TEST(Janaf, EnthalpyAndEntropyAreIntegralsOfCp) {
    for (const JanafTable& table : tables()) {
        const Substance* gas = SubstanceLibrary::builtin().find(table.id);
        ASSERT_NE(gas, nullptr) << table.id;
        ASSERT_TRUE(gas->cpVapor.has_value()) << table.id;
        const auto& cp = *gas->cpVapor;
        for (const JanafRow& row : table.rows) {
            const double h = 1e-3;  // K
            const double dHdT = (cp.enthalpy(row.T + h) - cp.enthalpy(row.T - h)) / (2 * h);
            const double TdSdT = row.T * (cp.entropy(row.T + h) - cp.entropy(row.T - h)) / (2 * h);
            EXPECT_NEAR(dHdT / cp.cp(row.T), 1.0, 1e-5) << table.id << " at " << row.T << " K";
            EXPECT_NEAR(TdSdT / cp.cp(row.T), 1.0, 1e-5) << table.id << " at " << row.T << " K";
        }
    }
}

// Every substance the library promises loads from its embedded file and has
// the blocks a heating or boiling step needs (a broken file is a build defect).
TEST(Janaf, EveryLibrarySubstanceLoadsWithVapourCpAndBoilingPoint) {
    const char* ids[] = {"water", "nitrogen", "oxygen", "air", "argon", "hydrogen", "helium",
                         "carbon-dioxide", "carbon-monoxide", "methane", "ethane", "propane",
                         "n-butane", "isobutane", "n-hexane", "n-heptane", "benzene", "toluene",
                         "methanol", "ethanol", "acetone", "ammonia", "r-134a", "sulfur-dioxide"};
    for (const char* id : ids) {
        const Substance* s = SubstanceLibrary::builtin().find(id);
        ASSERT_NE(s, nullptr) << id;
        EXPECT_TRUE(s->cpVapor.has_value()) << id;
        EXPECT_TRUE(s->boiling.has_value()) << id;
        EXPECT_TRUE(s->critical.has_value()) << id;
        EXPECT_GT(s->molarMass, 0.0) << id;
        EXPECT_FALSE(s->sources.empty()) << id;
        // A latent heat is positive, and the boiling anchor lies below the critical point.
        if (s->boiling && s->critical) {
            EXPECT_GT(s->boiling->enthalpy, 0.0) << id;
            EXPECT_LT(s->boiling->T, s->critical->T) << id;
        }
    }
}

}  // namespace
