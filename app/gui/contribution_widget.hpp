#pragma once
// Which input drives the uncertainty, on screen (view::ContributionChart),
// in the Uncertainty tab beside the ledger.
#include <QWidget>

#include "document.hpp"
#include "heatchain_view/contribution_chart.hpp"

namespace heatchain::gui {

class ContributionWidget : public QWidget {
    Q_OBJECT
public:
    explicit ContributionWidget(ProjectDocument* doc, QWidget* parent = nullptr);
    const view::ContributionChart& chart() const { return chart_; }
    QSize sizeHint() const override { return {460, 30 + int(chart_.preferredHeight())}; }
    QSize minimumSizeHint() const override { return {240, 90}; }

public slots:
    void refresh();

protected:
    void paintEvent(QPaintEvent*) override;

private:
    ProjectDocument* doc_;
    view::ContributionChart chart_;
};

}  // namespace heatchain::gui
