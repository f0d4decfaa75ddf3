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
    r.P0 = project.surroundingsP.si;
    auto dead = model.stateTP(r.T0, r.P0);
    if (!dead) {
        r.warnings.push_back("exergy not computed: the dead state (" + degC(r.T0) + ", " + bar(r.P0) +
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
    for (auto& s : r.steps) {
        if (!s.computed) continue;
        s.exergyStart = ex(s.start);
        s.exergyEnd = ex(s.end);
        s.dEx = m * (s.exergyEnd - s.exergyStart);
        s.usefulWork = closed ? s.W + r.P0 * m * (s.end.v - s.start.v) : s.W;
        if (s.reservoirT) s.exergyHeat = s.Q * (1.0 - r.T0 / *s.reservoirT);
        else s.exergyHeat = s.Q == 0 ? 0.0 : s.Q - r.T0 * (s.dS - s.Sgen);
        s.exergySupplied = std::max(s.exergyHeat, 0.0) + std::max(s.usefulWork, 0.0) + std::max(-s.dEx, 0.0);
        if (s.exergySupplied > 0)
            s.secondLawEfficiency = std::clamp(1.0 - s.exergyDestroyed / s.exergySupplied, 0.0, 1.0);
        if (s.exergyHeat > 0) t.exergyHeatIn += s.exergyHeat; else t.exergyHeatOut -= s.exergyHeat;
        if (s.usefulWork > 0) t.workIn += s.usefulWork; else t.workOut -= s.usefulWork;
        last = &s.end;
    }
    if (last) t.dEx = m * (ex(*last) - r.exergyStart);
    t.exergySupplied = t.exergyHeatIn + t.workIn + std::max(-t.dEx, 0.0);
    if (t.exergySupplied > 0) t.secondLawEfficiency = std::clamp(1.0 - t.exergyDestroyed / t.exergySupplied, 0.0, 1.0);
    for (auto& s : r.steps)
        if (s.computed && t.exergyDestroyed > 0) s.exergyDestroyedShare = s.exergyDestroyed / t.exergyDestroyed;
}

}  // namespace heatchain::solver_detail
