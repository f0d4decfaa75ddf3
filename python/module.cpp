// heatchain._core: the thin C++ side of the Python module. It parses, writes,
// solves and sweeps through core and answers in the same JSON the command
// line prints (results_json, cli_json), so names and SI units match
// `heatchain-cli ... --json` by construction; the curves of the T-s and T-Q
// charts come as NumPy arrays. Errors become heatchain.Error (defined in
// Python) with the message, where, line and column of core's Error.
#include <pybind11/numpy.h>
#include <pybind11/pybind11.h>
#include <pybind11/stl.h>

#include <map>
#include <string>
#include <vector>

#include "cli_json.hpp"
#include "heatchain/project_file.hpp"
#include "heatchain/recovery.hpp"
#include "heatchain/results_json.hpp"
#include "heatchain/solver.hpp"
#include "heatchain/sweep.hpp"
#include "heatchain/uncertainty.hpp"
#include "heatchain/version.hpp"

namespace py = pybind11;
using namespace heatchain;

namespace {

// Carries a core Error out to the translator below.
struct CoreError {
    Error error;
    std::string file;  // the file name the caller gave, to tell it apart from the JSON path
};

[[noreturn]] void raise(const Error& e, const std::string& file = {}) { throw CoreError{e, file}; }

template <class T>
T take(Result<T> r, const std::string& file = {}) {
    if (!r) raise(r.error(), file);
    return std::move(*r);
}

py::array_t<double> toArray(const std::vector<double>& v) {
    py::array_t<double> a(static_cast<py::ssize_t>(v.size()));
    std::copy(v.begin(), v.end(), a.mutable_data());
    return a;
}

// One step's path as drawn on the charts: every segment's sampled points in
// order, under the state keys of the results JSON.
py::dict curveOf(const StepResult& s) {
    std::vector<double> T, sv, Q, P, h;
    for (const auto& seg : s.segments) {
        for (const auto& c : seg.curve) {
            T.push_back(c.T);
            sv.push_back(c.s);
            Q.push_back(c.Q);
            P.push_back(c.P);
            h.push_back(c.h);
        }
    }
    py::dict d;
    d["T_K"] = toArray(T);
    d["s_J_per_kgK"] = toArray(sv);
    d["Q"] = toArray(Q);
    d["P_Pa"] = toArray(P);
    d["h_J_per_kg"] = toArray(h);
    return d;
}

}  // namespace

PYBIND11_MODULE(_core, m) {
    m.doc() = "Heatchain's core, bound for Python (use the heatchain package, not this module)";
    m.attr("__version__") = HEATCHAIN_VERSION_STRING;

    py::register_exception_translator([](std::exception_ptr p) {
        try {
            if (p) std::rethrow_exception(p);
        } catch (const CoreError& e) {
            py::object cls = py::module_::import("heatchain").attr("Error");
            py::object err = cls(e.error.message, e.error.where, e.error.line, e.error.column, e.file);
            PyErr_SetObject(cls.ptr(), err.ptr());
        }
    });

    py::class_<Project>(m, "Project", "A parsed project; edit it through heatchain.Project");

    m.def("parse", [](const std::string& text, const std::string& fileName) {
        return take(parseProject(text, fileName), fileName);
    }, py::arg("text"), py::arg("file_name") = "");
    m.def("load", [](const std::string& path) { return take(loadProject(path), path); }, py::arg("path"));
    m.def("write", [](const Project& p) { return writeProject(p); }, py::arg("project"));
    m.def("save", [](const Project& p, const std::string& path) { take(saveProject(p, path), path); },
          py::arg("project"), py::arg("path"));

    // (results JSON text, one curve dict per step, first error or None)
    m.def("solve", [](const Project& p) {
        SequenceResult r;
        {
            py::gil_scoped_release unlocked;
            r = solve(p);
        }
        py::list curves;
        for (const auto& s : r.steps) curves.append(curveOf(s));
        py::object first = py::none();
        if (const Error* e = r.firstError())
            first = py::make_tuple(e->message, e->where, e->line, e->column);
        return py::make_tuple(resultsWithRecoveryToJson(p, r).dump(), curves, first);
    }, py::arg("project"));

    m.def("sweep", [](const Project& p, const std::string& step, const std::string& input, const std::string& from,
                      const std::string& to, int points, const std::vector<std::string>& outputs) {
        SweepSpec spec;
        spec.step = step;
        spec.input = input;
        spec.from = from;
        spec.to = to;
        spec.points = points;
        spec.outputs = outputs;
        Result<SweepResult> r = makeError("");
        {
            py::gil_scoped_release unlocked;
            r = sweep(p, spec);
        }
        return cli::sweepToJson(spec, take(std::move(r))).dump();
    }, py::arg("project"), py::arg("step"), py::arg("input"), py::arg("from_"), py::arg("to"), py::arg("points"),
       py::arg("outputs"));

    // The "uncertainty" object of compute --json --uncertainty, as JSON text.
    m.def("uncertainty", [](const Project& p, const std::string& method, int samples, std::uint64_t seed,
                            const std::string& contributionsOf) {
        UncertaintyOptions options;
        options.method = take(parseUncertaintyMethod(method));
        options.samples = samples;
        options.seed = seed;
        options.contributionsOf = contributionsOf;
        Result<UncertaintyResult> r = makeError("");
        {
            py::gil_scoped_release unlocked;
            r = propagateUncertainty(p, options);
        }
        return uncertaintyJson(take(std::move(r))).dump();
    }, py::arg("project"), py::arg("method"), py::arg("samples"), py::arg("seed"), py::arg("contributions_of"));

    m.def("state", [](const std::string& substance, const std::map<std::string, std::string>& properties,
                      const std::string& model) {
        const ModelKind kind = take(parseModelKind(model));
        cli::StateFailure why = cli::StateFailure::Usage;
        return cli::stateAnswerToJson(take(cli::queryState(substance, properties, kind, why))).dump();
    }, py::arg("substance"), py::arg("properties"), py::arg("model"));

    m.def("substances", [] { return cli::substancesToJson(SubstanceLibrary::builtin()).dump(); });
}
