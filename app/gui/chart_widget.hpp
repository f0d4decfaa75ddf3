#pragma once
// A process chart on screen: draws heatchain::view::ProcessChart, shows the
// values of the nearest curve point under the mouse, and selects a step on
// click.
#include <QPainter>
#include <QWidget>

#include "document.hpp"
#include "heatchain_view/palette.hpp"
#include "heatchain_view/process_chart.hpp"

namespace heatchain::gui {

class ChartWidget : public QWidget {
    Q_OBJECT
public:
    ChartWidget(ProjectDocument* doc, view::ProcessChart::Kind kind, QWidget* parent = nullptr);
    const view::ProcessChart& chart() const { return chart_; }
    QSize sizeHint() const override { return {460, 320}; }
    QSize minimumSizeHint() const override { return {240, 150}; }

public slots:
    void refresh();

protected:
    void paintEvent(QPaintEvent*) override;
    void mouseMoveEvent(QMouseEvent* e) override;
    void mousePressEvent(QMouseEvent* e) override;
    void leaveEvent(QEvent*) override;

private:
    QRectF chartRect() const;
    ProjectDocument* doc_;
    view::ProcessChart chart_;
    QString title_;
    std::optional<view::ProcessChart::Hover> hover_;
};

// The charts' common face: a white panel with its title in bold at the top
// left and, when given, a note at the top right in `noteColour` (the
// painter's font is the widget's again afterwards).
void paintPanelHeading(QPainter& p, const QWidget& w, const QString& title, const QString& note = {},
                       const QColor& noteColour = view::ink::muted());

}  // namespace heatchain::gui
