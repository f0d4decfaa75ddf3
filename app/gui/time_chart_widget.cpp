#include "time_chart_widget.hpp"

#include <QPainter>

#include "chart_widget.hpp"

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
    const auto& t = doc_->result().totals;
    paintPanelHeading(p, *this, tr("Temperature and duty – time"),
                      t.cycleTime ? tr("cycle time %1 min").arg(*t.cycleTime / 60.0, 0, 'f', 1) : QString());
    chart_.paint(p, QRectF(rect()).adjusted(0, 22, 0, 0));
}

}  // namespace heatchain::gui
