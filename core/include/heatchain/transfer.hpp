#pragma once
// Heat transfer of a step: how big an exchanger its duty needs (steady flow),
// and how long a batch takes through the jacket or coil it has (closed
// systems). Both read the step's T–Q curve and its utility's line, as the
// solver has already drawn them; neither re-solves the material except to
// find a rated or timed end state.
//
// Sizing (steady flow). Along a stretch where both the material's and the
// utility's temperatures are straight lines in the duty, the area is exactly
//   A = ΔQ / (U · ΔT_lm),  ΔT_lm = (ΔT1 − ΔT2) / ln(ΔT1 / ΔT2)
// (Incropera & DeWitt, Fundamentals of Heat and Mass Transfer, 6th ed.,
// ch. 11, eqs. 11.14–11.15). A step's curve is straight between its sampled
// points, so the step's area is the sum of that formula over every pair of
// neighbouring points: the curve is split wherever it bends. A zone is one
// segment of the step (one phase, one phase change, so one U); its
// LMTD is its duty over U times its area, the log mean difference itself
// where the zone's curve is straight.
//
// Batch time (closed systems). With the material well mixed at T, the heat
// rate through a jacket or coil is
//   constant-temperature utility:  Q̇ = UA (T_u − T)
//   flowing sensible utility:      Q̇ = ṁ c_p ε (T_in − T),  ε = 1 − exp(−UA / (ṁ c_p))
// (the batch side has no temperature change across the surface, so ε is the
// effectiveness with a capacity ratio of zero: Incropera & DeWitt, ch. 11,
// eq. 11.35a), less the heat lost to the surroundings UA_loss (T − T0). Then
// dt = m dh / (Q̇ − Q̇_loss), summed along the step's curve; between sampled
// points both the heat and the rate are linear in T, so each piece is
// Δt = ΔQ · ln(q2/q1) / (q2 − q1) exactly. For a constant c_p against
// condensing steam this is t = (m c_p / UA) ln((Ts − T1)/(Ts − T2)) (Kern,
// Process Heat Transfer, 1950, ch. 18).
#include <optional>
#include <string>
#include <vector>

#include "heatchain/project.hpp"
#include "heatchain/result.hpp"

namespace heatchain {

struct StepResult;
struct UtilityProfile;

// The kind of zone a segment is, as the keys of a per-zone U: "liquid",
// "vapour", "two-phase", "solid", "solid-liquid", "solid-vapour".
std::string zoneKeyOf(Phase start, Phase end);

// Log mean temperature difference of two positive end differences; 0 when
// either is at or below zero (no finite area reaches it).
double logMeanTemperatureDifference(double dT1, double dT2);

struct TransferZone {
    std::string label;   // the segment's label ("liquid, sensible", "condensing")
    std::string key;     // its zone kind, as a key of a per-zone U
    double Q = 0;        // W (steady flow) or J (closed), signed as the step's Q
    double U = 0;        // W/(m2 K)
    double LMTD = 0;     // K: |Q| / (U · area)
    double area = 0;     // m2
};

struct StepTransfer {
    double UA = 0;          // W/K
    std::optional<double> area;   // m2 (none when only UA was given)
    double meanDeltaT = 0;  // K: |Q| / UA (steady flow); mean |Q̇| over the time-weighted UA (batch)
    std::vector<TransferZone> zones;  // sized zones (steady flow); each zone's time-mean difference (batch)
};

struct BatchPoint {
    double t = 0;     // s from the step's start
    double T = 0;     // K, material
    double Qdot = 0;  // W, the utility's heat into the material (negative when it cools)
    double Tutility = 0;  // K, the utility's temperature at the surface (outlet for a flowing one)
};

struct StepBatch {
    double duration = 0;   // s
    double peakDuty = 0;   // W, largest |Q̇| of the utility
    double meanDuty = 0;   // W, |heat from the utility| / duration
    double utilityHeat = 0;  // J, heat the utility gave the material (negative when it took heat)
    double heatLost = 0;   // J, to the surroundings over the step
    // J/K, the entropy change of a flowing sensible utility over the step,
    // ∫ ṁ c_p ln(T_out/T_in) dt (0 for a constant-temperature one).
    double utilityEntropy = 0;
    // How many of the batch's time constants the step spans: Σ ln(q1/q2) of
    // the net heat rate over its sensible stretches (t/τ, τ = m c_p / UA,
    // for one constant-c_p stretch). Past a few tens the end lies on the
    // exponential's tail: the driving difference left is e^(−N) of the first.
    double timeConstants = 0;
    std::vector<BatchPoint> profile;
};

// The heat-transfer view of a utility or plain reservoir serving a step.
struct TransferSide {
    bool constantTemperature = true;  // steam, fixed, a plain T
    double T = 0;         // K: the constant temperature, or a flowing utility's inlet
    double flowCp = 0;    // W/K: ṁ c_p of a flowing sensible utility (0 otherwise)
    // A steady-flow sensible utility: its temperature is linear in the duty
    // between `line` ends (counter-current), Q as CurvePoint::Q.
    bool linear = false;
    double Q0 = 0, T0 = 0, Q1 = 0, T1 = 0;
};

// Zone-by-zone sizing of a computed steady-flow step against its utility
// line. Errors name the step (a per-zone U missing the zone's key, a zero
// approach).
Result<StepTransfer> sizeStep(const HeatTransferSpec& spec, const StepResult& step, const TransferSide& side,
                              const std::string& where);

// Batch time along a computed closed-system step, `lossUA` (W/K) to the
// surroundings at `T0`. A per-zone U picks each segment's U. `transfer`, when
// given, receives the time-weighted UA, the mean difference and the zones
// (each zone's LMTD is its mean temperature difference over its time).
Result<StepBatch> batchTime(const HeatTransferSpec& spec, const StepResult& step, const TransferSide& side,
                            double lossUA, double T0, const std::string& where, StepTransfer* transfer = nullptr);

// A hold step: `duration` at the state `T`, the utility making up the loss.
StepBatch holdBatch(double duration, double T, double lossUA, double T0, double Tutility);

}  // namespace heatchain
