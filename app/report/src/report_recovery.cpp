#include "report_recovery.hpp"

#include <QFont>
#include <QPainter>
#include <QString>
#include <QStringList>
#include <algorithm>

#include "heatchain/recovery.hpp"
#include "heatchain_view/format.hpp"
#include "heatchain_view/palette.hpp"
#include "heatchain_view/recovery_chart.hpp"

namespace heatchain::report_detail {

namespace {

using heatchain::view::qs;

constexpr int kSweepPoints = 41;

}  // namespace

int streamsSection(Layout& L, const StreamSet& set, const std::vector<SequenceResult>& results, int section) {
    const Project& shared = set.shared;
    const UnitSystem us = shared.displayUnits;
    const UnitContext ctx = view::displayContext(shared);
    L.heading(QString::number(section), QStringLiteral("Streams"), L.mm(30));
    L.paragraph(QStringLiteral("The worksheet holds %1 streams. Each has its own material, start state and steps; "
                               "they share the display units, surroundings, utilities and the required minimum "
                               "approach. Each stream's results follow in a section of its own.")
                    .arg(set.streams.size()),
                L.font(8), view::ink::text());
    const std::vector<TableColumn> cols = {
        {QStringLiteral("Stream"), {}, 1.1},
        {QStringLiteral("Name"), {}, 2.0},
        {QStringLiteral("Material"), {}, 1.1},
        {QStringLiteral("System"), {}, 0.9},
        {QStringLiteral("Steps"), {}, 0.5, Qt::AlignRight},
        {QStringLiteral("Heating"), view::unitSymbol(Dimension::Power, us, ctx), 0.9, Qt::AlignRight},
        {QStringLiteral("Cooling"), view::unitSymbol(Dimension::Power, us, ctx), 0.9, Qt::AlignRight},
    };
    std::vector<TableRow> rows;
    for (std::size_t k = 0; k < set.streams.size(); ++k) {
        const Stream& s = set.streams[k];
        const Project& p = s.project;
        const bool closed = p.system == SystemKind::Closed;
        TableRow row;
        const QString dash = QStringLiteral("–");
        // A batch's heat is per batch (energy), not a duty: its own unit.
        auto duty = [&](double v) {
            return closed ? view::formatWithUnit(v, Dimension::Energy, us, ctx, 4) : view::formatDisplay(v, Dimension::Power, us, ctx);
        };
        const bool solved = k < results.size();
        row.cells = {qs(s.id), s.name ? qs(*s.name) : dash,
                     qs(p.substance.displayName()),
                     closed ? QStringLiteral("closed batch") : QStringLiteral("steady flow"),
                     QString::number(p.steps.size()), solved ? duty(results[k].totals.heatingDuty) : dash,
                     solved ? duty(results[k].totals.coolingDuty) : dash};
        rows.push_back(std::move(row));
    }
    L.table(cols, rows, 7.5, QStringLiteral("Streams, continued"));
    return section + 1;
}

int heatRecoverySection(Layout& L, const StreamSet& set, const std::vector<SequenceResult>& results, int section) {
    const Project& shared = set.shared;
    const UnitSystem us = shared.displayUnits;
    const UnitContext ctx = view::displayContext(shared);
    auto Q = [&](double W) { return view::formatWithUnit(W, Dimension::Power, us, ctx, 4); };
    auto T = [&](double K) { return view::formatWithUnit(K, Dimension::Temperature, us, ctx, 4); };
    const QFont body = L.font(9), small = L.font(8);
    const QString number = QString::number(section);
    L.heading(number, QStringLiteral("Heat recovery targets"), L.mm(40));
    auto found = worksheetRecovery(set, results);
    if (!found) {
        L.paragraph(QStringLiteral("The targets could not be worked out: %1").arg(qs(found.error().text())),
                    L.font(8.5, true), view::ink::error());
        return section + 1;
    }
    const Recovery& r = *found;
    const Targets& t = r.targets;
    L.paragraph(QStringLiteral("The least hot and cold utility any exchanger network between the streams could need "
                               "at a minimum temperature difference ΔTmin of %1 (the worksheet's required minimum "
                               "approach), beside what the streams' own steps use today. Found with the problem "
                               "table of pinch analysis (Linnhoff & Flower 1978; Kemp, Pinch Analysis and Process "
                               "Integration, 2nd ed., 2007) on the solved T–Q curves, each heating and cooling step "
                               "cut into straight pieces within %2 of the solved temperatures. Targets are the least "
                               "any network could need; they do not design one.")
                    .arg(view::formatWithUnit(t.dTmin, Dimension::TemperatureDifference, us, ctx, 3),
                         view::formatWithUnit(r.toleranceK, Dimension::TemperatureDifference, us, ctx, 2)),
                small, view::ink::text());

    const QString pu = view::unitSymbol(Dimension::Power, us, ctx);
    auto shown = [&](double W) { return view::formatDisplay(W, Dimension::Power, us, ctx); };
    const std::vector<TableColumn> cols = {{QString(), {}, 1.4},
                                           {QStringLiteral("Minimum (target)"), pu, 1, Qt::AlignRight},
                                           {QStringLiteral("Today"), pu, 1, Qt::AlignRight},
                                           {QStringLiteral("Recoverable"), pu, 1, Qt::AlignRight}};
    L.table(cols,
            {TableRow{{QStringLiteral("hot utility"), shown(t.hotUtilityMin), shown(r.hotUtilityNow), shown(r.recoverableHot())}},
             TableRow{{QStringLiteral("cold utility"), shown(t.coldUtilityMin), shown(r.coldUtilityNow),
                       shown(r.recoverableCold())}}},
            8);
    QString summary = QStringLiteral("Recoverable %1").arg(Q(r.recoverableHot()));
    if (auto share = r.recoverableHotShare())
        summary += QStringLiteral(", %1 % of today's hot utility").arg(view::formatNumber(100 * *share, 3));
    summary += QStringLiteral(".");
    L.paragraph(summary, L.font(9, true), view::ink::text());
    QStringList pinch;
    for (std::size_t i = 0; i < t.pinchHot.size(); ++i)
        pinch << QStringLiteral("%1 on the hot streams, %2 on the cold streams").arg(T(t.pinchHot[i]), T(t.pinchCold[i]));
    L.paragraph(pinch.isEmpty() ? QStringLiteral("Pinch: none (%1).")
                                      .arg(t.hotUtilityMin <= 0 || t.coldUtilityMin <= 0
                                               ? QStringLiteral("a threshold case: one utility alone is needed")
                                               : QStringLiteral("no interior point where no heat flows"))
                                : QStringLiteral("Pinch: %1.").arg(pinch.join(QStringLiteral("; "))),
                body, view::ink::text());

    if (!r.timeAveraged.empty()) {
        QStringList ids;
        for (const std::string& id : r.timeAveraged) ids << qs(id);
        L.box(QStringLiteral("Batch streams, time-averaged"),
              {QStringLiteral("%1 enter with each batch's heat averaged over the stream's cycle time.")
                   .arg(ids.join(QStringLiteral(", "))),
               QStringLiteral("This time-average view overstates what can be recovered between batches: a batch's "
                              "heating and another stream's cooling meet only when the schedule makes them happen "
                              "at the same time, or when heat is stored in between.")},
              rink::cautionFace(), rink::cautionEdge());
    }
    for (const Excluded& e : r.excluded)
        L.paragraph(QStringLiteral("Stream %1 is left out: %2").arg(qs(e.stream), qs(e.reason)), small, view::ink::text());

    if (!r.utilities.levels.empty()) {
        L.subheading(QStringLiteral("Utility levels against the grand composite curve"), L.mm(20));
        const std::vector<TableColumn> ucols = {
            {QStringLiteral("Utility"), {}, 1.2},
            {QStringLiteral("Gives or takes"), {}, 1.0},
            {QStringLiteral("T"), view::unitSymbol(Dimension::Temperature, us, ctx), 0.8, Qt::AlignRight},
            {QStringLiteral("Share of the target"), pu, 1.0, Qt::AlignRight}};
        std::vector<TableRow> urows;
        for (const UtilityPlacement& u : r.utilities.levels)
            urows.push_back({{qs(u.id), u.hot ? QStringLiteral("gives heat") : QStringLiteral("takes heat"),
                              view::formatDisplay(u.T, Dimension::Temperature, us, ctx), shown(u.duty)}});
        L.table(ucols, urows, 7.5);
        L.paragraph(QStringLiteral("Hot levels are filled from the coldest up, cold levels from the warmest down: each "
                                   "takes as much of the target as the grand composite curve allows at its temperature."),
                    small, view::ink::muted());
        if (hotFallsShort(r.utilities, t))
            L.paragraph(QStringLiteral("No hot level is hot enough for %1.").arg(Q(r.utilities.hotUnmet)), small,
                        view::ink::warning().darker(130));
        if (coldFallsShort(r.utilities, t))
            L.paragraph(QStringLiteral("No cold level is cold enough for %1.").arg(Q(r.utilities.coldUnmet)), small,
                        view::ink::warning().darker(130));
    }

    // The charts, drawn as the application and heatchain-cli chart draw them.
    const double logicalW = 760;
    auto chart = [&](const QString& title, double h, const std::function<void(QPainter&, const QRectF&)>& draw) {
        L.subheading(title, h);
        L.figure(h, [&](QPainter& painter, const QRectF& rect) {
            paintScaledFigure(painter, rect, logicalW, [&](QPainter& p, const QRectF& area) {
                p.fillRect(area, Qt::white);
                draw(p, area);
            });
        });
    };
    L.newPage();
    const double h = std::min(L.mm(105), (L.remaining() - L.mm(24)) / 2);
    view::RecoveryChart composite(view::RecoveryChart::Kind::Composite);
    composite.setData(r, us, ctx);
    chart(QStringLiteral("Composite curves: the heat recovered between them shaded, the pinch marked"), h,
          [&](QPainter& p, const QRectF& area) { composite.paint(p, area); });
    view::RecoveryChart grand(view::RecoveryChart::Kind::GrandComposite);
    grand.setData(r, us, ctx);
    chart(QStringLiteral("Grand composite curve with the worksheet's utility levels"), h,
          [&](QPainter& p, const QRectF& area) { grand.paint(p, area); });
    const double top = std::max(40.0, 2 * t.dTmin);
    if (auto sweep = worksheetDTminSweep(set, results, 0.0, top, kSweepPoints)) {
        view::TargetsSweepChart plot;
        plot.setData(std::move(*sweep), t.dTmin, us, ctx);
        chart(QStringLiteral("Minimum hot and cold utility against ΔTmin"), L.mm(70),
              [&](QPainter& p, const QRectF& area) { plot.paint(p, area); });
    }

    // The problem table, for a reviewer who checks the cascade by hand.
    L.subheading(QStringLiteral("Problem table (shifted temperatures)"), L.mm(20));
    const QString tu = view::unitSymbol(Dimension::Temperature, us, ctx);
    const std::vector<TableColumn> pcols = {{QStringLiteral("From"), tu, 1, Qt::AlignRight},
                                            {QStringLiteral("To"), tu, 1, Qt::AlignRight},
                                            {QStringLiteral("Surplus (+) or deficit (−)"), pu, 1.4, Qt::AlignRight},
                                            {QStringLiteral("Heat flowing down out of it"), pu, 1.4, Qt::AlignRight}};
    std::vector<TableRow> prows;
    for (const ProblemTableRow& row : t.problemTable)
        prows.push_back({{view::formatDisplay(row.Ttop, Dimension::Temperature, us, ctx),
                          view::formatDisplay(row.Tbottom, Dimension::Temperature, us, ctx), shown(row.surplus),
                          shown(row.cascadeBelow)}});
    L.table(pcols, prows, 7, QStringLiteral("Problem table, continued"));
    L.paragraph(QStringLiteral("Hot streams are shifted down and cold streams up by their ΔTmin contribution (half "
                               "ΔTmin unless the stream gives its own); the minimum hot utility enters at the top."),
                small, view::ink::muted());
    return section + 1;
}

}  // namespace heatchain::report_detail
