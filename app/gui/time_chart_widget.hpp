#pragma once
// The chart dock's time chart: a batch's temperature and duty against time,
// with the utility's temperature (heatchain_view's TimeChart). The main
// window shows it as a tab beside the exergy bars for closed systems;
// redrawn on every change of the worksheet.
#include <QWidget>

#include "document.hpp"
#include "heatchain_view/time_chart.hpp"

namespace heatchain::gui {

class TimeChartWidget : public QWidget {
    Q_OBJECT
public:
    explicit TimeChartWidget(ProjectDocument* doc, QWidget* parent = nullptr);
    const view::TimeChart& chart() const { return chart_; }
    QSize sizeHint() const override { return {460, 300}; }
    QSize minimumSizeHint() const override { return {240, 200}; }

public slots:
    void refresh();

protected:
    void paintEvent(QPaintEvent*) override;

private:
    ProjectDocument* doc_;
    view::TimeChart chart_;
};

}  // namespace heatchain::gui
