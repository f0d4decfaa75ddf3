#include "recovery_text.hpp"

#include <cmath>
#include <iomanip>
#include <iostream>
#include <sstream>

#include "heatchain/results_json.hpp"
#include "heatchain/units.hpp"
#include "ledger_text.hpp"

namespace heatchain::cli {

Result<StreamSet> loadWorksheetInput(const std::string& file) {
    if (file != "-") return loadStreamSet(file);
    std::ostringstream text;
    text << std::cin.rdbuf();
    return parseStreamSet(text.str(), "<stdin>");
}

Result<std::optional<double>> dTminOption(const std::map<std::string, std::string>& options) {
    const auto it = options.find("--dtmin");
    if (it == options.end()) return std::optional<double>();
    const std::string& text = it->second;
    double value = 0;
    auto q = parseQuantity(text, Dimension::TemperatureDifference);
    if (q) {
        value = *q;
    } else {
        std::size_t used = 0;
        try {
            value = std::stod(text, &used);
        } catch (const std::exception&) {
            used = 0;
        }
        if (used == 0 || used != text.size())
            return makeError("--dtmin needs a temperature difference such as \"10 K\": " + q.error().message);
    }
    if (!std::isfinite(value) || value < 0) return makeError("--dtmin must be zero or more");
    return std::optional<double>(value);
}

namespace {

std::string fixed(double v, int digits) {
    std::ostringstream o;
    o << std::fixed << std::setprecision(digits) << v;
    return o.str();
}

}  // namespace

std::string targetsText(const StreamSet& set, const Recovery& r, bool problemTable) {
    const UnitSystem us = set.shared.displayUnits;
    const UnitContext ctx = set.shared.unitContext();
    const Targets& t = r.targets;
    const std::string uT = unitLabel(displayUnit(Dimension::Temperature, us));
    const std::string uQ = unitLabel(displayUnit(Dimension::Power, us));
    const std::string udT = unitLabel(displayUnit(Dimension::TemperatureDifference, us));
    auto T = [&](double v) { return fixed(toDisplay(v, Dimension::Temperature, us, ctx), 1) + " " + uT; };
    auto Q = [&](double v) { return fixed(toDisplay(v, Dimension::Power, us, ctx), 2) + " " + uQ; };

    std::ostringstream o;
    o << (set.shared.meta.title.empty() ? std::string("(untitled worksheet)") : set.shared.meta.title) << "\n";
    o << "Heat recovery targets at a minimum temperature difference of "
      << fixed(toDisplay(t.dTmin, Dimension::TemperatureDifference, us, ctx), 2) << " " << udT << "\n\n";
    o << "                     target        today\n";
    o << "  hot utility    " << std::setw(14) << Q(t.hotUtilityMin) << std::setw(14) << Q(r.hotUtilityNow) << "\n";
    o << "  cold utility   " << std::setw(14) << Q(t.coldUtilityMin) << std::setw(14) << Q(r.coldUtilityNow) << "\n";
    o << "  recoverable    " << Q(r.recoverableHot());
    if (auto share = r.recoverableHotShare()) o << ", " << fixed(100.0 * *share, 1) << " % of today's hot utility";
    o << "\n";
    if (t.pinchShifted.empty()) {
        o << "  pinch          none (";
        o << (t.hotUtilityMin <= 0 || t.coldUtilityMin <= 0 ? "a threshold case: one utility alone is needed"
                                                            : "no interior point where no heat flows")
          << ")\n";
    }
    for (std::size_t i = 0; i < t.pinchShifted.size(); ++i)
        o << "  pinch          " << T(t.pinchHot[i]) << " hot side, " << T(t.pinchCold[i]) << " cold side\n";
    if (!r.utilities.levels.empty()) {
        o << "\nUtility levels against the grand composite curve\n";
        for (const UtilityPlacement& u : r.utilities.levels)
            o << "  " << std::left << std::setw(16) << u.id << std::right << (u.hot ? " hot  " : " cold ") << std::setw(12)
              << T(u.T) << std::setw(16) << Q(u.duty) << "\n";
        if (hotFallsShort(r.utilities, t))
            o << "  no hot level is hot enough for " << Q(r.utilities.hotUnmet) << "\n";
        if (coldFallsShort(r.utilities, t))
            o << "  no cold level is cold enough for " << Q(r.utilities.coldUnmet) << "\n";
    }
    if (!r.timeAveraged.empty()) {
        o << "\nBatch streams time-averaged:";
        for (const std::string& id : r.timeAveraged) o << " \"" << id << "\"";
        o << ". Each batch's heat enters averaged over the stream's cycle time; this\n"
             "time-average view overstates what can be recovered between batches, which meet only when\n"
             "the schedule makes them happen at the same time or heat is stored in between.\n";
    }
    if (!r.excluded.empty()) {
        o << "\nLeft out\n";
        for (const Excluded& e : r.excluded) o << "  stream \"" << e.stream << "\": " << e.reason << "\n";
    }
    if (problemTable) {
        o << "\nProblem table (shifted temperatures; cascade: heat flowing down out of the interval)\n";
        o << "     from          to       surplus        cascade\n";
        for (const ProblemTableRow& row : t.problemTable)
            o << std::setw(10) << T(row.Ttop) << std::setw(12) << T(row.Tbottom) << std::setw(14) << Q(row.surplus)
              << std::setw(15) << Q(row.cascadeBelow) << "\n";
    }
    o << "\nThe curves are cut into straight pieces within " << fixed(r.toleranceK, 3)
      << " K of the solved temperatures. Targets are the least any exchanger network could need;\n"
         "they do not design one.\n";
    return o.str();
}

std::string targetsCsv(const Recovery& r) {
    std::ostringstream o;
    o << std::setprecision(10);
    o << "curve,Q_W,T_K\n";
    for (const CompositePoint& p : r.targets.hotComposite) o << "hot composite," << p.Q << "," << p.T << "\n";
    for (const CompositePoint& p : r.targets.coldComposite) o << "cold composite," << p.Q << "," << p.T << "\n";
    for (const CompositePoint& p : r.targets.grandComposite) o << "grand composite (shifted)," << p.Q << "," << p.T << "\n";
    return o.str();
}

WorksheetAnswer computeWorksheet(const StreamSet& set, bool json, bool csv) {
    WorksheetAnswer a;
    const std::vector<SequenceResult> results = solveStreams(set);
    for (std::size_t i = 0; i < results.size(); ++i) {
        const SequenceResult& r = results[i];
        a.steps += r.steps.size();
        for (const StepResult& s : r.steps) a.warnings += s.warnings.size();
        if (const Error* e = r.firstError()) a.errors.push_back("stream \"" + set.streams[i].id + "\": " + e->text());
    }
    if (json) {
        a.text = worksheetResultsToJson(set, results, worksheetRecovery(set, results)).dump(2) + "\n";
    } else if (csv) {
        std::ostringstream o;
        for (std::size_t i = 0; i < results.size(); ++i) {
            std::istringstream rows(resultsToCsv(set.streams[i].project, results[i]));
            std::string line;
            bool header = true;
            while (std::getline(rows, line)) {
                if (header && i > 0) {
                    header = false;
                    continue;
                }
                std::string id = set.streams[i].id;
                for (std::size_t k = id.find('"'); k != std::string::npos; k = id.find('"', k + 2)) id.insert(k, 1, '"');
                o << (header ? std::string("stream") : "\"" + id + "\"") << "," << line << "\n";
                header = false;
            }
        }
        a.text = o.str();
    } else {
        std::ostringstream o;
        for (std::size_t i = 0; i < results.size(); ++i) {
            const Stream& s = set.streams[i];
            o << "== stream \"" << s.id << "\"" << (s.name ? " (" + *s.name + ")" : std::string()) << "\n";
            o << ledgerText(s.project, results[i]) << "\n";
        }
        auto rec = worksheetRecovery(set, results);
        if (rec) o << targetsText(set, *rec, false);
        a.text = o.str();
    }
    return a;
}

}  // namespace heatchain::cli
