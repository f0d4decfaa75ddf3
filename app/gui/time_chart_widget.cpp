#include "time_chart_widget.hpp"

#include <QPainter>

#include "heatchain_view/palette.hpp"

namespace heatchain::gui {

TimeChartWidget::TimeChartWidget(ProjectDocument* doc, QWidget* parent) : QWidget(parent), doc_(doc) {
    setAttribute(Qt::WA_OpaquePaintEvent);
    setObjectName(QStringLiteral("timeChart"));
    connect(doc_, &ProjectDocument::changed, this, &TimeChartWidget::refresh);
    refresh();
}

void TimeChartWidget::refresh() {
    // Only a batch has times: the main window shows the chart's tab for
    // closed systems.
    chart_.setStepColours(doc_->stepColours());
    chart_.setData(doc_->project(), doc_->result());
    update();
}

void TimeChartWidget::paintEvent(QPaintEvent*) {
    QPainter p(this);
    p.fillRect(rect(), Qt::white);
    QFont f = font();
    f.setBold(true);
    p.setFont(f);
    p.setPen(view::ink::text());
    p.drawText(QRectF(8, 2, width() - 16, 20), Qt::AlignVCenter, tr("Temperature and duty – time"));
    const auto& t = doc_->result().totals;
    if (t.cycleTime) {
        p.setFont(font());
        p.setPen(view::ink::muted());
        p.drawText(QRectF(8, 2, width() - 16, 20), Qt::AlignVCenter | Qt::AlignRight,
                   tr("cycle time %1 min").arg(*t.cycleTime / 60.0, 0, 'f', 1));
    }
    p.setFont(font());
    chart_.paint(p, QRectF(rect()).adjusted(0, 22, 0, 0));
}

}  // namespace heatchain::gui
