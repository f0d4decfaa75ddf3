// The PDF step report and the exports, run through heatchain-cli as a user
// would and read back with independent tools: poppler's pdfinfo and
// pdftotext for the PDF, Debian's Python xml.etree for the SVG. The core's
// JSON results (`compute --json`) are the oracle for every number shown:
// the report only formats them.
#include <gtest/gtest.h>

#include <algorithm>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <regex>
#include <set>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "heatchain/project_file.hpp"
#include "heatchain/units.hpp"
#include "support/pdf_text.hpp"
#include "support/run_command.hpp"
#include "support/samples.hpp"

namespace fs = std::filesystem;
using heatchain::testing::readWholeFile;
using heatchain::testing::lineStarting;
using heatchain::testing::pdfText;
using heatchain::testing::runCommand;
using heatchain::testing::squeeze;

namespace {

const char* kSamples[] = {"melt-tank", "nitrogen-warmup", "compressor-aftercooler", "solvent-recovery", "boiler-feed",
                          "ammonia-chiller"};

std::string sample(const std::string& name) {
    return heatchain::testing::samplePath(name);
}

std::string cli(const std::string& args) { return std::string(HEATCHAIN_CLI) + " " + args; }

fs::path scratch(const std::string& name) {
    const fs::path dir = fs::temp_directory_path() / ("heatchain-report-test-" + std::to_string(::getpid()));
    fs::create_directories(dir);
    return dir / name;
}

int pageCount(const fs::path& pdf) {
    auto r = runCommand(std::string(HEATCHAIN_PDFINFO) + " " + pdf.string());
    std::smatch m;
    if (std::regex_search(r.out, m, std::regex(R"(Pages:\s+(\d+))"))) return std::stoi(m[1]);
    return -1;
}

// Numbers of one line of text, with the typographic minus read as '-'.
std::vector<double> numbersIn(std::string line) {
    for (std::size_t at; (at = line.find("\xE2\x88\x92")) != std::string::npos;) line.replace(at, 3, "-");
    std::vector<double> out;
    std::regex num(R"((^|[\s(])(-?\d+(\.\d+)?(e[+-]?\d+)?)(?=\s|$))");
    for (auto it = std::sregex_iterator(line.begin(), line.end(), num); it != std::sregex_iterator(); ++it)
        out.push_back(std::stod((*it)[2]));
    return out;
}

// A displayed number against the core's value in display units: the report
// prints about five significant digits.
void expectShown(double shown, double expected, const std::string& what) {
    const double tol = std::max(1e-9, std::fabs(expected) * 2e-4) + 1e-3;
    EXPECT_NEAR(shown, expected, tol) << what;
}

nlohmann::json computeJson(const std::string& project) {
    auto r = runCommand(cli("compute " + project + " --json"));
    return nlohmann::json::parse(r.out, nullptr, false);
}

}  // namespace

TEST(Report, EverySampleHasItsStepsTotalsAndCautions) {
    for (const char* s : kSamples) {
        const fs::path pdf = scratch(std::string(s) + ".pdf");
        auto r = runCommand(cli("report " + sample(s) + " -o " + pdf.string()));
        ASSERT_EQ(r.exit, 0) << s << ": " << r.err;
        const int pages = pageCount(pdf);
        // Title block and ledger, the chart page, and the step sections.
        EXPECT_GE(pages, 3) << s;
        EXPECT_LE(pages, 12) << s;
        const std::string layout = pdfText(pdf, true);
        const std::string flat = squeeze(layout);
        const auto json = computeJson(sample(s));
        ASSERT_TRUE(json.is_object()) << s;
        for (const auto& st : json["steps"])
            EXPECT_NE(flat.find(st["id"].get<std::string>()), std::string::npos) << s << " lacks step " << st["id"];
        EXPECT_NE(flat.find("Heatchain computes idealised process paths. Pressure equipment, steam, cryogens and hot "
                            "surfaces are governed by local codes and licensed practice; have results checked by a "
                            "qualified engineer."),
                  std::string::npos)
            << s;
        EXPECT_NE(flat.find("Page 1 of " + std::to_string(pages)), std::string::npos) << s;

        // Totals and duties, in the project's display units (core's conversion).
        auto project = heatchain::loadProject(sample(s));
        ASSERT_TRUE(project.ok());
        const auto dim = project->system == heatchain::SystemKind::Closed ? heatchain::Dimension::Energy
                                                                           : heatchain::Dimension::Power;
        auto display = [&](double si) { return heatchain::toDisplay(si, dim, project->displayUnits); };
        const auto total = numbersIn(lineStarting(layout, "Total"));
        ASSERT_GE(total.size(), 6u) << s << ": " << lineStarting(layout, "Total");
        expectShown(total[0], display(json["totals"]["Q"]), std::string(s) + " total Q");
        expectShown(total[1], display(json["totals"]["W"]), std::string(s) + " total W");
        expectShown(total[5], display(json["totals"]["exergyDestroyed"]), std::string(s) + " exergy destroyed");
        // Then, where some step has them, the steady-flow area (m2) and a
        // batch's cycle time (min).
        // (json is const: operator[] of a key that is absent would read past
        // the object, so absent keys are asked for with value().)
        const nlohmann::json area = json["totals"].value("area_m2", nlohmann::json());
        const nlohmann::json cycle = json["totals"].value("cycleTime_s", nlohmann::json());
        if (area.is_number()) {
            ASSERT_GE(total.size(), 7u) << s;
            expectShown(total[6], area.get<double>(), std::string(s) + " total area");
        }
        if (cycle.is_number()) expectShown(total.back(), cycle.get<double>() / 60.0, std::string(s) + " cycle time");
        // The labels may wrap in the narrow step column ("Heating" / "duty").
        const auto heating = numbersIn(lineStarting(layout, "Heating"));
        const auto cooling = numbersIn(lineStarting(layout, "Cooling"));
        ASSERT_FALSE(heating.empty()) << s;
        ASSERT_FALSE(cooling.empty()) << s;
        expectShown(heating.back(), display(json["totals"]["heatingDuty"]), std::string(s) + " heating duty");
        expectShown(cooling.back(), display(json["totals"]["coolingDuty"]), std::string(s) + " cooling duty");
    }
}

TEST(Report, HazardsFollowTheConditions) {
    // nitrogen-warmup starts as a cryogenic liquid; boiler-feed makes steam
    // at over 20 barg. Thresholds: core/include/heatchain/cautions.hpp.
    const fs::path n2 = scratch("n2.pdf"), boiler = scratch("boiler.pdf");
    ASSERT_EQ(runCommand(cli("report " + sample("nitrogen-warmup") + " -o " + n2.string())).exit, 0);
    ASSERT_EQ(runCommand(cli("report " + sample("boiler-feed") + " -o " + boiler.string())).exit, 0);
    const std::string a = squeeze(pdfText(n2, false)), b = squeeze(pdfText(boiler, false));
    EXPECT_NE(a.find("Cryogenic temperatures"), std::string::npos);
    EXPECT_EQ(b.find("Cryogenic temperatures"), std::string::npos);
    EXPECT_NE(b.find("Steam and hot surfaces"), std::string::npos);
    EXPECT_NE(b.find("High pressure"), std::string::npos);
    // The substance's own hazards (library "hazards" classes): ammonia is
    // toxic, corrosive and flammable; water has none to add.
    const fs::path nh3 = scratch("nh3.pdf");
    ASSERT_EQ(runCommand(cli("report " + sample("ammonia-chiller") + " -o " + nh3.string())).exit, 0);
    const std::string c = squeeze(pdfText(nh3, false));
    EXPECT_NE(c.find("Ammonia: toxic by inhalation"), std::string::npos);
    EXPECT_NE(c.find("flammable"), std::string::npos);
    EXPECT_EQ(b.find("toxic by inhalation"), std::string::npos);
}

TEST(Report, PageSizes) {
    const fs::path a4 = scratch("a4.pdf"), letter = scratch("letter.pdf");
    ASSERT_EQ(runCommand(cli("report " + sample("melt-tank") + " -o " + a4.string())).exit, 0);
    ASSERT_EQ(runCommand(cli("report " + sample("melt-tank") + " -o " + letter.string() + " --page letter")).exit, 0);
    // ISO 216 A4 is 210 mm × 297 mm = 595.28 pt × 841.89 pt; US Letter 8.5 in × 11 in = 612 pt × 792 pt.
    // Qt writes whole points for A4's media box, so allow half a point.
    auto size = [](const fs::path& pdf) {
        std::smatch m;
        const std::string info = runCommand(std::string(HEATCHAIN_PDFINFO) + " " + pdf.string()).out;
        if (!std::regex_search(info, m, std::regex(R"(Page size:\s+([\d.]+) x ([\d.]+) pts)")))
            return std::pair<double, double>{0, 0};
        return std::pair<double, double>{std::stod(m[1]), std::stod(m[2])};
    };
    EXPECT_NEAR(size(a4).first, 595.28, 0.5);
    EXPECT_NEAR(size(a4).second, 841.89, 0.5);
    EXPECT_NEAR(size(letter).first, 612.0, 0.5);
    EXPECT_NEAR(size(letter).second, 792.0, 0.5);
    EXPECT_EQ(runCommand(cli("report " + sample("melt-tank") + " -o " + a4.string() + " --page A3")).exit, 2);
}

TEST(Report, TwoHundredStepsBreakAcrossPagesWithoutClipping) {
    // A long worksheet of our own: water warmed and cooled 100 times.
    nlohmann::ordered_json j = {
        {"format", "heatchain-project"}, {"version", 1},
        {"meta", {{"title", "Long worksheet, 200 steps"}, {"author", "report test"}, {"revision", "T"},
                  {"created", "2026-12-01T00:00:00Z"}, {"modified", "2026-12-01T00:00:00Z"}, {"notes", ""}}},
        {"display", {{"units", "SI"}}}, {"system", "steady-flow"}, {"model", "reference"},
        {"substance", "water"}, {"basis", {{"massFlow", "1 kg/s"}}},
        {"start", {{"T", "20 degC"}, {"P", "3 bar"}}}};
    auto steps = nlohmann::ordered_json::array();
    std::vector<std::string> ids;
    for (int i = 1; i <= 200; ++i) {
        char id[16];
        std::snprintf(id, sizeof id, "leg-%03d", i);
        ids.push_back(id);
        if (i % 2) steps.push_back({{"id", id}, {"kind", "heat"}, {"to", {{"T", "80 degC"}}}, {"source", {{"T", "120 degC"}}}});
        else steps.push_back({{"id", id}, {"kind", "cool"}, {"to", {{"T", "20 degC"}}}, {"sink", {{"T", "10 degC"}}}});
    }
    j["steps"] = steps;
    const fs::path project = scratch("long.hchain"), pdf = scratch("long.pdf");
    std::ofstream(project) << j.dump(2);
    auto r = runCommand(cli("report " + project.string() + " -o " + pdf.string()));
    ASSERT_EQ(r.exit, 0) << r.err;
    const int pages = pageCount(pdf);
    const int fivePages = [&] {
        const fs::path small = scratch("small.pdf");
        runCommand(cli("report " + sample("boiler-feed") + " -o " + small.string()));
        return pageCount(small);
    }();
    // 200 step sections of a few centimetres each, and a ledger of ~5 pages:
    // far more pages than a 5-step report, but not a page per step.
    EXPECT_GT(pages, fivePages + 20);
    EXPECT_LT(pages, 110);
    const std::string text = pdfText(pdf, false);
    for (const auto& id : ids) {
        // Each id in the ledger and as its section heading.
        std::size_t count = 0;
        for (std::size_t at = text.find(id); at != std::string::npos; at = text.find(id, at + 1)) ++count;
        EXPECT_GE(count, 2u) << id;
    }
    EXPECT_NE(text.find("All steps, continued"), std::string::npos) << "ledger header repeated on later pages";

    // No clipping: every word lies on its page, and no body text runs into
    // the bottom margin above the footer rule (18 mm body margin, footer rule
    // 12 mm from the edge).
    const std::string script = R"py(
import re, subprocess, sys
html = subprocess.run([sys.argv[1], '-bbox', sys.argv[2], '-'], capture_output=True, text=True).stdout
bad = 0
for page in re.finditer(r'<page width="([\d.]+)" height="([\d.]+)">(.*?)</page>', html, re.S):
    w, h, body = float(page.group(1)), float(page.group(2)), page.group(3)
    mm = 72 / 25.4
    for m in re.finditer(r'xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)"', body):
        x0, y0, x1, y1 = map(float, m.groups())
        if x0 < 0 or y0 < 0 or x1 > w or y1 > h: bad += 1
        if y1 > h - 18 * mm + 0.5 and y0 < h - 12 * mm: bad += 1
print(bad)
)py";
    const fs::path py = scratch("bbox.py");
    std::ofstream(py) << script;
    auto check = runCommand(std::string(HEATCHAIN_PYTHON) + " " + py.string() + " " + HEATCHAIN_PDFTOTEXT + " " + pdf.string());
    EXPECT_EQ(check.out, "0\n") << check.err;
}

TEST(Exports, CsvCarriesUnitsAndTheLedgerNumbers) {
    for (const char* s : kSamples) {
        const auto json = computeJson(sample(s));
        auto csv = runCommand(cli("compute " + sample(s) + " --csv"));
        ASSERT_EQ(csv.exit, 0) << s;
        std::istringstream in(csv.out);
        std::string header;
        std::getline(in, header);
        const auto& u = json["units"];
        for (const std::string col : {"Q", "W", "dH"})
            EXPECT_NE(header.find(col + " [" + u[col].get<std::string>() + "]"), std::string::npos) << s << header;
        EXPECT_NE(header.find("Sgen [" + u["Sgen"].get<std::string>() + "]"), std::string::npos) << s;
        EXPECT_NE(header.find("T_end [K]"), std::string::npos);
        const std::size_t columns = std::size_t(std::count(header.begin(), header.end(), ',')) + 1;
        EXPECT_GE(columns, 15u) << "the ledger's 15 columns, then any added at the end";
        // Step rows (no segment label) in order: Q, W, dH, dS, Sgen, exergy at columns 9..14.
        std::size_t step = 0;
        bool seenTotal = false;
        std::string line;
        while (std::getline(in, line)) {
            std::vector<std::string> cells;
            std::string cell;
            bool quoted = false;
            for (char c : line) {
                if (c == '"') quoted = !quoted;
                else if (c == ',' && !quoted) { cells.push_back(cell); cell.clear(); }
                else cell += c;
            }
            cells.push_back(cell);
            ASSERT_EQ(cells.size(), columns) << s << ": " << line;
            if (cells[0] == "total") {
                EXPECT_NEAR(std::stod(cells[9]), json["totals"]["Q"].get<double>(), 1e-8 * (1 + std::fabs(json["totals"]["Q"].get<double>())));
                seenTotal = true;
                continue;
            }
            if (seenTotal) continue;  // duty and utility summary rows follow the total
            if (!cells[2].empty() || cells[0] == "heating duty" || cells[0] == "cooling duty") continue;
            ASSERT_LT(step, json["steps"].size());
            const auto& st = json["steps"][step++];
            EXPECT_EQ(cells[0], st["id"].get<std::string>());
            int col = 9;
            for (const char* k : {"Q", "W", "dH", "dS", "Sgen", "exergyDestroyed"}) {
                const double v = st[k].get<double>();
                EXPECT_NEAR(std::stod(cells[std::size_t(col++)]), v, 1e-8 * (1 + std::fabs(v))) << s << " " << k;
            }
        }
        EXPECT_EQ(step, json["steps"].size()) << s;
    }
}

TEST(Exports, ChartsAsSvgAndPng) {
    for (const char* flag : {"--ts", "--tq"}) {
        const fs::path svg = scratch(std::string("chart") + flag + ".svg"), png = scratch(std::string("chart") + flag + ".png");
        auto r = runCommand(cli("chart " + sample("boiler-feed") + " " + flag + " -o " + svg.string()));
        ASSERT_EQ(r.exit, 0) << r.err;
        // Valid XML with an <svg> root and drawn paths (parsed by Python's xml.etree).
        auto py = runCommand(std::string(HEATCHAIN_PYTHON) +
                             " -c \"import sys, xml.etree.ElementTree as E; r = E.parse(sys.argv[1]).getroot(); "
                             "print(r.tag, sum(1 for e in r.iter() if e.tag.endswith('path') or e.tag.endswith('polyline')) > 10)\" " +
                             svg.string());
        EXPECT_EQ(py.out, "{http://www.w3.org/2000/svg}svg True\n") << py.err;
        r = runCommand(cli("chart " + sample("boiler-feed") + " " + flag + " -o " + png.string()));
        ASSERT_EQ(r.exit, 0) << r.err;
        const std::string bytes = readWholeFile(png);
        // PNG signature (ISO/IEC 15948, 5.2) and the IHDR width of 1100 px.
        ASSERT_GT(bytes.size(), 24u);
        EXPECT_EQ(bytes.substr(0, 8), std::string("\x89PNG\r\n\x1a\n", 8));
        const auto b = [&](int i) { return unsigned(static_cast<unsigned char>(bytes[std::size_t(i)])); };
        EXPECT_EQ((b(16) << 24) | (b(17) << 16) | (b(18) << 8) | b(19), 1100u);
    }
    EXPECT_EQ(runCommand(cli("chart " + sample("boiler-feed") + " --ts -o " + scratch("x.gif").string())).exit, 2);
    EXPECT_EQ(runCommand(cli("chart " + sample("boiler-feed") + " -o " + scratch("x.svg").string())).exit, 2);
}

// The utilities table, each served step's approach and the exergy
// account, against core's results as `compute --json` gives them.
TEST(Report, UtilitiesAndExergyOfSolventRecovery) {
    const fs::path pdf = scratch("solvent-utilities.pdf");
    auto run = runCommand(cli("report " + sample("solvent-recovery") + " -o " + pdf.string()));
    ASSERT_EQ(run.exit, 0) << run.err;
    const std::string layout = pdfText(pdf, true);
    const std::string flat = squeeze(layout);
    const auto json = computeJson(sample("solvent-recovery"));
    ASSERT_TRUE(json.is_object());
    for (const char* heading : {"Utilities and approach temperatures", "Steps served by a utility", "Exergy account",
                                "Exergy destroyed by step"})
        EXPECT_NE(flat.find(heading), std::string::npos) << heading;

    // Per utility: the use in display units (metric engineering: t/h, m3/h).
    ASSERT_EQ(json["utilities"].size(), 2u);
    const auto steam = numbersIn(lineStarting(layout, "lp-steam"));
    const auto cw = numbersIn(lineStarting(layout, "cw"));
    ASSERT_FALSE(steam.empty()) << lineStarting(layout, "lp-steam");
    ASSERT_FALSE(cw.empty()) << lineStarting(layout, "cw");
    auto has = [](const std::vector<double>& xs, double v) {
        return std::any_of(xs.begin(), xs.end(), [&](double x) { return std::fabs(x - v) <= std::fabs(v) * 5e-4 + 1e-4; });
    };
    const double steamTph = json["utilities"][0]["mass"].get<double>() * 3.6;  // kg/s → t/h
    const double cwM3h = json["utilities"][1]["volume"].get<double>() * 3600;  // m3/s → m3/h
    EXPECT_TRUE(has(steam, steamTph)) << lineStarting(layout, "lp-steam") << " lacks " << steamTph;
    EXPECT_TRUE(has(cw, cwM3h)) << lineStarting(layout, "cw") << " lacks " << cwM3h;

    // Each served step's smallest approach, with where it is.
    for (const auto& st : json["steps"]) {
        if (!st.contains("utility") || st["utility"].is_null()) continue;
        const std::string id = st["id"];
        const auto& a = st["utility"]["approach"];
        const std::string where = a["position"].get<std::string>() + " of " + a["segmentLabel"].get<std::string>();
        EXPECT_NE(flat.find(where), std::string::npos) << id << ": " << where;
        const double dT = a["minimum_K"];
        const std::string sentence = "closest approach";  // the glossary's word for the result
        EXPECT_NE(flat.find(sentence), std::string::npos);
        // The served-steps table row of this step: "<#> <id> <utility> (...) ..."
        std::istringstream in(layout);
        std::string line;
        bool found = false;
        const std::regex re("^\\s*\\d+\\s+" + id + "\\s+" + st["utility"]["id"].get<std::string>() + " \\(");
        while (std::getline(in, line))
            if (std::regex_search(line, re)) {
                // Printed to 0.1 K.
                for (double x : numbersIn(line)) found = found || std::fabs(x - dT) <= 0.05 + 1e-9;
                if (found) break;
            }
        EXPECT_TRUE(found) << id << " approach " << dT;
    }

    // The exergy account's sequence row: destroyed and η_II (as %).
    const auto seq = numbersIn(lineStarting(layout, "Sequence"));
    ASSERT_GE(seq.size(), 4u) << lineStarting(layout, "Sequence");
    EXPECT_TRUE(has(seq, json["exergy"]["destroyed"].get<double>() / 1e3)) << lineStarting(layout, "Sequence");
    // η_II is printed to 0.1 %.
    const double eta = json["exergy"]["secondLawEfficiency"].get<double>() * 100;
    EXPECT_TRUE(std::any_of(seq.begin(), seq.end(), [&](double x) { return std::fabs(x - eta) <= 0.05 + 1e-9; }))
        << lineStarting(layout, "Sequence") << " lacks " << eta;
}

// How sure, in the report: with tolerances typed, an uncertainty section
// states the method and gives the same value ± u as `compute --json
// --uncertainty linear`; without any, there is no such section.
TEST(Report, UncertaintySectionMatchesTheCommandLine) {
    std::string text = heatchain::testing::readWholeFile(sample("compressor-aftercooler"));
    auto swap = [&](const std::string& from, const std::string& to) {
        const auto at = text.find(from);
        ASSERT_NE(at, std::string::npos) << from;
        text.replace(at, from.size(), to);
    };
    swap(R"("T": "25 degC", "P": "0.98 bar")", R"("T": "25 degC ± 1 K", "P": "0.98 bar")");
    swap(R"("efficiency": 0.8 })", R"("efficiency": "0.8 ± 0.03" })");
    const fs::path project = scratch("toleranced.hchain");
    std::ofstream(project) << text;
    const fs::path pdf = scratch("toleranced.pdf");
    auto run = runCommand(cli("report " + project.string() + " -o " + pdf.string()));
    ASSERT_EQ(run.exit, 0) << run.err;
    const std::string layout = pdfText(pdf, true);
    const std::string flat = squeeze(layout);
    for (const char* words : {"Uncertainty", "First-order method (JCGM 100:2008", "Inputs with a tolerance",
                              "0.8 ± 0.03", "25 degC ± 1 K", "Contributions to the uncertainty",
                              "The shaded band around each path is ± one standard uncertainty"})
        EXPECT_NE(flat.find(words), std::string::npos) << words;

    auto cj = runCommand(cli("compute " + project.string() + " --json --uncertainty linear"));
    ASSERT_EQ(cj.exit, 0) << cj.err;
    const auto u = nlohmann::json::parse(cj.out)["uncertainty"]["outputs"]["steps.stage-1.W"];
    // The results table's row of stage-1: Q ± u, W ± u, T end ± u; W in kW.
    std::string row;
    {
        std::istringstream in(layout);
        std::string line;
        while (std::getline(in, line))
            if (line.find("stage-1") != std::string::npos && line.find("±") != std::string::npos) row = line;
    }
    ASSERT_FALSE(row.empty());
    for (std::size_t at; (at = row.find("±")) != std::string::npos;) row.replace(at, 2, " ");
    const auto xs = numbersIn(row);
    auto has = [&](double v) {
        return std::any_of(xs.begin(), xs.end(), [&](double x) { return std::fabs(x - v) <= std::fabs(v) * 5e-4 + 2e-3; });
    };
    EXPECT_TRUE(has(u["value"].get<double>() / 1000)) << row;
    EXPECT_TRUE(has(u["u"].get<double>() / 1000)) << row;

    const fs::path plain = scratch("plain.pdf");
    ASSERT_EQ(runCommand(cli("report " + sample("compressor-aftercooler") + " -o " + plain.string())).exit, 0);
    const std::string plainText = squeeze(pdfText(plain, true));
    EXPECT_EQ(plainText.find("Inputs with a tolerance"), std::string::npos);
    EXPECT_EQ(plainText.find("shaded band"), std::string::npos);
}
