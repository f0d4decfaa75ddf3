#pragma once
// The exergy-destroyed bar chart on screen (view::ExergyBarChart); a click
// on a bar selects its step.
#include <QWidget>

#include "document.hpp"
#include "heatchain_view/exergy_chart.hpp"

namespace heatchain::gui {

class ExergyWidget : public QWidget {
    Q_OBJECT
public:
    explicit ExergyWidget(ProjectDocument* doc, QWidget* parent = nullptr);
    const view::ExergyBarChart& chart() const { return chart_; }
    QSize sizeHint() const override { return {460, 240}; }
    // Tall enough for every bar to carry its label (up to a dozen steps).
    QSize minimumSizeHint() const override {
        return {240, 24 + int(chart_.preferredHeight(std::min<int>(12, int(chart_.bars().size()))) * 0.8)};
    }

public slots:
    void refresh();

protected:
    void paintEvent(QPaintEvent*) override;
    void mousePressEvent(QMouseEvent* e) override;

private:
    QRectF chartRect() const;
    ProjectDocument* doc_;
    view::ExergyBarChart chart_;
    QSize askedFor_;
};

}  // namespace heatchain::gui
