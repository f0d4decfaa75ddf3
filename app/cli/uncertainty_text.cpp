// The command line's side of uncertainty; see uncertainty_text.hpp.
#include "uncertainty_text.hpp"

#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <sstream>
#include <utility>

#include "heatchain/rules.hpp"

namespace heatchain::cli {

bool isUncertaintyOption(const std::string& option) {
    return option == "--uncertainty" || option == "--samples" || option == "--seed" || option == "--contributions";
}

namespace {
Result<long long> wholeNumber(const std::string& text, const char* option) {
    char* end = nullptr;
    const long long v = std::strtoll(text.c_str(), &end, 10);
    if (text.empty() || end != text.c_str() + text.size() || v < 0)
        return makeError(std::string(option) + " needs a whole number; got \"" + text + "\"");
    return v;
}
}  // namespace

Result<std::optional<UncertaintyOptions>> uncertaintyOptions(const std::map<std::string, std::string>& options) {
    auto method = options.find("--uncertainty");
    if (method == options.end()) {
        if (options.count("--samples") || options.count("--seed") || options.count("--contributions"))
            return makeError("--samples, --seed and --contributions go with --uncertainty");
        return std::optional<UncertaintyOptions>{};
    }
    UncertaintyOptions o;
    auto m = parseUncertaintyMethod(method->second.empty() ? "linear" : method->second);
    if (!m) return m.error();
    o.method = *m;
    if (o.method == UncertaintyMethod::Linear && (options.count("--samples") || options.count("--seed")))
        return makeError("--samples and --seed go with --uncertainty montecarlo");
    if (auto c = options.find("--contributions"); c != options.end()) o.contributionsOf = c->second;
    if (auto s = options.find("--samples"); s != options.end()) {
        auto n = wholeNumber(s->second, "--samples");
        if (!n) return n.error();
        if (*n < 2 || *n > kMaxUncertaintySamples)
            return makeError("--samples must be 2 to " + std::to_string(kMaxUncertaintySamples));
        o.samples = static_cast<int>(*n);
    }
    if (auto s = options.find("--seed"); s != options.end()) {
        auto n = wholeNumber(s->second, "--seed");
        if (!n) return n.error();
        o.seed = static_cast<std::uint64_t>(*n);
    }
    return std::optional<UncertaintyOptions>{o};
}

std::string uncertaintyText(const Project& project, const UncertaintyResult& r) {
    const UnitContext ctx = project.unitContext();
    const UnitSystem units = project.displayUnits;
    const bool mc = r.method == UncertaintyMethod::MonteCarlo;
    auto value = [&](UncertainOutput o) {
        // Below the solver's own noise, a spread is none.
        o.u = spreadForDisplay(o.u, o.value);
        // ± of a temperature is a temperature difference.
        const Dimension ud = o.dimension == Dimension::Temperature ? Dimension::TemperatureDifference : o.dimension;
        std::string s = formatQuantity(o.value, o.dimension, units, ctx) + " ± " + formatQuantity(o.u, ud, units, ctx);
        if (mc && o.p025 && o.p975)
            s += "  (95 %: " + formatQuantity(*o.p025, o.dimension, units, ctx) + " to " +
                 formatQuantity(*o.p975, o.dimension, units, ctx) + ")";
        return s;
    };
    std::ostringstream t;
    t << "\nUncertainty: ";
    if (mc)
        t << "Monte Carlo (JCGM 101:2008), " << r.samplesUsed << " of " << r.samples << " draws, seed " << r.seed;
    else
        t << "first order (JCGM 100:2008), sensitivities from re-solving at each input ± its standard uncertainty";
    t << "; ± is one standard uncertainty\n";
    for (const auto& s : project.steps) {
        const std::string at = "steps." + s.id + ".";
        const auto* Q = r.find(at + "Q");
        if (!Q) continue;
        t << "  " << s.id << ":";
        const char* sep = " ";
        for (const auto& [key, label] : {std::pair{"Q", "duty"}, std::pair{"W", "work"}})
            if (const auto* o = r.find(at + key); o && (o->value != 0 || o->u != 0)) {
                t << sep << label << " " << value(*o);
                sep = "; ";
            }
        if (const auto* T = r.find(at + "end.T_K")) t << sep << "end T " << value(*T);
        // A batch's jacket or coil area is given: its time is the answer.
        if (const auto* d = r.find(at + "duration_s")) t << "; time " << value(*d);
        else if (const auto* A = r.find(at + "area_m2")) t << "; area " << value(*A);
        t << "\n";
    }
    for (const auto& [key, label] : {std::pair{"heatingDuty", "heating duty"}, std::pair{"coolingDuty", "cooling duty"},
                                     std::pair{"W", "work"}, std::pair{"exergyDestroyed", "exergy destroyed"},
                                     std::pair{"area_m2", "area"}, std::pair{"cycleTime_s", "cycle time"}}) {
        const auto* o = r.find(std::string("totals.") + key);
        if (!o || (o->value == 0 && o->u == 0)) continue;
        t << "  totals: " << label << " " << value(*o) << "\n";
    }
    t << "Contributions to the variance of " << r.contributionsOf << " (first order):\n";
    for (const auto& c : r.contributions) {
        char pct[32];
        std::snprintf(pct, sizeof pct, "%6.1f %%", 100 * c.share);
        std::string text;
        for (const auto& in : r.inputs)
            if (in.path == c.input) text = in.text;
        t << "  " << pct << "  " << c.input << "  (" << text << ")\n";
    }
    for (const auto& n : r.notes) t << "  note: " << n << "\n";
    return t.str();
}

}  // namespace heatchain::cli
