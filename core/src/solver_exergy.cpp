// Exergy of the steps and of the sequence. Dead state: the substance at the
// surroundings' T0, P0, same model. Specific exergy of a state:
//   steady flow:  ψ = (h − h0) − T0 (s − s0)
//   closed:       φ = (u − u0) + P0 (v − v0) − T0 (s − s0)
// Exergy balance of a step (extensive):
//   ΔEx = Ex_Q + W_u − X_destroyed,   X_destroyed = T0 · S_gen
// with Ex_Q = Q (1 − T0 / T_res) the exergy carried in with the heat (for
// heat taken at the material's own temperature, Ex_Q = Q − T0 ΔS), and the
// useful work W_u = W (steady flow) or W + P0 ΔV (closed: the atmosphere does
// −P0 ΔV of the work). Exergy supplied to a step is the sum of the positive
// terms among Ex_Q, W_u and −ΔEx (heat exergy in, work in, exergy the material
// gives up); the rest leaves as product, so the second-law efficiency
//   η_II = 1 − X_destroyed / supplied   lies in [0, 1].
// Heating from a source: supplied = Ex_Q, product ΔEx. Compression:
// supplied = W, product ΔEx (+ heat exergy out). Expansion: supplied = −ΔEx,
// product −W. Throttling: supplied = −ΔEx, η_II = 0. The sequence takes the
// same rule over the whole chain: positive Ex_Q and W of all steps, plus the
// material's exergy drop from the start to the last end state.
#include <algorithm>
#include <cmath>
#include <string>

#include "solver_internal.hpp"

namespace heatchain::solver_detail {

// Exergy of the steps and the sequence (definitions at the top of this file).
void exergyAccounts(const Project& project, const PropertyModel& model, SequenceResult& r) {
    const bool closed = project.system == SystemKind::Closed;
    r.P0 = project.surroundingsOrDefault().P.si;
    auto dead = model.stateTP(r.T0, r.P0);
    if (!dead) {
        const UnitContext uc = project.unitContext();
        r.warnings.push_back("exergy not computed: the dead state (" +
                             quantityText(r.T0, Dimension::Temperature, project.displayUnits, uc) + ", " +
                             quantityText(r.P0, Dimension::Pressure, project.displayUnits, uc) +
                             ") is outside the model: " + dead.error().message);
        return;
    }
    r.deadState = *dead;
    r.exergyAvailable = true;
    const State& d = *dead;
    auto ex = [&](const State& s) {
        return closed ? (s.u - d.u) + r.P0 * (s.v - d.v) - r.T0 * (s.s - d.s) : (s.h - d.h) - r.T0 * (s.s - d.s);
    };
    const double m = r.massBasis;
    r.exergyStart = ex(r.start);
    auto& t = r.totals;
    const State* last = nullptr;
    // Steps with no source given carry no exergy-destroyed figure; the
    // sequence's figures leave them out whole (their heat and work, and the
    // change of the material's exergy they make, ΔEx = Ex_Q + W_u).
    double leftOutChange = 0;
    std::string leftOut;
    for (auto& s : r.steps) {
        if (!s.computed) continue;
        s.exergyStart = ex(s.start);
        s.exergyEnd = ex(s.end);
        s.dEx = m * (s.exergyEnd - s.exergyStart);
        s.usefulWork = closed ? s.W + r.P0 * m * (s.end.v - s.start.v) : s.W;
        if (s.reservoirT) s.exergyHeat = s.Q * (1.0 - r.T0 / *s.reservoirT);
        else s.exergyHeat = s.Q == 0 ? 0.0 : s.Q - r.T0 * (s.dS - s.Sgen);
        s.exergySupplied = std::max(s.exergyHeat, 0.0) + std::max(s.usefulWork, 0.0) + std::max(-s.dEx, 0.0);
        last = &s.end;
        if (s.exergyNotCharged) {
            leftOutChange += s.dEx;
            leftOut += (leftOut.empty() ? "\"" : ", \"") + s.id + "\"";
            continue;
        }
        if (s.exergySupplied > 0)
            s.secondLawEfficiency = std::clamp(1.0 - s.exergyDestroyed / s.exergySupplied, 0.0, 1.0);
        if (s.exergyHeat > 0) t.exergyHeatIn += s.exergyHeat; else t.exergyHeatOut -= s.exergyHeat;
        if (s.usefulWork > 0) t.workIn += s.usefulWork; else t.workOut -= s.usefulWork;
    }
    if (last) t.dEx = m * (ex(*last) - r.exergyStart);
    t.exergySupplied = t.exergyHeatIn + t.workIn + std::max(-(t.dEx - leftOutChange), 0.0);
    // While a step fails, a figure for the sequence would describe only part of it.
    if (t.exergySupplied > 0 && t.complete)
        t.secondLawEfficiency = std::clamp(1.0 - t.exergyDestroyed / t.exergySupplied, 0.0, 1.0);
    if (!leftOut.empty())
        r.notes.push_back("the sequence's exergy supplied and η_II leave out " + leftOut + ": no source given");
    for (auto& s : r.steps)
        if (s.computed && t.exergyDestroyed > 0) s.exergyDestroyedShare = s.exergyDestroyed / t.exergyDestroyed;
}

}  // namespace heatchain::solver_detail
