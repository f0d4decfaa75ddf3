// heatchain-cli: compute, report, check, state and substances, per the
// command-line contract in the design notes. Exit status: 0 done; 2 usage
// error; 3 invalid input; 4 cannot compute. Messages on stderr.
#include <cmath>
#include <cstdio>
#include <fstream>
#include <iostream>
#include <map>
#include <optional>
#include <sstream>
#include <string>
#include <vector>

#include "heatchain/project_diff.hpp"
#include "heatchain/project_file.hpp"
#include "heatchain/property_model.hpp"
#include "heatchain/results_json.hpp"
#include "heatchain/solver.hpp"
#include "heatchain/substance.hpp"
#include "heatchain/sweep.hpp"
#include "heatchain/uncertainty.hpp"
#include "heatchain/units.hpp"
#include "heatchain/version.hpp"
#include "cli_json.hpp"
#include "ledger_text.hpp"
#include "recovery_text.hpp"
#include "uncertainty_text.hpp"

#ifdef HEATCHAIN_HAVE_REPORT
#include "heatchain/report.hpp"
#include "heatchain/recovery_report.hpp"
#endif

namespace {

using namespace heatchain;

constexpr int kDone = 0, kUsage = 2, kInvalid = 3, kCannotCompute = 4;

// One entry per verb: its synopsis (the general usage lists them all) and
// what `heatchain-cli VERB --help` adds.
struct VerbHelp {
    const char* verb;
    const char* synopsis;
    const char* details;
};

const VerbHelp kVerbs[] = {
    {"compute",
     "  heatchain-cli compute PROJECT|- [--json | --csv] [-o FILE|-]\n"
     "                        [--uncertainty [linear|montecarlo] [--samples N] [--seed S] [--contributions OUTPUT]]\n",
     "Solves the worksheet PROJECT and prints the ledger as a table, or SI numbers with fixed keys (--json), or one\n"
     "row per step and segment (--csv). PROJECT \"-\" is read from standard input; -o writes FILE\n"
     "atomically (\"-\": standard output). --uncertainty propagates the tolerances typed on\n"
     "quantities (\"80 degC ± 2 K\"): first order (linear, the default) or Monte Carlo.\n"},
    {"report", "  heatchain-cli report  PROJECT|- -o REPORT.pdf [--page A4|letter]\n",
     "Writes the PDF report (A4 unless --page letter). A worksheet of several streams gets an overview of\n"
     "the streams, a heat recovery section and a part per stream.\n"},
    {"chart", "  heatchain-cli chart   PROJECT|- --ts|--tq|--time|--composite|--grand-composite [--dtmin Q] -o FILE.svg|FILE.png\n",
     "Writes the T-s chart (--ts), the T-Q chart (--tq) or a batch's temperature and duty against time\n"
     "(--time) as SVG or PNG; or, for heat recovery, the\n"
     "hot and cold composite curves (--composite) or the grand composite curve with the utility\n"
     "levels (--grand-composite) of every stream at the minimum temperature difference Q (default:\n"
     "the worksheet's required minimum approach).\n"},
    {"targets", "  heatchain-cli targets PROJECT|- [--dtmin Q] [--json | --csv | --problem-table] [-o FILE|-]\n",
     "Heat recovery targets of every steady-flow stream of the worksheet: the least hot and cold\n"
     "utility any exchanger network could need, the pinch, the worksheet's utilities placed against\n"
     "the grand composite curve, and with --problem-table its intervals (--json: the \"recovery\" object of compute\n"
     "--json; --csv: the composite and grand composite curves). Q is the minimum temperature\n"
     "difference (\"10 K\"; a bare number is kelvin); default: the worksheet's required minimum approach.\n"},
    {"diff", "  heatchain-cli diff    BEFORE AFTER [--json]\n",
     "Says what changed between two revisions and how the results moved; exits 0 whether or not\n"
     "they differ.\n"},
    {"check", "  heatchain-cli check   PROJECT|-\n",
     "Validates and solves the worksheet PROJECT and says whether it is valid (exit 0, 3 or 4).\n"},
    {"state",
     "  heatchain-cli state   SUBSTANCE T=<q> P=<q> | P=<q> h=<q> | P=<q> s=<q> | T=<q> quality=<x> | P=<q> quality=<x>"
     "  [--model M] [--json]\n",
     "Prints one state of a built-in substance. M: constant-cp, temperature-dependent-cp,\n"
     "real-fluid, reference (the default).\n"},
    {"substances", "  heatchain-cli substances [--json]\n", "Lists the built-in substance library.\n"},
    {"sweep",
     "  heatchain-cli sweep   PROJECT|- --step ID|start --input PATH --from Q --to Q --points N\n"
     "                        [--outputs KEY,KEY,...] [--json | --csv] [-o FILE|-]\n"
     "      PATH of a step: to.T, to.P, to.duty, to.quality, to.ratio, to.time, efficiency, fraction, n,\n"
     "      source.T, sink.T, transfer.U, transfer.area, transfer.UA, duration; of the start: T, P,\n"
     "      quality, meltFraction.\n"
     "      --outputs list: heatchain-cli sweep PROJECT --list-outputs\n",
     "Varies one input linearly from --from to --to over N points and solves the worksheet at each;\n"
     "a point that cannot be computed is listed with its reason. Exit 4 only when no point could be\n"
     "computed.\n"},
};

const std::string kUsageText = [] {
    std::string t = "usage:\n";
    for (const auto& v : kVerbs) t += v.synopsis;
    return t + "  heatchain-cli VERB --help\n  heatchain-cli --version\n"
               "exit status: 0 done, 2 usage error, 3 invalid input, 4 cannot compute\n";
}();

int usage(const std::string& why) {
    std::cerr << "heatchain-cli: " << why << "\n" << kUsageText;
    return kUsage;
}

// Writes to -o FILE atomically, or to stdout (no -o, or -o -).
int emit(const std::string& text, const std::optional<std::string>& out) {
    if (!out || *out == "-") {
        std::cout << text;
        return kDone;
    }
    auto st = writeFileAtomically(*out, text, /*keepBackup=*/false);
    if (!st) {
        std::cerr << "heatchain-cli: " << st.error().text() << "\n";
        return kCannotCompute;
    }
    return kDone;
}

struct Args {
    std::vector<std::string> positional;
    std::map<std::string, std::string> options;  // --json → "", -o → value
};

Result<Args> parseArgs(int argc, char** argv, int from) {
    Args a;
    for (int i = from; i < argc; ++i) {
        std::string s = argv[i];
        if (s == "-o" || s == "--output" || s == "--model" || s == "--page" || s == "--step" || s == "--input" ||
            s == "--from" || s == "--to" || s == "--points" || s == "--outputs" || s == "--samples" || s == "--seed" ||
            s == "--contributions" || s == "--dtmin") {
            if (i + 1 >= argc) return makeError(s + " needs a value");
            a.options[s == "--output" ? "-o" : s] = argv[++i];
        } else if (s == "--uncertainty") {  // the method is optional
            const std::string next = i + 1 < argc ? argv[i + 1] : "";
            const bool method = next == "linear" || next == "montecarlo";
            a.options[s] = method ? argv[++i] : "linear";
        } else if (s.rfind("--", 0) == 0) {
            a.options[s] = "";
        } else {
            a.positional.push_back(s);
        }
    }
    return a;
}

// How messages name a PROJECT argument ("-" is standard input).
std::string inputName(const std::string& file) { return file == "-" ? "<stdin>" : file; }

// Reads PROJECT from its file, or from standard input when it is "-".
Result<Project> loadInput(const std::string& file) {
    if (file != "-") return loadProject(file);
    std::ostringstream text;
    text << std::cin.rdbuf();
    return parseProject(text.str(), "<stdin>");
}

// compute and check of a worksheet with several streams.
int computeStreams(const Args& a, const StreamSet& worksheet, bool checkOnly) {
    if (a.options.count("--uncertainty"))
        return usage("--uncertainty works on a worksheet of one stream");
    const bool json = a.options.count("--json"), csv = a.options.count("--csv");
    const cli::WorksheetAnswer answer = cli::computeWorksheet(worksheet, json, csv);
    const std::string name = inputName(a.positional[0]);
    int rc = kDone;
    if (checkOnly) {
        if (answer.errors.empty())
            std::cout << name << ": valid; " << worksheet.streams.size() << " streams, " << answer.steps
                      << " steps computed, " << answer.warnings << " warning" << (answer.warnings == 1 ? "" : "s") << "\n";
    } else {
        std::optional<std::string> out;
        if (auto it = a.options.find("-o"); it != a.options.end()) out = it->second;
        rc = emit(answer.text, out);
    }
    for (const std::string& e : answer.errors) std::cerr << "heatchain-cli: " << name << ": " << e << "\n";
    return answer.errors.empty() ? rc : kCannotCompute;
}

// Heat recovery targets of the worksheet's streams.
int targets(const Args& a) {
    if (a.positional.size() != 1) return usage("targets needs one PROJECT");
    for (const auto& [k, v] : a.options)
        if (k != "--json" && k != "--csv" && k != "-o" && k != "--dtmin" && k != "--problem-table")
            return usage("unknown option " + k);
    const bool json = a.options.count("--json"), csv = a.options.count("--csv");
    if (json && csv) return usage("--json and --csv exclude each other");
    auto dTmin = cli::dTminOption(a.options);
    if (!dTmin) return usage(dTmin.error().message);
    auto worksheet = cli::loadWorksheetInput(a.positional[0]);
    if (!worksheet) {
        std::cerr << "heatchain-cli: " << worksheet.error().text() << "\n";
        return kInvalid;
    }
    const auto results = solveStreams(*worksheet);
    auto recovery = worksheetRecovery(*worksheet, results, *dTmin);
    if (!recovery) {
        std::cerr << "heatchain-cli: " << inputName(a.positional[0]) << ": " << recovery.error().text() << "\n";
        return kCannotCompute;
    }
    std::optional<std::string> out;
    if (auto it = a.options.find("-o"); it != a.options.end()) out = it->second;
    const std::string text = json  ? recoveryToJson(*recovery).dump(2) + "\n"
                             : csv ? cli::targetsCsv(*recovery)
                                   : cli::targetsText(*worksheet, *recovery, a.options.count("--problem-table") > 0);
    return emit(text, out);
}

int compute(const Args& a, bool checkOnly) {
    if (a.positional.size() != 1) return usage("expected one PROJECT file");
    const bool json = a.options.count("--json"), csv = a.options.count("--csv");
    for (const auto& [k, v] : a.options)
        if (k != "--json" && k != "--csv" && k != "-o" && !cli::isUncertaintyOption(k))
            return usage("unknown option " + k);
    if (json && csv) return usage("--json and --csv exclude each other");
    if (checkOnly && (json || csv || a.options.count("-o"))) return usage("check takes no output options");
    auto uncertainty = cli::uncertaintyOptions(a.options);
    if (!uncertainty) return usage(uncertainty.error().message);
    if (*uncertainty && (csv || checkOnly)) return usage("--uncertainty goes with --json or the text ledger");
    auto worksheet = cli::loadWorksheetInput(a.positional[0]);
    if (!worksheet) {
        std::cerr << "heatchain-cli: " << worksheet.error().text() << "\n";
        return kInvalid;
    }
    if (worksheet->streams.size() > 1 || worksheet->version > 1) return computeStreams(a, *worksheet, checkOnly);
    const std::optional<Project> project = worksheet->streams.front().project;
    const auto result = solve(*project);
    const Error* err = result.firstError();
    if (checkOnly) {
        if (err) {
            std::cerr << "heatchain-cli: " << inputName(a.positional[0]) << ": " << err->text() << "\n";
            return kCannotCompute;
        }
        std::size_t warnings = 0;
        for (const auto& s : result.steps) warnings += s.warnings.size();
        std::cout << inputName(a.positional[0]) << ": valid; " << result.steps.size() << " steps computed, " << warnings
                  << " warning" << (warnings == 1 ? "" : "s") << "\n";
        return kDone;
    }
    std::optional<std::string> out;
    if (auto it = a.options.find("-o"); it != a.options.end()) out = it->second;
    std::optional<UncertaintyResult> unc;
    if (*uncertainty && !err) {
        auto u = propagateUncertainty(*project, **uncertainty);
        if (!u) {
            std::cerr << "heatchain-cli: " << inputName(a.positional[0]) << ": uncertainty: " << u.error().text() << "\n";
            return kCannotCompute;
        }
        unc = std::move(*u);
    }
    std::string text;
    if (json) {
        // Written a step at a time: a long worksheet's whole tree would
        // cost several times the memory of its solve.
        Json more = Json::object();
        more["recovery"] = recoveryMemberJson(*project, result);
        if (unc) more["uncertainty"] = uncertaintyJson(*unc);
        if (!out || *out == "-") {
            writeResultsJson(std::cout, *project, result, more);
            std::cout << "\n";
            std::cout.flush();
            if (!std::cout) return kCannotCompute;
        } else {
            std::ostringstream s;
            writeResultsJson(s, *project, result, more);
            s << "\n";
            text = std::move(s).str();
        }
    } else if (csv) {
        text = resultsToCsv(*project, result);
    } else {
        text = cli::ledgerText(*project, result) + (unc ? cli::uncertaintyText(*project, *unc) : "");
    }
    int rc = emit(text, out);
    if (err) {
        std::cerr << "heatchain-cli: " << inputName(a.positional[0]) << ": " << err->text() << "\n";
        return kCannotCompute;
    }
    return rc;
}

// Loads and solves PROJECT for the verbs that draw; the exit status on failure.
// (Unused in a build without the report library, where those verbs say so.)
[[maybe_unused]] std::optional<int> loadForDrawing(const std::string& file, std::optional<Project>& project,
                                  std::optional<SequenceResult>& result) {
    auto loaded = loadInput(file);
    if (!loaded) {
        std::cerr << "heatchain-cli: " << loaded.error().text() << "\n";
        return kInvalid;
    }
    project = std::move(*loaded);
    result = solve(*project);
    return std::nullopt;
}

int report(const Args& a) {
    if (a.positional.size() != 1 || !a.options.count("-o")) return usage("report needs PROJECT and -o REPORT.pdf");
    for (const auto& [k, v] : a.options)
        if (k != "-o" && k != "--page") return usage("unknown option " + k);
    if (a.options.at("-o") == "-") return usage("report writes a PDF file; -o - (standard output) is for text results");
#ifdef HEATCHAIN_HAVE_REPORT
    ReportOptions options;
    if (auto it = a.options.find("--page"); it != a.options.end()) {
        auto size = parsePageSize(it->second);
        if (!size) return usage(size.error().message);
        options.pageSize = *size;
    }
    // A worksheet of several streams gets its heat recovery section too.
    auto worksheet = cli::loadWorksheetInput(a.positional[0]);
    if (!worksheet) {
        std::cerr << "heatchain-cli: " << worksheet.error().text() << "\n";
        return kInvalid;
    }
    const std::vector<SequenceResult> results = solveStreams(*worksheet);
    auto st = writeReportPdf(*worksheet, results, inputName(a.positional[0]), a.options.at("-o"), options);
    if (!st) {
        std::cerr << "heatchain-cli: " << st.error().text() << "\n";
        return kCannotCompute;
    }
    for (std::size_t k = 0; k < results.size(); ++k) {
        if (const Error* err = results[k].firstError()) {
            std::cerr << "heatchain-cli: report written, but "
                      << (results.size() > 1 ? "stream \"" + worksheet->streams[k].id + "\", " : std::string()) << err->text()
                      << "\n";
            return kCannotCompute;
        }
    }
    return kDone;
#else
    return usage("report is not available in this build (it needs the Qt report library)");
#endif
}

// chart --composite | --grand-composite: the heat recovery charts of every stream.
int recoveryChart(const Args& a) {
    if (a.positional.size() != 1 || !a.options.count("-o"))
        return usage("chart needs PROJECT, --composite or --grand-composite, and -o FILE.svg|FILE.png");
    for (const auto& [k, v] : a.options)
        if (k != "-o" && k != "--composite" && k != "--grand-composite" && k != "--dtmin") return usage("unknown option " + k);
    if (a.options.count("--composite") && a.options.count("--grand-composite"))
        return usage("chart needs exactly one of --composite and --grand-composite");
    if (a.options.at("-o") == "-") return usage("chart writes an image file; -o - (standard output) is for text results");
    auto dTmin = cli::dTminOption(a.options);
    if (!dTmin) return usage(dTmin.error().message);
#ifdef HEATCHAIN_HAVE_REPORT
    if (auto format = imageFormatFor(a.options.at("-o")); !format) return usage(format.error().text());
    auto worksheet = cli::loadWorksheetInput(a.positional[0]);
    if (!worksheet) {
        std::cerr << "heatchain-cli: " << worksheet.error().text() << "\n";
        return kInvalid;
    }
    auto recovery = worksheetRecovery(*worksheet, solveStreams(*worksheet), *dTmin);
    if (!recovery) {
        std::cerr << "heatchain-cli: " << inputName(a.positional[0]) << ": " << recovery.error().text() << "\n";
        return kCannotCompute;
    }
    const auto kind = a.options.count("--composite") ? RecoveryChartKind::Composite : RecoveryChartKind::GrandComposite;
    if (auto st = exportRecoveryChart(*worksheet, *recovery, kind, a.options.at("-o")); !st) {
        std::cerr << "heatchain-cli: " << st.error().text() << "\n";
        return kCannotCompute;
    }
    return kDone;
#else
    return usage("chart is not available in this build (it needs the Qt report library)");
#endif
}

int chart(const Args& a) {
    if (a.options.count("--composite") || a.options.count("--grand-composite")) return recoveryChart(a);
    if (a.positional.size() != 1 || !a.options.count("-o")) return usage("chart needs PROJECT, --ts, --tq or --time, and -o FILE.svg|FILE.png");
    for (const auto& [k, v] : a.options)
        if (k != "-o" && k != "--ts" && k != "--tq" && k != "--time") return usage("unknown option " + k);
    const bool ts = a.options.count("--ts"), tq = a.options.count("--tq"), time = a.options.count("--time");
    if (a.options.at("-o") == "-") return usage("chart writes an image file; -o - (standard output) is for text results");
    if (int(ts) + int(tq) + int(time) != 1)
        return usage("chart needs exactly one of --ts (temperature-entropy), --tq (temperature-duty) and --time (batch time)");
#ifdef HEATCHAIN_HAVE_REPORT
    const std::string out = a.options.at("-o");
    if (auto format = imageFormatFor(out); !format) return usage(format.error().text());
    std::optional<Project> project;
    std::optional<SequenceResult> result;
    if (auto rc = loadForDrawing(a.positional[0], project, result)) return *rc;
    auto st = exportChart(*project, *result,
                          ts ? ChartKind::TemperatureEntropy : (time ? ChartKind::TemperatureTime : ChartKind::TemperatureDuty), out);
    if (!st) {
        std::cerr << "heatchain-cli: " << st.error().text() << "\n";
        return kCannotCompute;
    }
    if (const Error* err = result->firstError()) {
        std::cerr << "heatchain-cli: chart written, but " << err->text() << "\n";
        return kCannotCompute;
    }
    return kDone;
#else
    return usage("chart is not available in this build (it needs the Qt report library)");
#endif
}

// Exit 0 whether or not the revisions differ (a review aid, not a test).
int diff(const Args& a) {
    if (a.positional.size() != 2) return usage("diff needs two project files, BEFORE and AFTER");
    for (const auto& [k, v] : a.options)
        if (k != "--json") return usage("unknown option " + k);
    auto before = loadProject(a.positional[0]);
    if (!before) {
        std::cerr << "heatchain-cli: " << before.error().text() << "\n";
        return kInvalid;
    }
    auto after = loadProject(a.positional[1]);
    if (!after) {
        std::cerr << "heatchain-cli: " << after.error().text() << "\n";
        return kInvalid;
    }
    const auto ra = solve(*before), rb = solve(*after);
    const ProjectDiff d = diffProjects(*before, ra, *after, rb);
    if (a.options.count("--json")) {
        std::cout << projectDiffToJson(d, *after).dump(2) << "\n";
    } else {
        std::cout << "Comparing " << a.positional[0] << " (before) with " << a.positional[1] << " (after)\n"
                  << projectDiffText(d, *after);
    }
    for (const auto* r : {&ra, &rb})
        if (const Error* err = r->firstError())
            std::cerr << "heatchain-cli: note: " << (r == &ra ? a.positional[0] : a.positional[1]) << ": " << err->text() << "\n";
    return kDone;
}

int state(const Args& a) {
    if (a.positional.size() != 3) return usage("state needs a SUBSTANCE and two properties, e.g. water T=180degC P=10bar");
    for (const auto& [k, v] : a.options)
        if (k != "--json" && k != "--model") return usage("unknown option " + k);
    ModelKind kind = ModelKind::Reference;
    if (auto it = a.options.find("--model"); it != a.options.end()) {
        auto k = parseModelKind(it->second);
        if (!k) return usage(k.error().message);
        kind = *k;
    }
    std::map<std::string, std::string> props;
    for (std::size_t i = 1; i < 3; ++i) {
        const auto& p = a.positional[i];
        const auto eq = p.find('=');
        if (eq == std::string::npos) return usage("expected NAME=VALUE, got \"" + p + "\"");
        props[p.substr(0, eq)] = p.substr(eq + 1);
    }
    cli::StateFailure why = cli::StateFailure::Usage;
    auto answer = cli::queryState(a.positional[0], props, kind, why);
    if (!answer) {
        if (why == cli::StateFailure::Usage) return usage(answer.error().message);
        std::cerr << "heatchain-cli: " << answer.error().text() << "\n";
        return why == cli::StateFailure::InvalidInput ? kInvalid : kCannotCompute;
    }
    const State* st = &answer->state;
    const Substance* sub = answer->substance;
    const PropertyModel& m = *answer->model;
    if (a.options.count("--json")) {
        std::cout << cli::stateAnswerToJson(*answer).dump(2) << "\n";
        return kDone;
    }
    const std::string warnings = describeWarnings(st->warnings);
    auto line = [](const char* name, double v, const char* unit) {
        std::printf("  %-14s %.10g %s\n", name, v, unit);
    };
    std::printf("%s, %s (%s)\n", sub->name.c_str(), std::string(m.name()).c_str(), std::string(st->source).c_str());
    std::printf("  %-14s %s\n", "phase", std::string(phaseLabel(st->phase)).c_str());
    line("T", st->T, "K");
    line("P", st->P, "Pa");
    if (st->quality) line("quality", *st->quality, "");
    if (st->meltFraction) line("melt fraction", *st->meltFraction, "");
    line("h", st->h, "J/kg");
    line("s", st->s, "J/(kg K)");
    line("u", st->u, "J/kg");
    line("v", st->v, "m3/kg");
    if (std::isfinite(st->cp)) line("cp", st->cp, "J/(kg K)");
    if (std::isfinite(st->w)) line("speed of sound", st->w, "m/s");
    if (!warnings.empty()) std::printf("  warning: %s\n", warnings.c_str());
    return kDone;
}

int substances(const Args& a) {
    for (const auto& [k, v] : a.options)
        if (k != "--json") return usage("unknown option " + k);
    if (!a.positional.empty()) return usage("substances takes no arguments");
    const auto& lib = SubstanceLibrary::builtin();
    if (a.options.count("--json")) {
        std::cout << cli::substancesToJson(lib).dump(2) << "\n";
        return kDone;
    }
    std::printf("%-18s %-34s %-8s %10s %10s %10s\n", "id", "name", "formula", "M [g/mol]", "Tb [K]", "Tc [K]");
    for (const auto& s : lib.all()) {
        std::printf("%-18s %-34s %-8s %10.4f %10s %10s\n", s.id.c_str(), s.name.c_str(), s.formula.c_str(),
                    s.molarMass * 1000, s.boiling ? std::to_string(s.boiling->T).substr(0, 7).c_str() : "–",
                    s.critical ? std::to_string(s.critical->T).substr(0, 7).c_str() : "–");
    }
    return kDone;
}

int sweepCommand(const Args& a) {
    if (a.positional.size() != 1) return usage("sweep needs one PROJECT file");
    const bool json = a.options.count("--json"), csv = a.options.count("--csv");
    const bool list = a.options.count("--list-outputs");
    for (const auto& [k, v] : a.options)
        if (k != "--json" && k != "--csv" && k != "-o" && k != "--step" && k != "--input" && k != "--from" &&
            k != "--to" && k != "--points" && k != "--outputs" && k != "--list-outputs")
            return usage("unknown option " + k);
    if (json && csv) return usage("--json and --csv exclude each other");
    auto project = loadInput(a.positional[0]);
    if (!project) {
        std::cerr << "heatchain-cli: " << project.error().text() << "\n";
        return kInvalid;
    }
    if (list) {
        for (const auto& o : sweepOutputKeys(*project))
            std::cout << o.key << "  (" << o.label << ", " << cli::siLabel(o.dimension) << ")\n";
        return kDone;
    }
    for (const char* need : {"--step", "--input", "--from", "--to", "--points"})
        if (!a.options.count(need)) return usage(std::string("sweep needs ") + need);
    SweepSpec spec;
    spec.step = a.options.at("--step");
    spec.input = a.options.at("--input");
    spec.from = a.options.at("--from");
    spec.to = a.options.at("--to");
    try {
        std::size_t used = 0;
        spec.points = std::stoi(a.options.at("--points"), &used);
        if (used != a.options.at("--points").size()) throw std::invalid_argument("trailing text");
    } catch (const std::exception&) {
        return usage("--points needs a whole number, got \"" + a.options.at("--points") + "\"");
    }
    if (auto it = a.options.find("--outputs"); it != a.options.end()) {
        std::string cur;
        for (char c : it->second + ",") {
            if (c == ',') {
                if (!cur.empty()) spec.outputs.push_back(cur);
                cur.clear();
            } else if (c != ' ') {
                cur += c;
            }
        }
    }
    auto res = sweep(*project, spec);
    if (!res) {
        std::cerr << "heatchain-cli: " << inputName(a.positional[0]) << ": " << res.error().text() << "\n";
        return kInvalid;
    }
    const SweepResult& r = *res;
    std::string text;
    if (json) {
        text = cli::sweepToJson(spec, r).dump(2) + "\n";
    } else if (csv) {
        const auto q = csvField;
        std::ostringstream o;
        o << q(spec.input + " [" + cli::siLabel(r.inputDimension) + "]");
        for (const auto& out : r.outputs) o << "," << q(out.key + " [" + cli::siLabel(out.dimension) + "]");
        o << ",error\n";
        for (const auto& p : r.points) {
            o << csvNumber(p.x);
            for (const auto& v : p.values) {
                o << ",";
                if (v) o << csvNumber(*v);
            }
            o << "," << (p.error ? q(p.error->text()) : std::string()) << "\n";
        }
        text = o.str();
    } else {
        text = cli::sweepText(*project, r);
    }
    std::optional<std::string> out;
    if (auto it = a.options.find("-o"); it != a.options.end()) out = it->second;
    const int rc = emit(text, out);
    if (r.computed() == 0) {
        std::cerr << "heatchain-cli: " << inputName(a.positional[0]) << ": no point of the sweep could be computed\n";
        return kCannotCompute;
    }
    return rc;
}

}  // namespace

int main(int argc, char** argv) {
    if (argc < 2) return usage("no command given");
    const std::string verb = argv[1];
    if (verb == "--help" || verb == "-h" || verb == "help") {
        std::cout << kUsageText;
        return kDone;
    }
    if (verb == "--version") {
        std::cout << "heatchain-cli " << HEATCHAIN_VERSION_STRING << "\n";
        return kDone;
    }
    for (const auto& v : kVerbs) {
        if (verb != v.verb) continue;
        for (int i = 2; i < argc; ++i) {
            if (std::string(argv[i]) == "--help" || std::string(argv[i]) == "-h") {
                std::cout << "usage:\n" << v.synopsis << "\n" << v.details;
                return kDone;
            }
        }
    }
    auto args = parseArgs(argc, argv, 2);
    if (!args) return usage(args.error().message);
    if (verb == "compute") return compute(*args, false);
    if (verb == "check") return compute(*args, true);
    if (verb == "report") return report(*args);
    if (verb == "chart") return chart(*args);
    if (verb == "diff") return diff(*args);
    if (verb == "targets") return targets(*args);
    if (verb == "state") return state(*args);
    if (verb == "substances") return substances(*args);
    if (verb == "sweep") return sweepCommand(*args);
    return usage("unknown command \"" + verb + "\"");
}
