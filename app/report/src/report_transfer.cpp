#include "report_transfer.hpp"

#include <QFont>
#include <QPainter>
#include <QString>
#include <cmath>

#include "heatchain_view/format.hpp"
#include "heatchain_view/palette.hpp"
#include "heatchain_view/time_chart.hpp"

namespace heatchain::report_detail {

namespace {

using heatchain::view::qs;

// A time as people read it: "42.5 min", "3.20 h".
QString timeText(double s) {
    if (s < 120.0) return QStringLiteral("%1 s").arg(view::formatNumber(s, 3, 1));
    if (s < 3.0 * 3600.0) return QStringLiteral("%1 min").arg(view::formatFixed(s / 60.0, 1));
    return QStringLiteral("%1 h").arg(view::formatFixed(s / 3600.0, 2));
}

}  // namespace

int heatTransferSection(Layout& L, const Project& p, const SequenceResult& r, int section) {
    bool any = false;
    for (const StepResult& s : r.steps) any = any || (s.computed && (s.transfer || s.batch));
    if (!any) return section;
    const UnitSystem us = p.displayUnits;
    const UnitContext ctx = p.unitContext();
    const bool closed = p.system == SystemKind::Closed;
    auto shown = [&](double v, Dimension d) { return view::formatDisplay(v, d, us, ctx); };
    auto unit = [&](Dimension d) { return view::unitSymbol(d, us, ctx); };
    const QFont small = L.font(8);
    L.heading(QString::number(section), closed ? QStringLiteral("Heat transfer and batch time")
                                               : QStringLiteral("Heat transfer: exchanger areas"),
              L.mm(30));
    L.paragraph(closed ? QStringLiteral("Each step's time through its jacket or coil, integrated along its path with "
                                        "the temperature difference at each instant (dt = m dh / Q̇), the heat loss "
                                        "to the surroundings included. Peak and mean duty are the utility's.")
                       : QStringLiteral("Each step's area is found zone by zone along its T–Q curve against its "
                                        "utility's line: a zone is one phase or one phase change, with its own "
                                        "overall coefficient U and its own log mean temperature difference (LMTD). "
                                        "One LMTD over a step that crosses a phase change would be wrong."),
                small, view::ink::text());
    const Dimension E = closed ? Dimension::Energy : Dimension::Power;
    std::vector<TableColumn> cols = {{QStringLiteral("#"), {}, 0.5, Qt::AlignRight},
                                     {QStringLiteral("Step"), {}, 1.8},
                                     {QStringLiteral("Area"), unit(Dimension::Area), 1.0, Qt::AlignRight},
                                     {QStringLiteral("UA"), unit(Dimension::ThermalConductance), 1.0, Qt::AlignRight},
                                     {QStringLiteral("Mean temperature difference"), unit(Dimension::TemperatureDifference), 1.4, Qt::AlignRight}};
    if (closed) {
        cols.push_back({QStringLiteral("Time"), {}, 1.0, Qt::AlignRight});
        cols.push_back({QStringLiteral("Peak duty"), unit(Dimension::Power), 1.1, Qt::AlignRight});
        cols.push_back({QStringLiteral("Mean duty"), unit(Dimension::Power), 1.1, Qt::AlignRight});
    }
    std::vector<TableRow> rows;
    for (std::size_t i = 0; i < r.steps.size(); ++i) {
        const StepResult& s = r.steps[i];
        if (!s.computed || (!s.transfer && !s.batch)) continue;
        TableRow row;
        row.marker = view::stepColour(int(i));
        const QString dash = QStringLiteral("–");
        row.cells = {QString::number(i + 1), qs(s.id),
                     s.transfer && s.transfer->area ? shown(*s.transfer->area, Dimension::Area) : dash,
                     s.transfer ? shown(s.transfer->UA, Dimension::ThermalConductance) : dash,
                     s.transfer ? shown(s.transfer->meanDeltaT, Dimension::TemperatureDifference) : dash};
        if (closed) {
            row.cells << (s.batch ? timeText(s.batch->duration) : dash)
                      << (s.batch ? shown(s.batch->peakDuty, Dimension::Power) : dash)
                      << (s.batch ? shown(s.batch->meanDuty, Dimension::Power) : dash);
        }
        rows.push_back(std::move(row));
    }
    TableRow total;
    total.style = TableRow::Style::Total;
    total.cells = {QString(), QStringLiteral("total"),
                   r.totals.area ? shown(*r.totals.area, Dimension::Area) : QStringLiteral("–"), QString(), QString()};
    if (closed) total.cells << (r.totals.cycleTime ? timeText(*r.totals.cycleTime) : QStringLiteral("–")) << QString() << QString();
    rows.push_back(std::move(total));
    L.table(cols, rows, 7.5, QStringLiteral("Heat transfer, continued"));
    // A rated or timed step's answer is where it ends: said in words.
    for (std::size_t i = 0; i < r.steps.size() && i < p.steps.size(); ++i) {
        const StepResult& s = r.steps[i];
        const Step& step = p.steps[i];
        if (!s.computed || (!step.to.rated && !step.to.time)) continue;
        const QString end = QStringLiteral("%1, %2").arg(view::formatWithUnit(s.end.T, Dimension::Temperature, us, ctx),
                                                         view::phaseText(s.end));
        L.paragraph(step.to.rated
                        ? QStringLiteral("%1 is rated: the exchanger given (%2) reaches %3, taking %4.")
                              .arg(qs(s.id),
                                   step.transfer && step.transfer->area ? qs(step.transfer->area->text)
                                   : step.transfer && step.transfer->UA ? qs(step.transfer->UA->text)
                                                                        : QStringLiteral("its UA"),
                                   end, view::formatWithUnit(std::fabs(s.Q), E, us, ctx))
                        : QStringLiteral("%1 runs for the time asked, %2: it ends at %3.")
                              .arg(qs(s.id), qs(step.to.time->text), end),
                    small, view::ink::text());
    }

    // The zones of every sized step.
    if (!closed) {
        std::vector<TableColumn> zc = {{QStringLiteral("Step"), {}, 1.6},
                                       {QStringLiteral("Zone"), {}, 1.8},
                                       {QStringLiteral("Duty"), unit(E), 1.1, Qt::AlignRight},
                                       {QStringLiteral("U"), unit(Dimension::HeatTransferCoefficient), 1.0, Qt::AlignRight},
                                       {QStringLiteral("LMTD"), unit(Dimension::TemperatureDifference), 0.9, Qt::AlignRight},
                                       {QStringLiteral("Area"), unit(Dimension::Area), 0.9, Qt::AlignRight}};
        std::vector<TableRow> zr;
        for (std::size_t i = 0; i < r.steps.size(); ++i) {
            const StepResult& s = r.steps[i];
            if (!s.computed || !s.transfer) continue;
            for (const TransferZone& z : s.transfer->zones) {
                TableRow row;
                row.marker = view::stepColour(int(i));
                row.cells = {qs(s.id), qs(z.label), shown(z.Q, E),
                             z.U > 0 ? shown(z.U, Dimension::HeatTransferCoefficient) : QStringLiteral("–"),
                             shown(z.LMTD, Dimension::TemperatureDifference),
                             z.U > 0 ? shown(z.area, Dimension::Area) : QStringLiteral("–")};
                zr.push_back(std::move(row));
            }
        }
        if (!zr.empty()) {
            L.subheading(QStringLiteral("Zones: each with its own U and LMTD"), L.mm(20));
            L.table(zc, zr, 7.5, QStringLiteral("Zones, continued"));
        }
    } else {
        view::TimeChart chart;
        chart.setData(p, r);
        if (chart.hasData()) {
            const double h = std::min(L.mm(95), L.remaining() > L.mm(60) ? L.remaining() - L.mm(12) : L.mm(95));
            L.subheading(QStringLiteral("Temperature and duty against time, with the utility's temperature"), h);
            L.figure(h, [&](QPainter& painter, const QRectF& rect) {
                const double logicalW = 760;
                const double scale = rect.width() / logicalW;
                painter.save();
                painter.translate(rect.topLeft());
                painter.scale(scale, scale);
                painter.fillRect(QRectF(0, 0, logicalW, rect.height() / scale), Qt::white);
                QFont f(QStringLiteral("DejaVu Sans"));
                f.setPixelSize(11);  // the other charts' label size
                painter.setFont(f);
                chart.paint(painter, QRectF(0, 0, logicalW, rect.height() / scale));
                painter.restore();
            });
        }
    }
    return section + 1;
}

}  // namespace heatchain::report_detail
