// The PDF step report: a title block, the cautions, basis, substance and
// model with their sources, the start state, the ledger of all steps with
// totals, both process charts, and a section per step. Vector text and
// vector charts (QPdfWriter), A4 or US Letter. Only formats and draws what
// core computed.
#include <QBuffer>
#include <QCryptographicHash>
#include <QDateTime>
#include <QFile>
#include <QFileInfo>
#include <QPageSize>
#include <QPdfWriter>
#include <algorithm>
#include <cmath>
#include <limits>
#include <optional>

#include "gui_app.hpp"
#include "heatchain/rules.hpp"
#include "heatchain/project_file.hpp"
#include "heatchain/report.hpp"
#include "heatchain/streams.hpp"
#include "heatchain/uncertainty.hpp"
#include "heatchain_view/caution_text.hpp"
#include "heatchain_view/format.hpp"
#include "heatchain_view/palette.hpp"
#include "heatchain_view/process_chart.hpp"
#include "heatchain_view/contribution_chart.hpp"
#include "heatchain_view/exergy_chart.hpp"
#include "heatchain_view/utility_text.hpp"
#include "report_transfer.hpp"
#include "report_layout.hpp"
#include "report_recovery.hpp"

namespace heatchain {

Result<PageSize> parsePageSize(std::string_view id) {
    const QString s = QString::fromUtf8(id.data(), qsizetype(id.size())).toLower();
    if (s == QLatin1String("a4")) return PageSize::A4;
    if (s == QLatin1String("letter") || s == QLatin1String("us-letter")) return PageSize::Letter;
    return makeError("unknown page size \"" + std::string(id) + "\"; use A4 or letter");
}

namespace {

using namespace report_detail;
using view::formatDisplay;
using view::unitSymbol;

using heatchain::view::qs;

QStringList cautionLines(const Project& project, const SequenceResult& r) {
    QStringList lines{qs(generalCaution())};
    if (const std::string hz = hazardSentence(project.substance); !hz.empty()) lines << qs(hz);
    lines << view::processCautionText(project, processCautions(project, r));
    return lines;
}

QString systemText(SystemKind s) {
    return s == SystemKind::Closed ? QStringLiteral("closed (a batch: J, J/K)")
                                   : QStringLiteral("steady flow (rates: W, W/K)");
}

QString basisText(const Project& p) {
    QString kind;
    switch (p.basis.kind) {
    case Basis::Kind::Mass: kind = QStringLiteral("mass"); break;
    case Basis::Kind::Amount: kind = QStringLiteral("amount of substance"); break;
    case Basis::Kind::MassFlow: kind = QStringLiteral("mass flow"); break;
    case Basis::Kind::MolarFlow: kind = QStringLiteral("molar flow"); break;
    }
    const bool flow = p.basis.kind == Basis::Kind::MassFlow || p.basis.kind == Basis::Kind::MolarFlow;
    return QStringLiteral("%1 %2 (%3 %4)")
        .arg(kind, qs(p.basis.amount.text), view::formatNumber(p.massBasis(), 6),
             flow ? QStringLiteral("kg/s") : QStringLiteral("kg"));
}

// The inputs of a step as the user typed them.
std::vector<std::pair<QString, QString>> stepInputs(const Step& s) {
    std::vector<std::pair<QString, QString>> rows;
    auto num = [](const Number& n) { return qs(n.typed()); };
    if (!s.to.empty()) {
        if (s.to.T) rows.emplace_back(QStringLiteral("Target temperature"), qs(s.to.T->text));
        if (s.to.P) rows.emplace_back(QStringLiteral("Target pressure"), qs(s.to.P->text));
        if (s.to.duty) rows.emplace_back(QStringLiteral("Duty"), qs(s.to.duty->text));
        if (s.to.quality) rows.emplace_back(QStringLiteral("Target quality"), num(*s.to.quality));
        if (s.to.ratio) rows.emplace_back(QStringLiteral("Pressure ratio"), num(*s.to.ratio));
    }
    if (s.at)
        rows.emplace_back(QStringLiteral("Heating at"), *s.at == HeatingAt::ConstantVolume
                                                            ? QStringLiteral("constant volume")
                                                            : QStringLiteral("constant pressure"));
    if (s.fraction) rows.emplace_back(QStringLiteral("Fraction"), num(*s.fraction));
    if (s.path) rows.emplace_back(QStringLiteral("Path"), qs(pathId(*s.path)));
    if (s.n) rows.emplace_back(QStringLiteral("Polytropic exponent n"), num(*s.n));
    if (s.efficiency) rows.emplace_back(QStringLiteral("Isentropic efficiency"), num(*s.efficiency));
    auto reservoir = [&](const char* label, const std::optional<Reservoir>& r) {
        if (!r) return;
        QStringList parts;
        if (r->T) parts << qs(r->T->text);
        if (r->utility) parts << QStringLiteral("utility %1").arg(qs(*r->utility));
        rows.emplace_back(QString::fromLatin1(label), parts.join(QStringLiteral(", ")));
    };
    reservoir("Heat source", s.source);
    reservoir("Heat sink", s.sink);
    return rows;
}

struct Content {
    const Project& project;
    const SequenceResult& result;
    QString fileName, checksum, checksumNote, generated;
    UncertaintyOptions uncertainty;
    // False for one stream of a worksheet of several: the worksheet's title
    // block and cautions come once, before the streams.
    bool titleBlock = true;
};

// The title block (shared by every stream) and the cautions box.
void writeTitleBlock(Layout& L, const Content& c, const QStringList& cautions) {
    const Project& p = c.project;
    const QFont body = L.font(9);
    const QFont label = L.font(7.5, true);
    L.paragraph(QStringLiteral("HEATCHAIN  ·  PROCESS REPORT"), label, rink::accent(), 0, L.mm(1));
    L.paragraph(p.meta.title.empty() ? QStringLiteral("(untitled worksheet)") : qs(p.meta.title), L.font(17, true),
                view::ink::text(), 0, L.mm(3));
    const QFont mono = L.mono(7.5);
    std::vector<std::pair<QString, QString>> rows = {
        {QStringLiteral("Author"), qs(p.meta.author)},
        {QStringLiteral("Revision"), qs(p.meta.revision)},
        {QStringLiteral("Created"), qs(p.meta.created)},
        {QStringLiteral("Modified"), qs(p.meta.modified)},
        {QStringLiteral("Worksheet file"), c.fileName},
        {QStringLiteral("SHA-256"), c.checksum},
    };
    if (!c.checksumNote.isEmpty()) rows.emplace_back(QString(), c.checksumNote);
    rows.emplace_back(QStringLiteral("Report generated"),
                      QStringLiteral("%1 by Heatchain %2").arg(c.generated, QStringLiteral(HEATCHAIN_VERSION)));
    for (auto& [k, v] : rows)
        if (v.isEmpty() && !k.isEmpty()) v = QStringLiteral("–");
    L.keyValues(rows, L.mm(32), body, &mono, 5);
    if (!p.meta.notes.empty()) {
        L.subheading(QStringLiteral("Notes"), L.mm(6));
        L.paragraph(qs(p.meta.notes), body, view::ink::text());
    }
    L.space(L.mm(2));
    L.box(QStringLiteral("Cautions"), cautions, rink::cautionFace(), rink::cautionEdge());
}

void writeContent(Layout& L, const Content& c) {
    const Project& p = c.project;
    const SequenceResult& r = c.result;
    const UnitSystem us = p.displayUnits;
    const UnitContext ctx = view::displayContext(p);
    const Dimension E = view::energyDimension(r.system), S = view::entropyDimension(r.system);
    auto fmt = [&](double v, Dimension d) {
        if (d == Dimension::SpecificVolume) return view::formatNumber(toDisplay(v, d, us, ctx), 5, 9);
        // Small entropy figures (a pump's S_gen) keep four significant digits
        // instead of one: the fixed four decimals of the screen would print 0.0008.
        if (d == S) return view::formatNumber(toDisplay(v, d, us, ctx), 4, 7);
        return formatDisplay(v, d, us, ctx);
    };
    // A step's and the totals' figures: round-off (a throttle's ΔH of 1e-13
    // kW) shows as zero by core's rule, judged within the step (a segment
    // within its step) or the totals, as on screen and in the ledger text.
    auto stepE = [&](const StepResult& s, double v) { return fmt(forDisplay(v, energyScale(s)), E); };
    auto stepS = [&](const StepResult& s, double v) { return fmt(forDisplay(v, entropyScale(s)), S); };
    auto totalE = [&](double v) { return fmt(forDisplay(v, energyScale(r.totals)), E); };
    auto totalS = [&](double v) { return fmt(forDisplay(v, entropyScale(r.totals)), S); };
    auto withUnit = [&](double v, Dimension d) { return view::formatWithUnit(v, d, us, ctx); };
    const QFont body = L.font(9), small = L.font(8);

    // ---- Title block ----------------------------------------------------
    if (c.titleBlock) writeTitleBlock(L, c, cautionLines(p, r));

    // ---- 1 Basis ------------------------------------------------------------
    L.heading(QStringLiteral("1"), QStringLiteral("Basis and surroundings"), L.mm(20));
    L.keyValues({{QStringLiteral("System"), systemText(r.system)},
                 {QStringLiteral("Basis"), basisText(p)},
                 {QStringLiteral("Surroundings (dead state)"),
                  QStringLiteral("T0 = %1, P0 = %2  (exergy destroyed = T0 · S_gen)")
                      .arg(withUnit(p.surroundingsOrDefault().T.si, Dimension::Temperature),
                           withUnit(p.surroundingsOrDefault().P.si, Dimension::Pressure))},
                 {QStringLiteral("Atmosphere (gauge zero)"), withUnit(p.atmosphereOrDefault().si, Dimension::Pressure)},
                 {QStringLiteral("Display units"), qs(unitSystemId(us))},
                 {QStringLiteral("Sign convention"),
                  QStringLiteral("Q > 0 heat into the material, W > 0 work done on it; %1")
                      .arg(r.system == SystemKind::Closed ? QStringLiteral("ΔU = Q + W")
                                                          : QStringLiteral("ΔH = Q + W"))}},
                L.mm(45), body);

    // ---- 2 Substance and model ------------------------------------------------
    const Substance& sub = p.substance;
    L.heading(QStringLiteral("2"), QStringLiteral("Substance and property model"), L.mm(30));
    {
        std::vector<std::pair<QString, QString>> rows;
        QString name = qs(sub.name);
        if (!sub.formula.empty()) name += QStringLiteral(" (%1)").arg(qs(sub.formula));
        rows.emplace_back(QStringLiteral("Substance"), name + (sub.custom ? QStringLiteral(", defined in the worksheet file") : QString()));
        if (!sub.casNumber.empty()) rows.emplace_back(QStringLiteral("CAS number"), qs(sub.casNumber));
        rows.emplace_back(QStringLiteral("Molar mass"),
                          QStringLiteral("%1 g/mol").arg(view::formatNumber(sub.molarMass * 1000, 6)));
        if (r.model) {
            rows.emplace_back(QStringLiteral("Property model"),
                              QStringLiteral("%1 — %2").arg(view::modelTitle(p.model), qs(r.model->name())));
            rows.emplace_back(QStringLiteral("Valid range"), qs(r.model->rangeText()));
            rows.emplace_back(QStringLiteral("Model equations from"), qs(r.model->sourceText()));
        } else {
            rows.emplace_back(QStringLiteral("Property model"), QStringLiteral("%1 — could not be built").arg(view::modelTitle(p.model)));
        }
        L.keyValues(rows, L.mm(45), body);
        if (!sub.sources.empty()) {
            // A project's own substance cites whatever its author typed; only
            // the built-in library's are published sources.
            L.subheading(sub.custom ? QStringLiteral("Sources of the substance data, as given in the project file")
                                    : QStringLiteral("Published sources of the substance data"),
                         L.mm(10));
            std::vector<TableRow> srcRows;
            bool anyUnconfirmed = false;
            for (const SourceNote& n : sub.sources) {
                QString text = qs(n.text);
                if (!n.confirmed) {
                    text += text.endsWith(QLatin1Char('.')) ? QStringLiteral(" Not independently confirmed.")
                                                             : QStringLiteral(". Not independently confirmed.");
                    anyUnconfirmed = true;
                }
                srcRows.push_back({{qs(sourceFieldLabel(n.field)), text}});
            }
            L.table({{QStringLiteral("Data"), {}, 1.0}, {QStringLiteral("Source"), {}, 4.0}}, srcRows, 8,
                    QStringLiteral("Sources, continued"));
            if (anyUnconfirmed)
                L.paragraph(QStringLiteral("Values marked “not independently confirmed” were taken from the "
                                           "publication named and have not been checked a second time, against it or "
                                           "against a reference equation. Confirm them before relying on a result "
                                           "that depends on them."),
                            small, view::ink::text());
        }
        if (!r.warnings.empty()) {
            L.subheading(QStringLiteral("Notes on the model"), L.mm(6));
            for (const auto& w : r.warnings) L.paragraph(QStringLiteral("• %1").arg(qs(w)), small, view::ink::text());
        }
    }

    // ---- 3 Start state -------------------------------------------------------
    L.heading(QStringLiteral("3"), QStringLiteral("Start state"), L.mm(20));
    {
        QStringList typed;
        if (p.start.T) typed << QStringLiteral("T = %1").arg(qs(p.start.T->text));
        if (p.start.P) typed << QStringLiteral("P = %1").arg(qs(p.start.P->text));
        auto num = [](const Number& n) { return qs(n.typed()); };
        if (p.start.quality) typed << QStringLiteral("quality = %1").arg(num(*p.start.quality));
        if (p.start.meltFraction) typed << QStringLiteral("melt fraction = %1").arg(num(*p.start.meltFraction));
        std::vector<std::pair<QString, QString>> rows = {{QStringLiteral("As given"), typed.join(QStringLiteral(", "))}};
        if (r.startError) {
            rows.emplace_back(QStringLiteral("Error"), qs(r.startError->text()));
        } else {
            const State& s = r.start;
            rows.emplace_back(QStringLiteral("Temperature"), withUnit(s.T, Dimension::Temperature));
            rows.emplace_back(QStringLiteral("Pressure"), withUnit(s.P, Dimension::Pressure));
            rows.emplace_back(QStringLiteral("Phase"), view::phaseText(s));
            rows.emplace_back(QStringLiteral("Specific enthalpy h"), withUnit(s.h, Dimension::SpecificEnergy));
            rows.emplace_back(QStringLiteral("Specific entropy s"), withUnit(s.s, Dimension::SpecificEntropy));
            rows.emplace_back(QStringLiteral("Specific volume v"),
                              fmt(s.v, Dimension::SpecificVolume) + QLatin1Char(' ') + unitSymbol(Dimension::SpecificVolume, us));
            if (!s.source.empty()) rows.emplace_back(QStringLiteral("Computed by"), qs(s.source));
            if (s.warnings) rows.emplace_back(QStringLiteral("Warning"), qs(describeWarnings(s.warnings)));
        }
        L.keyValues(rows, L.mm(45), body);
    }

    // ---- 4 Ledger ------------------------------------------------------------
    L.heading(QStringLiteral("4"), QStringLiteral("All steps"), L.mm(25));
    {
        const QString eu = unitSymbol(E, us), su = unitSymbol(S, us);
        std::vector<TableColumn> cols = {
            {QStringLiteral("#"), {}, 0.7, Qt::AlignRight},
            {QStringLiteral("Step"), {}, 2.6},
            {QStringLiteral("Kind"), {}, 1.95},
            {QStringLiteral("T end"), unitSymbol(Dimension::Temperature, us), 1.15, Qt::AlignRight},
            {QStringLiteral("P end"), unitSymbol(Dimension::Pressure, us, ctx), 1.15, Qt::AlignRight},
            {QStringLiteral("Phase at end"), {}, 1.8},
            {QStringLiteral("Q"), eu, 1.4, Qt::AlignRight},
            {QStringLiteral("W"), eu, 1.1, Qt::AlignRight},
            {QStringLiteral("ΔH"), eu, 1.4, Qt::AlignRight},
            {QStringLiteral("ΔS"), su, 1.1, Qt::AlignRight},
            {QStringLiteral("S_gen"), su, 1.1, Qt::AlignRight},
            {QStringLiteral("Exergy destroyed"), eu, 1.5, Qt::AlignRight},
        };
        // Area and time as the ledger shows them: only when some step has them.
        const bool anyArea = std::any_of(r.steps.begin(), r.steps.end(), [](const StepResult& s) {
            return s.computed && s.transfer && s.transfer->area;
        });
        const bool anyTime =
            std::any_of(r.steps.begin(), r.steps.end(), [](const StepResult& s) { return s.computed && s.batch; });
        if (anyArea) cols.push_back({QStringLiteral("Area"), unitSymbol(Dimension::Area, us), 1.0, Qt::AlignRight});
        if (anyTime) cols.push_back({QStringLiteral("Time"), unitSymbol(Dimension::Time, us), 1.0, Qt::AlignRight});
        const QString dash = QStringLiteral("–");
        auto transferCells = [&](QStringList& cells, std::optional<double> area, std::optional<double> time) {
            if (anyArea) cells << (area ? fmt(*area, Dimension::Area) : dash);
            if (anyTime) cells << (time ? fmt(*time, Dimension::Time) : dash);
        };
        std::vector<TableRow> rows;
        for (std::size_t i = 0; i < r.steps.size(); ++i) {
            const StepResult& s = r.steps[i];
            TableRow row;
            row.marker = view::stepColour(int(i));
            if (s.computed) {
                row.cells = {QString::number(i + 1), qs(s.id), view::stepKindTitle(s.kind),
                             fmt(s.end.T, Dimension::Temperature), fmt(s.end.P, Dimension::Pressure),
                             view::phaseShort(s.end), stepE(s, s.Q), stepE(s, s.W), stepE(s, s.dH), stepS(s, s.dS),
                             stepS(s, s.Sgen), view::noSourceGiven(s) ? view::noSourceText() : stepE(s, s.exergyDestroyed)};
                if (!s.warnings.empty()) row.cells[1] += QStringLiteral(" ⚠");
                transferCells(row.cells, s.transfer ? s.transfer->area : std::nullopt,
                              s.batch ? std::optional<double>(s.batch->duration) : std::nullopt);
            } else {
                row.cells = {QString::number(i + 1), qs(s.id), view::stepKindTitle(s.kind), dash, dash,
                             s.error ? QStringLiteral("not computed (error)") : QStringLiteral("not computed"),
                             dash, dash, dash, dash, dash, dash};
                transferCells(row.cells, std::nullopt, std::nullopt);
            }
            rows.push_back(std::move(row));
        }
        const Totals& t = r.totals;
        QStringList totalCells = {QString(), QStringLiteral("Total"), QString(), QString(), QString(), QString(),
                                  totalE(t.Q), totalE(t.W), totalE(t.dH), totalS(t.dS), totalS(t.Sgen),
                                  totalE(t.exergyDestroyed)};
        // Steady flow adds up its exchangers; a batch's total time is its cycle.
        transferCells(totalCells, t.area, t.cycleTime);
        rows.push_back({totalCells, TableRow::Style::Total});
        rows.push_back({{QString(), QStringLiteral("Heating duty"), QString(), QString(),
                         QString(), QString(), totalE(t.heatingDuty)},
                        TableRow::Style::Normal});
        rows.push_back({{QString(), QStringLiteral("Cooling duty"), QString(), QString(),
                         QString(), QString(), totalE(t.coolingDuty)},
                        TableRow::Style::Normal});
        L.table(cols, rows, 7.5, QStringLiteral("All steps, continued"));
        QString legend = QStringLiteral("Heating duty: the sum of Q over the steps with Q > 0; cooling duty: the sum of "
                                        "|Q| over the steps with Q < 0. ⚠ the step carries a warning (see its section).");
        if (anyArea)
            legend += r.system == SystemKind::Closed
                          ? QStringLiteral(" Area: the jacket or coil each batch step goes through.")
                          : QStringLiteral(" Area: the exchanger each step needs (or has, when rated).");
        if (anyTime) legend += QStringLiteral(" Time: how long each batch step takes; its total is the cycle time.");
        L.paragraph(legend,
                    L.font(7.5, false, true), view::ink::muted());
    }

    // Propagated once: the charts draw its bands, its own section prints it.
    std::optional<Result<UncertaintyResult>> propagated;
    if (auto inputs = uncertainInputs(p); inputs && !inputs->empty() && r.ok())
        propagated.emplace(propagateUncertainty(p, c.uncertainty));
    const UncertaintyResult* bands = propagated && propagated->ok() ? &**propagated : nullptr;

    // ---- 5 Charts ----------------------------------------------------------------
    {
        L.newPage();
        L.heading(QStringLiteral("5"), QStringLiteral("Process charts"), L.mm(60));
        std::optional<DomeCurve> dome;
        if (r.model) dome = saturationDome(*r.model);
        view::ProcessChart ts(view::ProcessChart::Kind::TemperatureEntropy);
        ts.setUncertainty(bands);
        ts.setData(p, r, dome && !dome->liquidSide.empty() ? &*dome : nullptr);
        view::ProcessChart tq(view::ProcessChart::Kind::TemperatureDuty);
        tq.setUncertainty(bands);
        tq.setData(p, r, nullptr);
        if (bands)
            L.paragraph(QStringLiteral("The shaded band around each path is ± one standard uncertainty of its "
                                       "temperature, entropy and cumulative duty (see the Uncertainty section)."),
                        small, view::ink::muted());
        const double logicalW = 760;
        const double chartH = std::min(L.mm(112), (L.remaining() - L.mm(22)) / 2);
        L.subheading(QStringLiteral("Temperature–entropy: the path of every step over the saturation dome"), chartH);
        L.figure(chartH, [&](QPainter& painter, const QRectF& rect) {
            paintChartFigure(painter, rect, ts, r, logicalW, true);
        });
        QString tqTitle = QStringLiteral("Temperature–duty: cumulative Q, with each step's heat source or sink");
        L.subheading(tqTitle, chartH);
        L.figure(chartH, [&](QPainter& painter, const QRectF& rect) {
            paintChartFigure(painter, rect, tq, r, logicalW, true);
        });
        if (auto a = tq.smallestApproach(); a && a->step >= 0 && std::size_t(a->step) < r.steps.size())
            L.paragraph(QStringLiteral("Closest approach between the material and a source or sink: %1 %2 at step %3 (%4).")
                            .arg(view::formatNumber(a->dT, 4, 1), unitSymbol(Dimension::TemperatureDifference, us))
                            .arg(a->step + 1)
                            .arg(qs(r.steps[std::size_t(a->step)].id)),
                        small, view::ink::text());
    }

    // ---- 6 Utilities -------------------------------------------------------------------
    bool anyUtility = !p.utilityList().empty();
    for (const StepResult& s : r.steps) anyUtility = anyUtility || s.utility.has_value();
    int section = 6;
    if (anyUtility) {
        L.heading(QString::number(section), QStringLiteral("Utilities and approach temperatures"), L.mm(30));
        L.paragraph(QStringLiteral("Required minimum approach: %1. Steam condenses (or is raised) at its saturation "
                                   "temperature; a sensible stream runs counter-current between its in and out "
                                   "temperatures.")
                        .arg(withUnit(p.minApproachK(), Dimension::TemperatureDifference)),
                    small, view::ink::text());
        const QString eu = unitSymbol(E, us);
        std::vector<TableColumn> ucol = {
            {QStringLiteral("Utility"), {}, 1.5},
            {QStringLiteral("Kind"), {}, 1.0},
            {QStringLiteral("Temperature(s)"), {}, 2.4},
            {QStringLiteral("Steps"), {}, 0.6, Qt::AlignRight},
            {QStringLiteral("Heat supplied"), eu, 1.2, Qt::AlignRight},
            {QStringLiteral("Heat absorbed"), eu, 1.2, Qt::AlignRight},
            {QStringLiteral("Mass"), {}, 1.3, Qt::AlignRight},
            {QStringLiteral("Volume"), {}, 1.3, Qt::AlignRight},
        };
        std::vector<TableRow> urows;
        for (const UtilityTotal& t : r.utilities) {
            TableRow row;
            const QString temps = t.profile ? view::utilityTemperaturesText(*t.profile, us, ctx)
                                  : t.error  ? QStringLiteral("not resolved: %1").arg(qs(t.error->message))
                                             : QString();
            row.cells = {qs(t.id), view::utilityKindText(t.kind), temps, QString::number(t.steps),
                         fmt(t.heatSupplied, E), fmt(t.heatAbsorbed, E),
                         view::utilityMassText(t.kind, t.mass, r.system, us, ctx),
                         t.volume ? view::utilityUseText(t.kind, t.mass, t.volume, r.system, us, ctx) : QStringLiteral("–")};
            urows.push_back(std::move(row));
        }
        L.table(ucol, urows, 7.5, QStringLiteral("Utilities, continued"));
        const QString dTu = unitSymbol(Dimension::TemperatureDifference, us);
        std::vector<TableColumn> acol = {
            {QStringLiteral("#"), {}, 0.5, Qt::AlignRight},
            {QStringLiteral("Step"), {}, 1.8},
            {QStringLiteral("Utility"), {}, 1.6},
            {QStringLiteral("Duty"), eu, 1.1, Qt::AlignRight},
            {QStringLiteral("Uses"), {}, 1.3, Qt::AlignRight},
            {QStringLiteral("Closest approach"), dTu, 1.1, Qt::AlignRight},
            {QStringLiteral("Where"), {}, 2.6},
        };
        std::vector<TableRow> arows;
        QStringList tight;
        for (std::size_t i = 0; i < r.steps.size(); ++i) {
            const StepResult& s = r.steps[i];
            if (!s.computed || !s.utility) continue;
            const StepUtility& su = *s.utility;
            TableRow row;
            row.marker = view::stepColour(int(i));
            const bool below = approachBelowRequired(su, p.minApproachK());
            row.cells = {QString::number(i + 1), qs(s.id),
                         QStringLiteral("%1 (%2)").arg(qs(su.id), su.asSource ? QStringLiteral("source") : QStringLiteral("sink")),
                         fmt(su.duty, E), view::utilityUseText(su.kind, su.mass, su.volume, r.system, us, ctx),
                         fmt(su.minApproach, Dimension::TemperatureDifference) + (below ? QStringLiteral(" ⚠") : QString()),
                         view::approachWhereText(s)};
            if (below) tight << qs(s.id);
            arows.push_back(std::move(row));
        }
        if (!arows.empty()) {
            L.subheading(QStringLiteral("Steps served by a utility"), L.mm(20));
            L.table(acol, arows, 7.5, QStringLiteral("Steps served by a utility, continued"));
        }
        if (!tight.isEmpty())
            L.paragraph(QStringLiteral("⚠ closest approach below the required minimum approach: %1.").arg(tight.join(QStringLiteral(", "))),
                        L.font(8, true), view::ink::error());
        ++section;
    }

    section = heatTransferSection(L, p, r, section);

    // ---- Exergy ---------------------------------------------------------------------
    if (r.exergyAvailable) {
        L.heading(QString::number(section), QStringLiteral("Exergy account"), L.mm(60));
        L.paragraph(QStringLiteral("Relative to the dead state T0 = %1, P0 = %2. Exergy supplied: the exergy the heat "
                                   "and work bring in; η_II = 1 − destroyed / supplied (none where nothing is supplied).")
                        .arg(withUnit(r.T0, Dimension::Temperature), withUnit(r.P0, Dimension::Pressure)),
                    small, view::ink::text());
        const QString eu = unitSymbol(E, us);
        std::vector<TableColumn> xcol = {
            {QStringLiteral("#"), {}, 0.5, Qt::AlignRight},
            {QStringLiteral("Step"), {}, 2.0},
            {QStringLiteral("Exergy change"), eu, 1.3, Qt::AlignRight},
            {QStringLiteral("Supplied"), eu, 1.3, Qt::AlignRight},
            {QStringLiteral("Destroyed"), eu, 1.3, Qt::AlignRight},
            {QStringLiteral("Share"), QStringLiteral("%"), 0.9, Qt::AlignRight},
            {QStringLiteral("η_II"), QStringLiteral("%"), 0.9, Qt::AlignRight},
        };
        std::vector<TableRow> xrows;
        auto pct = [](const std::optional<double>& v) {
            // Shares and η_II are 0–100 %: one decimal, never 2.5e−09 for a
            // throttle whose η_II is zero up to round-off.
            return v ? QString::number(100.0 * *v, 'f', 1) : QStringLiteral("–");
        };
        for (std::size_t i = 0; i < r.steps.size(); ++i) {
            const StepResult& s = r.steps[i];
            TableRow row;
            row.marker = view::stepColour(int(i));
            if (!s.computed) {
                const QString dash = QStringLiteral("–");
                row.cells = {QString::number(i + 1), qs(s.id), dash, dash, dash, dash, dash};
            } else if (view::noSourceGiven(s)) {
                const QString dash = QStringLiteral("–");
                row.cells = {QString::number(i + 1), qs(s.id), stepE(s, s.dEx), dash, view::noSourceText(), dash, dash};
            } else {
                row.cells = {QString::number(i + 1), qs(s.id), stepE(s, s.dEx), stepE(s, s.exergySupplied),
                             stepE(s, s.exergyDestroyed), pct(s.exergyDestroyedShare), pct(s.secondLawEfficiency)};
            }
            xrows.push_back(std::move(row));
        }
        const Totals& t = r.totals;
        xrows.push_back({{QString(), QStringLiteral("Sequence"), totalE(t.dEx), totalE(t.exergySupplied),
                          totalE(t.exergyDestroyed), QStringLiteral("100"), pct(t.secondLawEfficiency)},
                         TableRow::Style::Total});
        L.table(xcol, xrows, 7.5, QStringLiteral("Exergy account, continued"));
        view::ExergyBarChart bars;
        bars.setData(p, r);
        const double logicalW = 760;
        const double wanted = bars.preferredHeight(int(bars.bars().size())) * (L.width() / logicalW);
        const double h = std::min(wanted, L.mm(150));
        L.subheading(QStringLiteral("Exergy destroyed by step: where the losses are"), h);
        L.figure(h, [&](QPainter& painter, const QRectF& rect) {
            paintScaledFigure(painter, rect, logicalW, [&](QPainter& q, const QRectF& r2) { bars.paint(q, r2); });
        });
        ++section;
    }

    // ---- Uncertainty ----------------------------------------------------------------
    if (propagated) {
        L.heading(QString::number(section), QStringLiteral("Uncertainty"), L.mm(50));
        if (!*propagated) {
            L.paragraph(QStringLiteral("The uncertainty could not be computed: %1").arg(qs(propagated->error().message)),
                        small, view::ink::error());
        } else {
            const UncertaintyResult& u = **propagated;
            const bool mc = u.method == UncertaintyMethod::MonteCarlo;
            L.paragraph(mc ? QStringLiteral("Monte Carlo method (JCGM 101:2008): %1 of %2 draws computed, seed %3. "
                                            "± is one standard uncertainty; the 95 % interval runs from the 2.5th "
                                            "to the 97.5th percentile of the draws.")
                                 .arg(u.samplesUsed)
                                 .arg(u.samples)
                                 .arg(qulonglong(u.seed))
                           : QStringLiteral("First-order method (JCGM 100:2008, the law of propagation of uncertainty "
                                            "for independent inputs), sensitivities from re-solving the sequence at "
                                            "each input ± its standard uncertainty. ± is one standard uncertainty."),
                        small, view::ink::text());
            std::vector<TableColumn> icol = {{QStringLiteral("Input"), {}, 2.6},
                                             {QStringLiteral("As typed"), {}, 2.6},
                                             {QStringLiteral("Distribution"), {}, 1.2}};
            std::vector<TableRow> irows;
            for (const UncertainInput& in : u.inputs)
                irows.push_back({{qs(in.path), qs(in.text),
                                  in.model ? QStringLiteral("model (%1)").arg(qs(in.source))
                                  : in.distribution == Distribution::Rectangular ? QStringLiteral("rectangular")
                                                                                 : QStringLiteral("normal")}});
            L.subheading(QStringLiteral("Inputs with a tolerance"), L.mm(15));
            L.table(icol, irows, 7.5, QStringLiteral("Inputs with a tolerance, continued"));
            auto pm = [&](const std::string& path, Dimension d) -> QString {
                const UncertainOutput* o = u.find(path);
                if (!o) return QStringLiteral("–");
                const Dimension ud = d == Dimension::Temperature ? Dimension::TemperatureDifference : d;
                const double sd = spreadForDisplay(o->u, o->value);
                QString t = fmt(o->value, d) + QStringLiteral(" ± ") + fmt(sd, ud);
                if (mc && o->p025 && o->p975)
                    t += QStringLiteral(" (95 %: %1 to %2)").arg(fmt(*o->p025, d), fmt(*o->p975, d));
                return t;
            };
            const QString eu = unitSymbol(E, us), tu = unitSymbol(Dimension::Temperature, us);
            std::vector<TableColumn> ocol = {{QStringLiteral("#"), {}, 0.5, Qt::AlignRight},
                                             {QStringLiteral("Step"), {}, 1.6},
                                             {QStringLiteral("Q"), eu, 2.4, Qt::AlignRight},
                                             {QStringLiteral("W"), eu, 2.4, Qt::AlignRight},
                                             {QStringLiteral("T end"), tu, 2.0, Qt::AlignRight}};
            std::vector<TableRow> orows;
            for (std::size_t i = 0; i < r.steps.size(); ++i) {
                const std::string at = "steps." + r.steps[i].id + ".";
                TableRow row;
                row.marker = view::stepColour(int(i));
                row.cells = {QString::number(i + 1), qs(r.steps[i].id), pm(at + "Q", E), pm(at + "W", E),
                             pm(at + "end.T_K", Dimension::Temperature)};
                orows.push_back(std::move(row));
            }
            orows.push_back({{QString(), QStringLiteral("Heating duty"), pm("totals.heatingDuty", E), QString(), QString()},
                             TableRow::Style::Total});
            orows.push_back({{QString(), QStringLiteral("Cooling duty"), pm("totals.coolingDuty", E), QString(), QString()},
                             TableRow::Style::Total});
            orows.push_back({{QString(), QStringLiteral("Work"), QString(), pm("totals.W", E), QString()},
                             TableRow::Style::Total});
            // Heat transfer's totals, where the worksheet has them (units in the cell).
            auto withUnit = [&](const std::string& path, Dimension d) {
                return pm(path, d) + QStringLiteral(" ") + unitSymbol(d, us);
            };
            if (u.find("totals.area_m2"))
                orows.push_back({{QString(), QStringLiteral("Area"), withUnit("totals.area_m2", Dimension::Area),
                                  QString(), QString()},
                                 TableRow::Style::Total});
            if (u.find("totals.cycleTime_s"))
                orows.push_back({{QString(), QStringLiteral("Cycle time"), withUnit("totals.cycleTime_s", Dimension::Time),
                                  QString(), QString()},
                                 TableRow::Style::Total});
            L.subheading(QStringLiteral("Results with their standard uncertainty"), L.mm(15));
            L.table(ocol, orows, 7.5, QStringLiteral("Results with their standard uncertainty, continued"));
            for (const std::string& n : u.notes) L.paragraph(QStringLiteral("Note: %1").arg(qs(n)), small, view::ink::muted());
            view::ContributionChart contributions;
            contributions.setData(u);
            const double logicalW = 760;
            const double h = std::min(contributions.preferredHeight() * (L.width() / logicalW), L.mm(120));
            L.subheading(QStringLiteral("Contributions to the uncertainty of the %1: which input drives it")
                             .arg(view::uncertaintyOutputTitle(contributions.output())),
                         h);
            L.figure(h, [&](QPainter& painter, const QRectF& rect) {
                paintScaledFigure(painter, rect, logicalW,
                                  [&](QPainter& q, const QRectF& r2) { contributions.paint(q, r2); });
            });
        }
        ++section;
    }

    // ---- Steps ---------------------------------------------------------------------
    L.newPage();
    const QString stepsNo = QString::number(section);
    L.heading(stepsNo, QStringLiteral("Steps in detail"), L.mm(40));
    for (std::size_t i = 0; i < r.steps.size() && i < p.steps.size(); ++i) {
        const StepResult& s = r.steps[i];
        const Step& in = p.steps[i];
        L.subheading(QStringLiteral("%1%2.%3   %4  ·  %5").arg(L.sectionPrefix(), stepsNo).arg(i + 1).arg(qs(s.id), view::stepKindTitle(s.kind)), L.mm(30));
        auto inputs = stepInputs(in);
        L.keyValues(inputs, L.mm(45), small);
        if (!s.computed) {
            L.paragraph(s.error ? QStringLiteral("Not computed: %1").arg(qs(s.error->text()))
                                : QStringLiteral("Not computed: an earlier step failed."),
                        L.font(8.5, true), view::ink::error());
        } else {
            const QString eu = unitSymbol(E, us), su = unitSymbol(S, us);
            std::vector<TableColumn> scol = {
                {QStringLiteral("State"), {}, 1.1},
                {QStringLiteral("T"), unitSymbol(Dimension::Temperature, us), 1, Qt::AlignRight},
                {QStringLiteral("P"), unitSymbol(Dimension::Pressure, us, ctx), 1, Qt::AlignRight},
                {QStringLiteral("Phase"), {}, 1.8},
                {QStringLiteral("h"), unitSymbol(Dimension::SpecificEnergy, us), 1, Qt::AlignRight},
                {QStringLiteral("s"), unitSymbol(Dimension::SpecificEntropy, us), 1, Qt::AlignRight},
                {QStringLiteral("v"), unitSymbol(Dimension::SpecificVolume, us), 1, Qt::AlignRight},
            };
            auto stateRow = [&](const QString& name, const State& st) {
                return TableRow{{name, fmt(st.T, Dimension::Temperature), fmt(st.P, Dimension::Pressure),
                                 view::phaseText(st), fmt(st.h, Dimension::SpecificEnergy),
                                 fmt(st.s, Dimension::SpecificEntropy), fmt(st.v, Dimension::SpecificVolume)}};
            };
            L.table(scol, {stateRow(QStringLiteral("start"), s.start), stateRow(QStringLiteral("end"), s.end)}, 7.5);
            std::vector<TableColumn> rcol = {
                {QStringLiteral("Q"), eu, 1, Qt::AlignRight},   {QStringLiteral("W"), eu, 1, Qt::AlignRight},
                {QStringLiteral("ΔH"), eu, 1, Qt::AlignRight},  {QStringLiteral("ΔU"), eu, 1, Qt::AlignRight},
                {QStringLiteral("ΔS"), su, 1, Qt::AlignRight},  {QStringLiteral("S_gen"), su, 1, Qt::AlignRight},
                {QStringLiteral("Exergy destroyed"), eu, 1.1, Qt::AlignRight},
                {s.Q < 0 ? QStringLiteral("Sink T") : QStringLiteral("Source T"),
                 unitSymbol(Dimension::Temperature, us), 1, Qt::AlignRight},
            };
            L.table(rcol,
                    {TableRow{{stepE(s, s.Q), stepE(s, s.W), stepE(s, s.dH), stepE(s, s.dU), stepS(s, s.dS), stepS(s, s.Sgen),
                               stepE(s, s.exergyDestroyed),
                               s.reservoirT ? fmt(*s.reservoirT, Dimension::Temperature) : QStringLiteral("–")}}},
                    7.5);
            if (s.utility) {
                const StepUtility& su = *s.utility;
                L.paragraph(QStringLiteral("%1 %2: uses %3; closest approach %4 at the %5.")
                                .arg(su.asSource ? QStringLiteral("Source") : QStringLiteral("Sink"), qs(su.id),
                                     view::utilityUseText(su.kind, su.mass, su.volume, r.system, us, ctx),
                                     withUnit(su.minApproach, Dimension::TemperatureDifference),
                                     view::approachWhereText(s)),
                            small, approachBelowRequired(su, p.minApproachK()) ? view::ink::error() : view::ink::text());
            }
            if (s.segments.size() > 1) {
                std::vector<TableColumn> gcol = {
                    {QStringLiteral("Segment"), {}, 2.2},
                    {QStringLiteral("T start"), unitSymbol(Dimension::Temperature, us), 1, Qt::AlignRight},
                    {QStringLiteral("T end"), unitSymbol(Dimension::Temperature, us), 1, Qt::AlignRight},
                    {QStringLiteral("P end"), unitSymbol(Dimension::Pressure, us, ctx), 1, Qt::AlignRight},
                    {QStringLiteral("Phase at end"), {}, 1.8},
                    {QStringLiteral("Q"), eu, 1.1, Qt::AlignRight},
                };
                std::vector<TableRow> grows;
                for (const SegmentResult& g : s.segments)
                    grows.push_back({{qs(g.label), fmt(g.start.T, Dimension::Temperature),
                                      fmt(g.end.T, Dimension::Temperature), fmt(g.end.P, Dimension::Pressure),
                                      view::phaseText(g.end), stepE(s, g.Q)}});
                L.table(gcol, grows, 7.5, QStringLiteral("Segments of %1, continued").arg(qs(s.id)));
            }
        }
        // Warnings (probably not what was meant) apart from notes (ordinary facts).
        for (const auto& w : s.warnings)
            L.paragraph(QStringLiteral("Warning: %1").arg(qs(w)), L.font(8, true), view::ink::warning().darker(130));
        for (const auto& n : view::notesOf(s))
            L.paragraph(QStringLiteral("Note: %1").arg(qs(n)), L.font(8), view::ink::muted());
        if (in.note) L.paragraph(QStringLiteral("Comment: %1").arg(qs(*in.note)), L.font(8.5, false, true), view::ink::text());
        L.space(L.mm(2));
    }
}

}  // namespace

Status writeReportPdf(const Project& project, const SequenceResult& result, std::string_view projectFile,
                      const std::filesystem::path& out) {
    return writeReportPdf(project, result, projectFile, out, ReportOptions{});
}

namespace {

// The file the report is of: its name and the SHA-256 of its bytes, so a
// reviewer can tie the report to one revision; an unsaved worksheet is
// checksummed as it would be saved (`asSaved`), and the report says so.
struct Source {
    QString fileName, checksum, note, generated;
};

Source sourceOf(std::string_view projectFile, const std::string& asSaved) {
    const QString file = QString::fromUtf8(projectFile.data(), qsizetype(projectFile.size()));
    QByteArray bytes;
    QString note;
    QFile f(file);
    if (!file.isEmpty() && f.open(QIODevice::ReadOnly)) {
        bytes = f.readAll();
    } else {
        bytes = QByteArray(asSaved.data(), qsizetype(asSaved.size()));
        note = file.isEmpty() ? QStringLiteral("Checksum of the worksheet as it would be saved; it has no file yet.")
                              : QStringLiteral("Checksum of the worksheet as it would be saved; the file could not be read.");
    }
    return {file.isEmpty() ? QStringLiteral("(not saved)") : QFileInfo(file).fileName(),
            QString::fromLatin1(QCryptographicHash::hash(bytes, QCryptographicHash::Sha256).toHex()), note,
            QDateTime::currentDateTimeUtc().toString(QStringLiteral("yyyy-MM-dd HH:mm 'UTC'"))};
}

// Lays the document out twice (a dry pass counts the pages for the footers)
// and writes the PDF atomically.
Status printPdf(const Meta& meta, const Source& source, const ReportOptions& options, const std::filesystem::path& out,
                const std::function<void(Layout&)>& write) {
    QBuffer buffer;
    buffer.open(QIODevice::WriteOnly);
    {
        QPdfWriter writer(&buffer);
        writer.setPageSize(QPageSize(options.pageSize == PageSize::Letter ? QPageSize::Letter : QPageSize::A4));
        writer.setPageMargins(QMarginsF(0, 0, 0, 0));
        writer.setResolution(600);
        writer.setTitle(qs(meta.title));
        writer.setCreator(QStringLiteral("Heatchain %1").arg(QStringLiteral(HEATCHAIN_VERSION)));
        QPainter painter;
        if (!painter.begin(&writer)) return makeError("cannot start drawing the PDF", out.string());
        Layout::Furniture furn{qs(meta.title), qs(meta.revision),
                               QStringLiteral("Heatchain report  ·  %1  ·  SHA-256 %2…")
                                   .arg(source.fileName, source.checksum.left(12))};
        Layout dry(writer, painter, /*dry=*/true, 0, furn);
        write(dry);
        Layout real(writer, painter, /*dry=*/false, dry.page(), furn);
        write(real);
        painter.end();
    }
    const QByteArray pdf = buffer.data();
    return writeFileAtomically(out, std::string_view(pdf.constData(), std::size_t(pdf.size())), /*keepBackup=*/false);
}

}  // namespace

Status writeReportPdf(const Project& project, const SequenceResult& result, std::string_view projectFile,
                      const std::filesystem::path& out, const ReportOptions& options) {
    if (auto st = report_detail::ensureGuiApplication(); !st) return st;
    const Source source = sourceOf(projectFile, writeProject(project));
    const Content content{project, result, source.fileName, source.checksum, source.note, source.generated,
                          options.uncertainty};
    return printPdf(project.meta, source, options, out, [&](Layout& L) { writeContent(L, content); });
}

Status writeReportPdf(const StreamSet& worksheet, const std::vector<SequenceResult>& results,
                      std::string_view projectFile, const std::filesystem::path& out, const ReportOptions& options) {
    if (worksheet.streams.empty() || results.size() != worksheet.streams.size())
        return makeError("the worksheet's streams have not all been solved", out.string());
    if (worksheet.streams.size() == 1)
        return writeReportPdf(worksheet.streams.front().project, results.front(), projectFile, out, options);
    if (auto st = report_detail::ensureGuiApplication(); !st) return st;
    const Source source = sourceOf(projectFile, writeStreamSet(worksheet));
    auto contentOf = [&](std::size_t k, bool titleBlock) {
        return Content{worksheet.streams[k].project, results[k], source.fileName, source.checksum, source.note,
                       source.generated, options.uncertainty, titleBlock};
    };
    return printPdf(worksheet.shared.meta, source, options, out, [&](Layout& L) {
        // One title block and one cautions box: the general caution once,
        // then each stream's own, named.
        QStringList cautions;
        for (std::size_t k = 0; k < worksheet.streams.size(); ++k) {
            const QStringList lines = cautionLines(worksheet.streams[k].project, results[k]);
            for (qsizetype i = 0; i < lines.size(); ++i) {
                if (i == 0 && k == 0) cautions << lines[i];
                if (i > 0) cautions << QStringLiteral("Stream %1: %2").arg(qs(worksheet.streams[k].id), lines[i]);
            }
        }
        writeTitleBlock(L, contentOf(0, true), cautions);
        int section = streamsSection(L, worksheet, results, 1);
        section = heatRecoverySection(L, worksheet, results, section);
        for (std::size_t k = 0; k < worksheet.streams.size(); ++k, ++section) {
            const Stream& s = worksheet.streams[k];
            L.newPage();
            L.heading(QString::number(section),
                      QStringLiteral("Stream %1%2").arg(qs(s.id), s.name ? QStringLiteral(" — ") + qs(*s.name) : QString()),
                      L.mm(40));
            L.setSectionPrefix(QString::number(section) + QLatin1Char('.'));
            writeContent(L, contentOf(k, false));
            L.setSectionPrefix({});
        }
    });
}

}  // namespace heatchain
