#pragma once
// The heat recovery view: the targets of every steady-flow stream of the
// worksheet at a ΔTmin the user moves (a slider, recomputed live), beside
// today's utility use of the worksheet's own steps; the composite curves
// with the pinch and the recovered heat, the grand composite curve with the
// worksheet's utility levels, and the targets against ΔTmin. Every number is
// core's (worksheetRecovery, worksheetDTminSweep); this only shows them.
#include <QLabel>
#include <QPushButton>
#include <QSlider>
#include <QWidget>
#include <optional>
#include <vector>

#include "document.hpp"
#include "heatchain/recovery.hpp"
#include "heatchain_view/recovery_chart.hpp"

namespace heatchain::gui {

class RecoveryChartArea;

class HeatRecoveryView : public QWidget {
    Q_OBJECT
public:
    explicit HeatRecoveryView(ProjectDocument* doc, QWidget* parent = nullptr);

    // ΔTmin in use, K (starts at the worksheet's required minimum approach).
    double dTmin() const { return dTmin_; }
    void setDTmin(double kelvin);
    QSlider* slider() const { return slider_; }
    // What the view shows, brought up to date first (behind another tab the
    // view waits until it is shown or painted). The targets: null when core
    // could not work them out (error() says why).
    const Recovery* recovery() {
        catchUp();
        return recovery_ ? &*recovery_ : nullptr;
    }
    QString error() {
        catchUp();
        return error_;
    }
    const std::vector<TargetsAtDTmin>& sweep() {
        catchUp();
        return sweep_;
    }
    // The targets table and the notes under it, as shown.
    QString targetsText();
    QString notesText();
    // Recomputes now (the view otherwise waits until it is shown).
    void refresh();

protected:
    void showEvent(QShowEvent* e) override;

private:
    void documentChanged();
    void catchUp() {
        if (stale_) refresh();
    }
    void recomputeTargets();
    void showTargets();

    ProjectDocument* doc_;
    QSlider* slider_;
    QLabel* dTminLabel_;
    QPushButton* resetButton_;
    QLabel* table_;
    QLabel* notes_;
    RecoveryChartArea* composite_;
    RecoveryChartArea* grand_;
    RecoveryChartArea* sweepChart_;
    view::RecoveryChart compositeChart_{view::RecoveryChart::Kind::Composite};
    view::RecoveryChart grandChart_{view::RecoveryChart::Kind::GrandComposite};
    view::TargetsSweepChart sweepPlot_;
    double dTmin_ = 10;
    std::optional<double> worksheetDTmin_;  // the worksheet's required minimum approach last seen
    std::optional<Recovery> recovery_;
    std::vector<TargetsAtDTmin> sweep_;
    QString error_;
    bool stale_ = true;
};

}  // namespace heatchain::gui
