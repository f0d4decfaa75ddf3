#include "transfer_text.hpp"

#include <cmath>
#include <cstdio>
#include <sstream>

#include "heatchain/units.hpp"

namespace heatchain::cli {

namespace {

std::string shown(double si, Dimension d, const Project& p, int significant = 4) {
    return formatQuantity(si, d, p.displayUnits, p.unitContext(), significant);
}

// A time as people read it: "42.5 min", "3.20 h".
std::string timeText(double s) {
    char buf[64];
    if (s < 120.0) std::snprintf(buf, sizeof buf, "%.3g s", s);
    else if (s < 3.0 * 3600.0) std::snprintf(buf, sizeof buf, "%.1f min", s / 60.0);
    else std::snprintf(buf, sizeof buf, "%.2f h", s / 3600.0);
    return buf;
}

// "116.95 °C, liquid + vapour x = 0.768": where a rated or timed step ends.
std::string endText(const State& e, const Project& p) {
    char buf[48];
    std::snprintf(buf, sizeof buf, "%.2f ", toDisplay(e.T, Dimension::Temperature, p.displayUnits, p.unitContext()));
    std::string t = buf + unitLabel(displayUnit(Dimension::Temperature, p.displayUnits)) + ", " +
                    std::string(phaseLabel(e.phase));
    if (e.quality && (e.phase == Phase::LiquidVapor || e.phase == Phase::SolidVapor)) {
        std::snprintf(buf, sizeof buf, " x = %.3f", *e.quality);
        t += buf;
    }
    if (e.meltFraction && e.phase == Phase::SolidLiquid) {
        std::snprintf(buf, sizeof buf, ", %.1f %% liquid", 100.0 * *e.meltFraction);
        t += buf;
    }
    return t;
}

}  // namespace

std::string transferText(const Project& p, const SequenceResult& r) {
    const bool closed = p.system == SystemKind::Closed;
    bool any = false;
    for (const auto& s : r.steps) any = any || (s.computed && (s.transfer || s.batch));
    if (!any) return "";
    std::ostringstream o;
    o << "\nheat transfer (" << (closed ? "batch time through the jacket or coil" : "exchanger area, zone by zone")
      << "):\n";
    for (std::size_t i = 0; i < r.steps.size(); ++i) {
        const auto& s = r.steps[i];
        if (!s.computed || (!s.transfer && !s.batch)) continue;
        o << "  " << s.id << ":";
        // A rated or timed step's answer is its end state: say it first.
        if (i < p.steps.size() && p.steps[i].to.rated)
            o << " rated, the exchanger given reaches " << endText(s.end, p) << " with "
              << shown(std::fabs(s.Q), closed ? Dimension::Energy : Dimension::Power, p) << ";";
        else if (i < p.steps.size() && p.steps[i].to.time)
            o << " after " << p.steps[i].to.time->text << " it is at " << endText(s.end, p) << ";";
        if (s.batch) {
            o << " time " << timeText(s.batch->duration) << ", peak duty " << shown(s.batch->peakDuty, Dimension::Power, p)
              << ", mean duty " << shown(s.batch->meanDuty, Dimension::Power, p);
            if (s.batch->heatLost != 0) o << ", heat lost " << shown(s.batch->heatLost, Dimension::Energy, p);
        }
        if (s.transfer) {
            if (s.batch) o << ";";
            if (s.transfer->area) o << " area " << shown(*s.transfer->area, Dimension::Area, p) << ",";
            o << " UA " << shown(s.transfer->UA, Dimension::ThermalConductance, p) << ", mean temperature difference "
              << shown(s.transfer->meanDeltaT, Dimension::TemperatureDifference, p);
        }
        o << "\n";
        if (s.transfer && !closed && s.transfer->zones.size() > 1) {
            for (const auto& z : s.transfer->zones) {
                o << "      " << z.label << ": duty " << shown(z.Q, Dimension::Power, p) << ", LMTD "
                  << shown(z.LMTD, Dimension::TemperatureDifference, p);
                if (z.U > 0)
                    o << ", U " << shown(z.U, Dimension::HeatTransferCoefficient, p) << ", area "
                      << shown(z.area, Dimension::Area, p);
                o << "\n";
            }
        }
    }
    if (r.totals.area) o << "  total area " << shown(*r.totals.area, Dimension::Area, p) << "\n";
    if (r.totals.cycleTime) o << "  cycle time " << timeText(*r.totals.cycleTime) << "\n";
    return o.str();
}

}  // namespace heatchain::cli
