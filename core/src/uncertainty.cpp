// About 680 lines on purpose: the two propagation methods (first-order
// sensitivities and Monte Carlo) share the input collection, the result
// summaries and the inputs of heat transfer here.
// Propagation of the inputs' uncertainties through the solver; see
// uncertainty.hpp for the methods and their sources.
#include "heatchain/uncertainty.hpp"

#include <algorithm>
#include <atomic>
#include <cmath>
#include <limits>
#include <thread>

#include "heatchain/tolerance.hpp"
#include "unknown_fields_json.hpp"

namespace heatchain {

std::string_view uncertaintyMethodId(UncertaintyMethod m) {
    return m == UncertaintyMethod::MonteCarlo ? "montecarlo" : "linear";
}

Result<UncertaintyMethod> parseUncertaintyMethod(std::string_view id) {
    if (id == "linear") return UncertaintyMethod::Linear;
    if (id == "montecarlo") return UncertaintyMethod::MonteCarlo;
    return makeError("unknown uncertainty method \"" + std::string(id) + "\"; valid ones are linear, montecarlo");
}

const UncertainOutput* UncertaintyResult::find(std::string_view path) const {
    for (const auto& o : outputs)
        if (o.path == path) return &o;
    return nullptr;
}

void parallelFor(std::size_t n, unsigned threads, const std::function<void(std::size_t)>& fn) {
    if (threads == 0) threads = std::max(1u, std::thread::hardware_concurrency());
    threads = static_cast<unsigned>(std::min<std::size_t>(threads, n));
    if (threads <= 1) {
        for (std::size_t i = 0; i < n; ++i) fn(i);
        return;
    }
    // Work is handed out one index at a time: solves differ in cost.
    std::atomic<std::size_t> next{0};
    auto worker = [&] {
        for (std::size_t i = next.fetch_add(1); i < n; i = next.fetch_add(1)) fn(i);
    };
    std::vector<std::thread> pool;
    pool.reserve(threads - 1);
    for (unsigned t = 1; t < threads; ++t) pool.emplace_back(worker);
    worker();
    for (auto& t : pool) t.join();
}

namespace {

// ---- Inputs -------------------------------------------------------------------

// Where an input lives in a project (a copy is perturbed through it) and the
// range in which the solver may be given it.
struct InputSlot {
    UncertainInput in;
    std::function<double*(Project&)> field;  // null for a model input
    double lo = -std::numeric_limits<double>::infinity(), hi = std::numeric_limits<double>::infinity();
    bool loOpen = false, hiOpen = false;
    bool inside(double x) const {
        return (loOpen ? x > lo : x >= lo) && (hiOpen ? x < hi : x <= hi) && std::isfinite(x);
    }
};

constexpr double kInf = std::numeric_limits<double>::infinity();

struct Collector {
    const Project& p;
    std::vector<InputSlot> slots;
    std::optional<Error> error;

    void add(const std::string& path, const std::string& text, Dimension d, double si,
             std::function<double*(Project&)> field, double lo, bool loOpen, double hi, bool hiOpen) {
        if (error || !hasTolerance(text)) return;
        auto tv = parseToleranced(text, d, p.unitContext());
        if (!tv) {
            error = makeError(tv.error().message, path);
            return;
        }
        if (!tv->tolerance || tv->tolerance->u == 0) return;
        InputSlot s;
        s.in.path = path;
        s.in.text = text;
        s.in.dimension = d;
        s.in.value = si;
        s.in.u = tv->tolerance->u;
        s.in.distribution = tv->tolerance->distribution;
        s.field = std::move(field);
        s.lo = lo;
        s.hi = hi;
        s.loOpen = loOpen;
        s.hiOpen = hiOpen;
        slots.push_back(std::move(s));
    }
    // A quantity: temperatures, pressures and amounts are positive.
    void quantity(const std::string& path, const std::optional<Quantity>& q, Dimension d,
                  const std::function<Quantity*(Project&)>& at, bool positive = true) {
        if (!q) return;
        add(path, q->text, d, q->si, [at](Project& x) { return &at(x)->si; }, positive ? 0.0 : -kInf, positive,
            kInf, false);
    }
    void number(const std::string& path, const std::optional<Number>& n, const std::function<Number*(Project&)>& at,
                double lo, bool loOpen, double hi, bool hiOpen) {
        if (!n || !n->quoted) return;
        add(path, n->text, Dimension::Dimensionless, n->value,
            [at](Project& x) { return &at(x)->value; }, lo, loOpen, hi, hiOpen);
    }
};

Result<std::vector<InputSlot>> collectInputs(const Project& p) {
    Collector c{p, {}, {}};
    using D = Dimension;
    const Dimension energy = p.system == SystemKind::Closed ? D::Energy : D::Power;
    c.quantity("basis." + std::string(basisKey(p.basis.kind)), std::optional<Quantity>(p.basis.amount), basisDimension(p.basis.kind),
               [](Project& x) { return &x.basis.amount; });
    if (p.surroundings) {
        c.quantity("surroundings.T", std::optional<Quantity>(p.surroundings->T), D::Temperature,
                   [](Project& x) { return &x.surroundings->T; });
        c.quantity("surroundings.P", std::optional<Quantity>(p.surroundings->P), D::Pressure,
                   [](Project& x) { return &x.surroundings->P; });
    }
    c.quantity("minApproach", p.minApproach, D::TemperatureDifference, [](Project& x) { return &*x.minApproach; }, false);
    c.quantity("start.T", p.start.T, D::Temperature, [](Project& x) { return &*x.start.T; });
    c.quantity("start.P", p.start.P, D::Pressure, [](Project& x) { return &*x.start.P; });
    c.number("start.quality", p.start.quality, [](Project& x) { return &*x.start.quality; }, 0, false, 1, false);
    c.number("start.meltFraction", p.start.meltFraction, [](Project& x) { return &*x.start.meltFraction; }, 0, false,
             1, false);
    for (std::size_t i = 0; i < p.steps.size(); ++i) {
        const Step& s = p.steps[i];
        const std::string at = "steps." + s.id + ".";
        c.quantity(at + "to.T", s.to.T, D::Temperature, [i](Project& x) { return &*x.steps[i].to.T; });
        c.quantity(at + "to.P", s.to.P, D::Pressure, [i](Project& x) { return &*x.steps[i].to.P; });
        c.quantity(at + "to.duty", s.to.duty, energy, [i](Project& x) { return &*x.steps[i].to.duty; }, false);
        c.number(at + "to.quality", s.to.quality, [i](Project& x) { return &*x.steps[i].to.quality; }, 0, false, 1,
                 false);
        c.number(at + "to.ratio", s.to.ratio, [i](Project& x) { return &*x.steps[i].to.ratio; }, 1, true, kInf, false);
        c.number(at + "fraction", s.fraction, [i](Project& x) { return &*x.steps[i].fraction; }, 0, false, 1, false);
        c.number(at + "n", s.n, [i](Project& x) { return &*x.steps[i].n; }, 0, true, kInf, false);
        c.number(at + "efficiency", s.efficiency, [i](Project& x) { return &*x.steps[i].efficiency; }, 0, true, 1,
                 false);
        if (s.source)
            c.quantity(at + "source.T", s.source->T, D::Temperature, [i](Project& x) { return &*x.steps[i].source->T; });
        if (s.sink)
            c.quantity(at + "sink.T", s.sink->T, D::Temperature, [i](Project& x) { return &*x.steps[i].sink->T; });
        c.quantity(at + "to.time", s.to.time, D::Time, [i](Project& x) { return &*x.steps[i].to.time; });
        c.quantity(at + "duration", s.duration, D::Time, [i](Project& x) { return &*x.steps[i].duration; });
        if (s.transfer) {
            const HeatTransferSpec& t = *s.transfer;
            c.quantity(at + "transfer.U", t.U, D::HeatTransferCoefficient,
                       [i](Project& x) { return &*x.steps[i].transfer->U; });
            for (std::size_t z = 0; z < t.zoneU.size(); ++z)
                c.quantity(at + "transfer.U." + t.zoneU[z].first, std::optional<Quantity>(t.zoneU[z].second),
                           D::HeatTransferCoefficient, [i, z](Project& x) { return &x.steps[i].transfer->zoneU[z].second; });
            c.quantity(at + "transfer.area", t.area, D::Area, [i](Project& x) { return &*x.steps[i].transfer->area; });
            c.quantity(at + "transfer.UA", t.UA, D::ThermalConductance,
                       [i](Project& x) { return &*x.steps[i].transfer->UA; });
        }
        if (s.heatLoss)
            c.quantity(at + "heatLoss.UA", std::optional<Quantity>(s.heatLoss->UA), D::ThermalConductance,
                       [i](Project& x) { return &x.steps[i].heatLoss->UA; });
    }
    if (p.heatLoss)
        c.quantity("heatLoss.UA", std::optional<Quantity>(p.heatLoss->UA), D::ThermalConductance,
                   [](Project& x) { return &x.heatLoss->UA; });
    for (std::size_t k = 0; k < p.utilityList().size(); ++k) {
        const Utility& u = p.utilityList()[k];
        const std::string at = "utilities." + u.id + ".";
        c.quantity(at + "P", u.P, D::Pressure, [k](Project& x) { return &*(*x.utilities)[k].P; });
        c.quantity(at + "in", u.Tin, D::Temperature, [k](Project& x) { return &*(*x.utilities)[k].Tin; });
        c.quantity(at + "out", u.Tout, D::Temperature, [k](Project& x) { return &*(*x.utilities)[k].Tout; });
        c.quantity(at + "cp", u.cp, D::SpecificEntropy, [k](Project& x) { return &*(*x.utilities)[k].cp; });
        c.quantity(at + "density", u.density, D::Density, [k](Project& x) { return &*(*x.utilities)[k].density; });
        c.quantity(at + "T", u.T, D::Temperature, [k](Project& x) { return &*(*x.utilities)[k].T; });
        c.quantity(at + "flow", u.flow, D::MassFlow, [k](Project& x) { return &*(*x.utilities)[k].flow; });
    }
    if (c.error) return *c.error;

    auto on = modelUncertaintyOn(p);
    if (!on) return on.error();
    if (*on) {
        auto m = statedModelUncertainty(p);
        if (!m) return m.error();
        if (m->h > 0) {
            InputSlot s;
            s.in.path = "model." + (p.substance.id.empty() ? std::string("substance") : p.substance.id);
            s.in.text = m->model + ": ± " + std::to_string(m->h * 100).substr(0, 4) + " % in enthalpy differences";
            s.in.u = m->h;
            s.in.model = true;
            s.in.source = m->source;
            s.lo = -1;
            s.loOpen = true;
            c.slots.push_back(std::move(s));
        }
    }
    return std::move(c.slots);
}

// ---- Outputs ------------------------------------------------------------------

struct OutputDef {
    std::string path;
    Dimension dimension;
    bool scalesWithModel;  // an energy or entropy change: scaled by the model's relative error
    std::function<std::optional<double>(const SequenceResult&)> get;
    // Where only part of the output scales with the model (a total over
    // steps of which some are inputs): that part; else all of it or none.
    std::function<double(const SequenceResult&)> scaledPart = nullptr;
};

// A step's area or time is found by the solver (proportional to its duty
// between fixed temperatures, so the model's factor scales it), or typed:
// a given area or UA, a time target, a hold's duration (an input).
bool areaIsFound(const Step& s) { return !(s.transfer && (s.transfer->area || s.transfer->UA)); }
bool timeIsFound(const Step& s) { return !(s.to.time || s.kind == StepKind::Hold); }

std::vector<OutputDef> outputDefs(const Project& p, const SequenceResult& nominal) {
    const bool closed = p.system == SystemKind::Closed;
    const Dimension dE = closed ? Dimension::Energy : Dimension::Power;
    const Dimension dS = closed ? Dimension::Entropy : Dimension::EntropyRate;
    const Dimension dM = closed ? Dimension::Mass : Dimension::MassFlow;
    std::vector<OutputDef> d;
    d.push_back({"start.s_J_per_kgK", Dimension::SpecificEntropy, false,
                 [](const SequenceResult& r) -> std::optional<double> {
                     if (r.startError) return std::nullopt;
                     return r.start.s;
                 }});
    for (std::size_t i = 0; i < nominal.steps.size(); ++i) {
        const std::string at = "steps." + nominal.steps[i].id + ".";
        auto step = [&](const char* key, Dimension dim, bool scales, double StepResult::*f) {
            d.push_back({at + key, dim, scales, [i, f](const SequenceResult& r) -> std::optional<double> {
                             if (i >= r.steps.size() || !r.steps[i].computed) return std::nullopt;
                             return r.steps[i].*f;
                         }});
        };
        step("Q", dE, true, &StepResult::Q);
        step("W", dE, true, &StepResult::W);
        d.push_back({at + "end.T_K", Dimension::Temperature, false,
                     [i](const SequenceResult& r) -> std::optional<double> {
                         if (i >= r.steps.size() || !r.steps[i].computed) return std::nullopt;
                         return r.steps[i].end.T;
                     }});
        step("Sgen", dS, true, &StepResult::Sgen);
        step("exergyDestroyed", dE, true, &StepResult::exergyDestroyed);
        // Where the step ends on the T–s and T–Q charts, for their bands.
        d.push_back({at + "end.s_J_per_kgK", Dimension::SpecificEntropy, false,
                     [i](const SequenceResult& r) -> std::optional<double> {
                         if (i >= r.steps.size() || !r.steps[i].computed) return std::nullopt;
                         return r.steps[i].end.s;
                     }});
        // Heat transfer, where the step has it: the area a steady-flow step
        // needs and a batch step's duration.
        if (nominal.steps[i].transfer && nominal.steps[i].transfer->area)
            d.push_back({at + "area_m2", Dimension::Area, areaIsFound(p.steps[i]), [i](const SequenceResult& r) -> std::optional<double> {
                             if (i >= r.steps.size() || !r.steps[i].computed || !r.steps[i].transfer) return std::nullopt;
                             return r.steps[i].transfer->area;
                         }});
        if (nominal.steps[i].batch)
            d.push_back({at + "duration_s", Dimension::Time, timeIsFound(p.steps[i]), [i](const SequenceResult& r) -> std::optional<double> {
                             if (i >= r.steps.size() || !r.steps[i].computed || !r.steps[i].batch) return std::nullopt;
                             return r.steps[i].batch->duration;
                         }});
        d.push_back({at + "Qcumulative", dE, true, [i](const SequenceResult& r) -> std::optional<double> {
                         if (i >= r.steps.size() || !r.steps[i].computed) return std::nullopt;
                         double q = 0;
                         for (std::size_t k = 0; k <= i; ++k) q += r.steps[k].Q;
                         return q;
                     }});
    }
    auto total = [&](const char* key, Dimension dim, double Totals::*f) {
        d.push_back({std::string("totals.") + key, dim, true,
                     [f](const SequenceResult& r) -> std::optional<double> { return r.totals.*f; }});
    };
    total("Q", dE, &Totals::Q);
    total("W", dE, &Totals::W);
    total("dH", dE, &Totals::dH);
    total("dU", dE, &Totals::dU);
    total("dS", dS, &Totals::dS);
    total("Sgen", dS, &Totals::Sgen);
    total("exergyDestroyed", dE, &Totals::exergyDestroyed);
    total("heatingDuty", dE, &Totals::heatingDuty);
    total("coolingDuty", dE, &Totals::coolingDuty);
    // Totals of areas and times: the found ones scale with the model, the
    // given ones do not (the same split as the steps' own outputs above).
    std::vector<bool> areaFound(p.steps.size()), timeFound(p.steps.size());
    for (std::size_t i = 0; i < p.steps.size(); ++i) {
        areaFound[i] = areaIsFound(p.steps[i]);
        timeFound[i] = timeIsFound(p.steps[i]);
    }
    if (nominal.totals.area)
        d.push_back({"totals.area_m2", Dimension::Area, false,
                     [](const SequenceResult& r) -> std::optional<double> { return r.totals.area; },
                     [areaFound](const SequenceResult& r) {
                         double found = 0;
                         for (std::size_t i = 0; i < r.steps.size() && i < areaFound.size(); ++i)
                             if (areaFound[i] && r.steps[i].transfer && r.steps[i].transfer->area && !r.steps[i].batch)
                                 found += *r.steps[i].transfer->area;
                         return found;
                     }});
    if (nominal.totals.cycleTime)
        d.push_back({"totals.cycleTime_s", Dimension::Time, false,
                     [](const SequenceResult& r) -> std::optional<double> { return r.totals.cycleTime; },
                     [timeFound](const SequenceResult& r) {
                         double found = 0;
                         for (std::size_t i = 0; i < r.steps.size() && i < timeFound.size(); ++i)
                             if (timeFound[i] && r.steps[i].batch) found += r.steps[i].batch->duration;
                         return found;
                     }});
    for (std::size_t k = 0; k < nominal.utilities.size(); ++k) {
        if (nominal.utilities[k].kind == UtilityKind::Fixed) continue;  // no stream to count
        d.push_back({"utilities." + nominal.utilities[k].id + ".mass", dM, true,
                     [k](const SequenceResult& r) -> std::optional<double> {
                         if (k >= r.utilities.size() || r.utilities[k].error) return std::nullopt;
                         return r.utilities[k].mass;
                     }});
    }
    return d;
}

// One evaluation: every output at a set of input values, or why it failed.
struct Evaluation {
    std::vector<double> y;
    std::optional<std::string> failure;
};

class Evaluator {
public:
    Evaluator(const Project& p, std::shared_ptr<const PropertyModel> model, const std::vector<InputSlot>& slots,
              const std::vector<OutputDef>& outs)
        : p_(p), model_(std::move(model)), slots_(slots), outs_(outs) {}

    // x: one value per input (SI; a model input: its relative error).
    Evaluation operator()(const std::vector<double>& x) const {
        Project q = p_;
        double modelFactor = 1;
        for (std::size_t i = 0; i < slots_.size(); ++i) {
            if (slots_[i].in.model)
                modelFactor *= 1 + x[i];
            else
                *slots_[i].field(q) = x[i];
        }
        SolveOptions o;
        o.curvePointsPerStep = 0;
        const SequenceResult r = solve(q, model_, o);
        Evaluation e;
        if (const Error* err = r.firstError()) {
            e.failure = err->text();
            return e;
        }
        e.y.reserve(outs_.size());
        for (const auto& d : outs_) {
            auto v = d.get(r);
            if (!v || !std::isfinite(*v)) {
                e.failure = "no value for " + d.path;
                return e;
            }
            if (d.scaledPart) e.y.push_back(*v + (modelFactor - 1) * d.scaledPart(r));
            else e.y.push_back(d.scalesWithModel ? *v * modelFactor : *v);
        }
        return e;
    }

private:
    const Project& p_;
    std::shared_ptr<const PropertyModel> model_;
    const std::vector<InputSlot>& slots_;
    const std::vector<OutputDef>& outs_;
};

// ---- Random numbers ------------------------------------------------------------
// A draw's stream depends only on the seed and the draw's index, never on the
// thread that computes it.

// SplitMix64 (Steele, Lea & Flood 2014), to spread a seed into a state.
std::uint64_t splitmix64(std::uint64_t& s) {
    std::uint64_t z = (s += 0x9E3779B97F4A7C15ULL);
    z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ULL;
    z = (z ^ (z >> 27)) * 0x94D049BB133111EBULL;
    return z ^ (z >> 31);
}

// xoshiro256** (Blackman & Vigna 2018).
class Stream {
public:
    Stream(std::uint64_t seed, std::uint64_t index) {
        std::uint64_t s = seed ^ (index * 0xD1B54A32D192ED03ULL);
        for (auto& w : s_) w = splitmix64(s);
    }
    std::uint64_t next() {
        const std::uint64_t result = rotl(s_[1] * 5, 7) * 9;
        const std::uint64_t t = s_[1] << 17;
        s_[2] ^= s_[0];
        s_[3] ^= s_[1];
        s_[1] ^= s_[2];
        s_[0] ^= s_[3];
        s_[2] ^= t;
        s_[3] = rotl(s_[3], 45);
        return result;
    }
    // Uniform on (0, 1): 53 random bits, never 0.
    double uniform() { return (static_cast<double>(next() >> 11) + 0.5) * 0x1.0p-53; }
    // Standard normal by the Box–Muller transform (one of the pair kept, so a
    // draw uses a fixed number of uniforms per input).
    double normal() {
        const double u1 = uniform(), u2 = uniform();
        return std::sqrt(-2.0 * std::log(u1)) * std::cos(2.0 * 3.14159265358979323846 * u2);
    }

private:
    static std::uint64_t rotl(std::uint64_t x, int k) { return (x << k) | (x >> (64 - k)); }
    std::uint64_t s_[4];
};

// ---- First order ---------------------------------------------------------------

struct Sensitivities {
    std::vector<std::vector<double>> c;  // [input][output]
};

Result<Sensitivities> sensitivities(const Evaluator& eval, const std::vector<InputSlot>& slots,
                                    const std::vector<double>& x0, const std::vector<double>& y0, unsigned threads) {
    const std::size_t n = slots.size();
    std::vector<Evaluation> plus(n), minus(n);
    std::vector<double> hPlus(n), hMinus(n);
    for (std::size_t i = 0; i < n; ++i) {
        // Step: one standard uncertainty each way (JCGM 100:2008, 5.1.3, note 2);
        // a side that leaves the input's valid range is not taken.
        const double u = slots[i].in.u;
        hPlus[i] = slots[i].inside(x0[i] + u) ? u : 0;
        hMinus[i] = slots[i].inside(x0[i] - u) ? u : 0;
        if (hPlus[i] == 0 && hMinus[i] == 0)
            return makeError("the tolerance takes the value out of its valid range on both sides; make it smaller",
                             slots[i].in.path);
    }
    parallelFor(2 * n, threads, [&](std::size_t k) {
        const std::size_t i = k / 2;
        const bool up = k % 2 == 0;
        const double h = up ? hPlus[i] : hMinus[i];
        if (h == 0) return;
        std::vector<double> x = x0;
        x[i] += up ? h : -h;
        (up ? plus : minus)[i] = eval(x);
    });
    Sensitivities s;
    s.c.assign(n, std::vector<double>(y0.size(), 0.0));
    for (std::size_t i = 0; i < n; ++i) {
        const bool okP = hPlus[i] > 0 && !plus[i].failure;
        const bool okM = hMinus[i] > 0 && !minus[i].failure;
        if (!okP && !okM) {
            std::string why = plus[i].failure ? *plus[i].failure : minus[i].failure ? *minus[i].failure : "";
            return makeError("the sequence cannot be computed one standard uncertainty away from the value: " + why,
                             slots[i].in.path);
        }
        for (std::size_t j = 0; j < y0.size(); ++j) {
            if (okP && okM)
                s.c[i][j] = (plus[i].y[j] - minus[i].y[j]) / (hPlus[i] + hMinus[i]);
            else if (okP)
                s.c[i][j] = (plus[i].y[j] - y0[j]) / hPlus[i];
            else
                s.c[i][j] = (y0[j] - minus[i].y[j]) / hMinus[i];
        }
    }
    return s;
}

}  // namespace

Result<bool> modelUncertaintyOn(const Project& project) {
    const Json& kept = detail::jsonOf(project.extra);
    auto it = kept.find("uncertainty");
    if (it == kept.end()) return false;
    if (!it->is_object()) return makeError("must be an object such as { \"models\": true }", "uncertainty");
    for (auto f = it->begin(); f != it->end(); ++f)
        if (f.key() != "models") return makeError("unknown field \"" + f.key() + "\"; expected models", "uncertainty");
    auto m = it->find("models");
    if (m == it->end()) return false;
    if (!m->is_boolean()) return makeError("must be true or false; found " + m->dump(), "uncertainty.models");
    return m->get<bool>();
}

Result<std::vector<UncertainInput>> uncertainInputs(const Project& project) {
    auto slots = collectInputs(project);
    if (!slots) return slots.error();
    std::vector<UncertainInput> out;
    for (auto& s : *slots) out.push_back(s.in);
    return out;
}

Result<UncertaintyResult> propagateUncertainty(const Project& project, const UncertaintyOptions& options) {
    if (options.method == UncertaintyMethod::MonteCarlo &&
        (options.samples < 2 || options.samples > kMaxUncertaintySamples))
        return makeError("the number of samples must be 2 to " + std::to_string(kMaxUncertaintySamples) + "; got " +
                             std::to_string(options.samples),
                         "--samples");
    auto slotsR = collectInputs(project);
    if (!slotsR) return slotsR.error();
    const std::vector<InputSlot>& slots = *slotsR;
    if (slots.empty())
        return makeError(
            "no input carries a tolerance: write one such as \"80 degC ± 2 K\" or \"4.2 t/h ± 5 %\", or set "
            "\"uncertainty\": { \"models\": true }",
            "uncertainty");
    auto model = makeModel(project.model, project.substance);
    if (!model) return makeError(model.error().message, "model");
    SolveOptions o;
    o.curvePointsPerStep = 0;
    const SequenceResult nominal = solve(project, *model, o);
    if (const Error* e = nominal.firstError()) return *e;
    const auto outs = outputDefs(project, nominal);

    const Evaluator eval(project, *model, slots, outs);
    std::vector<double> x0;
    x0.reserve(slots.size());
    for (const auto& s : slots) x0.push_back(s.in.model ? 0.0 : s.in.value);
    const Evaluation e0 = eval(x0);
    if (e0.failure) return makeError(*e0.failure, "uncertainty");
    const std::vector<double>& y0 = e0.y;

    UncertaintyResult res;
    res.method = options.method;
    res.seed = options.method == UncertaintyMethod::MonteCarlo ? options.seed : 0;
    res.samples = options.method == UncertaintyMethod::MonteCarlo ? options.samples : 0;

    for (const auto& s : slots) res.inputs.push_back(s.in);

    // First order: always, for the contributions (and the linear result).
    auto sens = sensitivities(eval, slots, x0, y0, options.threads);
    if (!sens) return sens.error();
    auto varianceOf = [&](std::size_t j) {
        double var = 0;
        for (std::size_t i = 0; i < slots.size(); ++i) var += std::pow(sens->c[i][j] * slots[i].in.u, 2);
        return var;
    };
    std::size_t target = outs.size();
    if (options.contributionsOf.empty()) {
        for (const char* path : {"totals.heatingDuty", "totals.coolingDuty", "totals.W"}) {
            for (std::size_t j = 0; j < outs.size() && target == outs.size(); ++j)
                if (outs[j].path == path && varianceOf(j) > 0) target = j;
        }
        if (target == outs.size())
            for (std::size_t j = 0; j < outs.size(); ++j)
                if (outs[j].path == "totals.heatingDuty") target = j;
    } else {
        for (std::size_t j = 0; j < outs.size(); ++j)
            if (outs[j].path == options.contributionsOf) target = j;
    }
    if (target == outs.size()) {
        std::string known;
        for (const auto& d : outs) known += (known.empty() ? "" : ", ") + d.path;
        // Once, on the way out with an error.
        // NOLINTNEXTLINE(performance-inefficient-string-concatenation)
        return makeError("no output \"" + options.contributionsOf + "\"; this project has " + known, "contributions");
    }
    for (std::size_t j = 0; j < outs.size(); ++j) {
        UncertainOutput o;
        o.path = outs[j].path;
        o.dimension = outs[j].dimension;
        o.value = y0[j];
        o.u = std::sqrt(varianceOf(j));
        res.outputs.push_back(o);
    }
    res.contributionsOf = outs[target].path;
    const double total = varianceOf(target);
    for (std::size_t i = 0; i < slots.size(); ++i) {
        Contribution c;
        c.input = slots[i].in.path;
        c.sensitivity = sens->c[i][target];
        c.variance = std::pow(c.sensitivity * slots[i].in.u, 2);
        c.share = total > 0 ? c.variance / total : 0;
        res.contributions.push_back(c);
    }
    std::stable_sort(res.contributions.begin(), res.contributions.end(),
                     [](const Contribution& a, const Contribution& b) { return a.variance > b.variance; });

    if (options.method == UncertaintyMethod::Linear) return res;

    // Monte Carlo (JCGM 101:2008, 7).
    const auto N = static_cast<std::size_t>(options.samples);
    const std::size_t M = outs.size();
    std::vector<double> ys(N * M, 0.0);
    std::vector<unsigned char> status(N, 0);  // 0 computed, 1 outside an input's range, 2 failed
    parallelFor(N, options.threads, [&](std::size_t k) {
        Stream rng(options.seed, k);
        std::vector<double> x(slots.size());
        bool inside = true;
        for (std::size_t i = 0; i < slots.size(); ++i) {
            const auto& in = slots[i].in;
            const double centre = in.model ? 0.0 : in.value;
            // Rectangular: uniform on centre ± a with a = √3 u (JCGM 101:2008, 6.4.2).
            x[i] = in.distribution == Distribution::Rectangular
                       ? centre + std::sqrt(3.0) * in.u * (2 * rng.uniform() - 1)
                       : centre + in.u * rng.normal();
            inside = inside && slots[i].inside(x[i]);
        }
        if (!inside) {
            status[k] = 1;
            return;
        }
        const Evaluation e = eval(x);
        if (e.failure) {
            status[k] = 2;
            return;
        }
        std::copy(e.y.begin(), e.y.end(), ys.begin() + static_cast<std::ptrdiff_t>(k * M));
    });
    std::size_t used = 0, outside = 0, failed = 0;
    for (auto s : status) (s == 0 ? used : s == 1 ? outside : failed) += 1;
    res.samplesUsed = static_cast<int>(used);
    if (outside)
        res.notes.push_back(std::to_string(outside) + " of " + std::to_string(N) +
                            " draws fell outside an input's valid range and were left out");
    if (failed)
        res.notes.push_back(std::to_string(failed) + " of " + std::to_string(N) +
                            " draws could not be computed and were left out");
    if (used < 2) return makeError("fewer than two draws could be computed", "uncertainty");
    std::vector<double> col(used);
    for (std::size_t j = 0; j < M; ++j) {
        std::size_t r = 0;
        for (std::size_t k = 0; k < N; ++k)
            if (status[k] == 0) col[r++] = ys[k * M + j];
        // Mean and standard deviation (JCGM 101:2008, 7.6), summed in draw order.
        double mean = 0;
        for (double v : col) mean += v;
        mean /= double(used);
        double ss = 0;
        for (double v : col) ss += (v - mean) * (v - mean);
        UncertainOutput& o = res.outputs[j];
        o.mean = mean;
        o.u = std::sqrt(ss / double(used - 1));
        // Probabilistically symmetric 95 % coverage interval (JCGM 101:2008,
        // 7.7): q = pM rounded, r = (M − q)/2, the r-th and (r + q)-th of the
        // sorted values (1-based).
        std::sort(col.begin(), col.end());
        const auto q = static_cast<std::size_t>(std::floor(0.95 * double(used) + 0.5));
        const std::size_t lo = std::max<std::size_t>((used - q) / 2, 1);
        const std::size_t hi = std::min(lo + q, used);
        o.p025 = col[lo - 1];
        o.p975 = col[hi - 1];
    }
    return res;
}

Json uncertaintyJson(const UncertaintyResult& r) {
    Json j = Json::object();
    const bool mc = r.method == UncertaintyMethod::MonteCarlo;
    j["method"] = std::string(uncertaintyMethodId(r.method));
    j["samples"] = mc ? Json(r.samples) : Json(nullptr);
    j["seed"] = mc ? Json(r.seed) : Json(nullptr);
    Json outs = Json::object();
    auto opt = [](const std::optional<double>& v) { return v ? Json(*v) : Json(nullptr); };
    for (const auto& o : r.outputs)
        outs[o.path] = {{"value", o.value}, {"u", o.u}, {"mean", opt(o.mean)}, {"p025", opt(o.p025)},
                        {"p975", opt(o.p975)}};
    j["outputs"] = std::move(outs);
    Json items = Json::array();
    for (const auto& c : r.contributions) items.push_back({{"input", c.input}, {"share", c.share}});
    j["contributions"] = {{"output", r.contributionsOf}, {"items", std::move(items)}};
    return j;
}

}  // namespace heatchain
