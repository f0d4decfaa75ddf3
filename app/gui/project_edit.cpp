#include "project_edit.hpp"

#include "heatchain/tolerance.hpp"

#include <algorithm>
#include <chrono>
#include <cctype>
#include <cmath>
#include <cstdio>
#include <sstream>
#include <vector>

#include "heatchain/json.hpp"
#include "heatchain/project_file.hpp"

namespace heatchain::gui {

Result<Project> newProject() {
    // The starting worksheet is written in the file format itself, so "New"
    // gives exactly what opening that file would give.
    static constexpr std::string_view text = R"({
  "format": "heatchain-project",
  "version": 1,
  "meta": { "title": "Untitled worksheet" },
  "display": { "units": "metric-engineering" },
  "system": "steady-flow",
  "model": "reference",
  "substance": "water",
  "basis": { "massFlow": "1 kg/s" },
  "start": { "T": "20 degC", "P": "1 atm" },
  "steps": []
})";
    auto p = parseProject(text, "new worksheet");
    if (p) {
        // The day the worksheet was made (UTC, ISO 8601).
        const auto today = std::chrono::floor<std::chrono::days>(std::chrono::system_clock::now());
        const std::chrono::year_month_day ymd{today};
        char buf[16];
        std::snprintf(buf, sizeof buf, "%04d-%02u-%02u", int(ymd.year()), unsigned(ymd.month()), unsigned(ymd.day()));
        p.value().meta.created = buf;
    }
    return p;
}

std::string uniqueStepId(const Project& project, std::string_view base) {
    std::string b(base);
    if (b.empty()) b = "step";
    if (!project.findStep(b)) return b;
    for (int n = 2; n < 100000; ++n) {
        std::string candidate = b + "-" + std::to_string(n);
        if (!project.findStep(candidate)) return candidate;
    }
    return b + "-x";
}

Result<Step> placedStep(const Project& project, int index, Step step, bool replace) {
    Project p = project;
    index = std::clamp(index, 0, int(p.steps.size()) - (replace ? 1 : 0));
    if (index < 0) return makeError("no step to edit");
    if (replace)
        p.steps[std::size_t(index)] = std::move(step);
    else
        p.steps.insert(p.steps.begin() + index, std::move(step));
    auto resolved = resolveProject(p);
    if (!resolved) return resolved.error();
    return std::move(resolved->steps[std::size_t(index)]);
}

Dimension dutyDimension(const Project& project) {
    return project.system == SystemKind::Closed ? Dimension::Energy : Dimension::Power;
}

namespace {

// A number for a default field: plain, at most 4 significant digits.
std::string plain(double v) {
    char buf[32];
    std::snprintf(buf, sizeof buf, "%.4g", v);
    return buf;
}

Quantity displayQuantity(double si, Dimension d, const Project& project, double step = 1.0) {
    const std::string_view unit = displayUnit(d, project.displayUnits);
    double shown = toDisplay(si, d, project.displayUnits, project.unitContext());
    shown = std::round(shown / step) * step;
    Quantity q;
    q.text = plain(shown) + " " + std::string(unit);
    auto parsed = parseQuantity(q.text, d, project.unitContext());
    q.si = parsed ? *parsed : si;
    return q;
}

Number number(double v) { return Number{v, plain(v), false}; }

}  // namespace

std::pair<double, double> stateBefore(const Project& project, const SequenceResult& result, int index) {
    double T = project.start.T ? project.start.T->si : 293.15;
    double P = project.start.P ? project.start.P->si : 101325.0;
    if (!result.startError) {
        T = result.start.T;
        P = result.start.P;
    }
    for (int i = std::min<int>(index, int(result.steps.size())) - 1; i >= 0; --i) {
        if (result.steps[std::size_t(i)].computed) {
            T = result.steps[std::size_t(i)].end.T;
            P = result.steps[std::size_t(i)].end.P;
            break;
        }
    }
    return {T, P};
}

Step defaultStep(const Project& project, const SequenceResult& result, StepKind kind, int index) {
    Step step;
    step.kind = kind;
    step.id = uniqueStepId(project, stepKindId(kind));
    const auto [T, P] = stateBefore(project, result, index);

    switch (kind) {
    case StepKind::Heat:
        step.to.T = displayQuantity(T + 20.0, Dimension::Temperature, project);
        break;
    case StepKind::Cool:
        step.to.T = displayQuantity(std::max(T - 20.0, 1.0), Dimension::Temperature, project);
        break;
    case StepKind::Compress:
        step.to.P = displayQuantity(2.0 * P, Dimension::Pressure, project);
        step.path = PathKind::Adiabatic;
        step.efficiency = number(0.75);
        break;
    case StepKind::Expand:
        step.to.P = displayQuantity(P / 2.0, Dimension::Pressure, project);
        step.path = PathKind::Isentropic;
        break;
    case StepKind::Throttle:
        step.to.P = displayQuantity(P / 2.0, Dimension::Pressure, project);
        break;
    case StepKind::Hold:
        step.duration = Quantity{"1 h", 3600.0};  // a hold lasts a while; the user sets how long
        break;
    default:
        break;  // phase changes: the whole change (fraction 1) unless told
    }
    return step;
}

Result<Quantity> parseTypedQuantity(std::string_view text, Dimension d, const Project& project) {
    std::string t(text);
    while (!t.empty() && std::isspace(static_cast<unsigned char>(t.back()))) t.pop_back();
    while (!t.empty() && std::isspace(static_cast<unsigned char>(t.front()))) t.erase(t.begin());
    // A tolerance ("80 degC ± 2 K") stays in the text, as the file keeps it;
    // core's reader of tolerances is the file reader's.
    if (hasTolerance(t)) {
        auto tv = parseToleranced(t, d, project.unitContext());
        if (!tv) return tv.error();
        return Quantity{t, tv->si};
    }
    auto si = parseQuantity(t, d, project.unitContext());
    if (!si) return si.error();
    return Quantity{t, *si};
}

Result<Number> parseTypedNumber(std::string_view text, BoundedField field, std::string_view what) {
    const NumberRange range = rangeOf(field);
    std::string t(text);
    while (!t.empty() && std::isspace(static_cast<unsigned char>(t.back()))) t.pop_back();
    while (!t.empty() && std::isspace(static_cast<unsigned char>(t.front()))) t.erase(t.begin());
    Number n;
    if (hasTolerance(t)) {
        // With a tolerance ("0.72 ± 0.03") the number is kept as typed, a
        // string in the file, as the file reader keeps it.
        auto tv = parseToleranced(t, Dimension::Dimensionless, {});
        if (!tv) return makeError(std::string(what) + ": " + tv.error().message);
        n = Number{tv->si, t, true};
    } else {
        // A fraction may be typed as a percentage ("50 %"); it is kept as the
        // fraction it means (0.5), the way the file holds it.
        bool percent = false;
        if (range.hi <= 1.0 && !t.empty() && t.back() == '%') {
            percent = true;
            t.pop_back();
            while (!t.empty() && std::isspace(static_cast<unsigned char>(t.back()))) t.pop_back();
        }
        Json raw = Json::parse(t, nullptr, /*allow_exceptions=*/false);
        if (raw.is_discarded() || !raw.is_number())
            return makeError("\"" + std::string(text) + "\" is not a number; " + std::string(what) +
                             (range.hi <= 1.0 ? " is a plain number, a percentage or a number ± its tolerance"
                                         : " is a plain number or a number ± its tolerance"));
        std::string chars = t;  // as typed: valid JSON, as parsed
        if (percent) {
            chars = plain(raw.get<double>() / 100.0);  // the fraction it means
            raw = Json::parse(chars);
            t += " %";
        }
        n = Number{raw.get<double>(), chars, false};
    }
    if (!range.contains(n.value)) {
        // Core's range (rules.hpp), said the way the step panel says it.
        std::string bounds;
        if (std::isinf(range.hi))
            bounds = (range.loOpen ? " must be above " : " must be at least ") + plain(range.lo);
        else if (range.loOpen)
            bounds = " must be above " + plain(range.lo) + (range.hiOpen ? " and below " : " and at most ") + plain(range.hi);
        else
            bounds = " must lie between " + plain(range.lo) + " and " + plain(range.hi);
        return makeError(std::string(what) + bounds + ", not " + t);
    }
    return n;
}

namespace {

std::vector<std::string> words(std::string_view line) {
    std::vector<std::string> out;
    std::istringstream in{std::string(line)};
    std::string w;
    while (in >> w) out.push_back(w);
    return out;
}

std::string lower(std::string s) {
    std::transform(s.begin(), s.end(), s.begin(),
                   [](unsigned char c) { return char(std::tolower(c)); });
    return s;
}

bool isKeyword(const std::string& w) {
    static const char* keys[] = {"to", "by", "duty", "ratio", "x", "quality", "source", "from",
                                 "sink", "into", "eff", "efficiency", "n", "fraction",
                                 "isothermal", "isentropic", "polytropic", "adiabatic",
                                 "constant-volume", "const-v", "id", "note"};
    for (const char* k : keys)
        if (w == k) return true;
    return false;
}

}  // namespace

Result<Step> parseQuickAdd(std::string_view line, const Project& project, std::optional<double> beforeT) {
    const std::vector<std::string> w = words(line);
    if (w.empty()) return makeError("type a step, e.g. \"heat to 180 degC\"");
    auto kind = parseStepKind(lower(w[0]));
    if (!kind)
        return makeError("\"" + w[0] + "\" is not a step kind; use heat, cool, melt, freeze, boil, "
                         "condense, sublimate, deposit, compress, expand or throttle");
    Step step;
    step.kind = *kind;
    step.id = uniqueStepId(project, stepKindId(*kind));

    // The value after a keyword runs until the next keyword.
    std::size_t i = 1;
    auto value = [&]() {
        std::string v;
        while (i < w.size() && !isKeyword(lower(w[i]))) {
            if (!v.empty()) v += ' ';
            v += w[i++];
        }
        return v;
    };
    while (i < w.size()) {
        std::string key = lower(w[i++]);
        // "to x 0.4": a quality target.
        if (key == "to" && i < w.size() && lower(w[i]) == "x") {
            ++i;
            key = "x";
        }
        if (key == "isothermal") { step.path = PathKind::Isothermal; continue; }
        if (key == "isentropic") { step.path = PathKind::Isentropic; continue; }
        if (key == "adiabatic") { step.path = PathKind::Adiabatic; continue; }
        if (key == "constant-volume" || key == "const-v") { step.at = HeatingAt::ConstantVolume; continue; }
        if (key == "polytropic") {
            step.path = PathKind::Polytropic;
            continue;
        }
        const std::string v = value();
        if (v.empty()) return makeError("\"" + key + "\" needs a value after it");
        if (key == "by") {
            // "by" is a change, never an end value: "heat by 10 K" ends 10 K
            // above where the step starts.
            if (step.kind != StepKind::Heat && step.kind != StepKind::Cool)
                return makeError("\"by\" names a change of temperature on a heat or cool step (\"heat by 10 K\"); "
                                 "for an end value write \"to\"");
            auto d = parseTypedQuantity(v, Dimension::TemperatureDifference, project);
            if (!d) return makeError("\"by " + v + "\": " + d.error().message + " (a change of temperature, e.g. \"by 10 K\")");
            if (!(d->si > 0)) return makeError("\"by " + v + "\": the change must be above zero; the step kind gives its direction");
            if (!beforeT) return makeError("\"by\" needs the temperature where the step starts, which is not computed yet");
            const double end = step.kind == StepKind::Heat ? *beforeT + d->si : *beforeT - d->si;
            if (!(end > 0)) return makeError("cooling by " + v + " would end below absolute zero");
            step.to.T = displayQuantity(end, Dimension::Temperature, project, 0.01);
            continue;
        }
        if (key == "to") {
            // A target is a temperature, a pressure or a duty: try each.
            if (auto t = parseTypedQuantity(v, Dimension::Temperature, project)) {
                step.to.T = *t; continue;
            }
            if (auto p = parseTypedQuantity(v, Dimension::Pressure, project)) {
                step.to.P = *p; continue;
            }
            if (auto d = parseTypedQuantity(v, dutyDimension(project), project)) {
                step.to.duty = *d; continue;
            }
            return makeError("\"" + v + "\" is neither a temperature, a pressure nor a duty");
        } else if (key == "duty") {
            auto d = parseTypedQuantity(v, dutyDimension(project), project);
            if (!d) return d.error();
            step.to.duty = *d;
        } else if (key == "ratio") {
            auto r = parseTypedNumber(v, BoundedField::Ratio, "pressure ratio");
            if (!r) return r.error();
            step.to.ratio = *r;
        } else if (key == "x" || key == "quality") {
            auto q = parseTypedNumber(v, BoundedField::Quality, "quality");
            if (!q) return q.error();
            step.to.quality = *q;
        } else if (key == "source" || key == "from") {
            auto t = parseTypedQuantity(v, Dimension::Temperature, project);
            if (!t) return t.error();
            step.source = Reservoir{*t, std::nullopt, UnknownFields{}};
        } else if (key == "sink" || key == "into") {
            auto t = parseTypedQuantity(v, Dimension::Temperature, project);
            if (!t) return t.error();
            step.sink = Reservoir{*t, std::nullopt, UnknownFields{}};
        } else if (key == "eff" || key == "efficiency") {
            auto e = parseTypedNumber(v, BoundedField::Efficiency, "isentropic efficiency");
            if (!e) return e.error();
            step.efficiency = *e;
            if (!step.path) step.path = PathKind::Adiabatic;
        } else if (key == "n") {
            auto n = parseTypedNumber(v, BoundedField::PolytropicExponent, "polytropic exponent n");
            if (!n) return n.error();
            step.n = *n;
            step.path = PathKind::Polytropic;
        } else if (key == "fraction") {
            auto f = parseTypedNumber(v, BoundedField::Fraction, "fraction");
            if (!f) return f.error();
            step.fraction = *f;
        } else if (key == "id") {
            if (project.findStep(v)) return makeError("a step named \"" + v + "\" exists already");
            step.id = v;
        } else if (key == "note") {
            step.note = v;
        }
    }
    if (isPressureChangeKind(step.kind) && step.kind != StepKind::Throttle && !step.path)
        step.path = PathKind::Isentropic;
    return step;
}

}  // namespace heatchain::gui
