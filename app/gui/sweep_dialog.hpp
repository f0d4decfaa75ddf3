#pragma once
// Sweep…: vary one input of one step (or of the start state) over a range,
// re-solve at each point with core's sweep(), and plot the chosen results
// against the input. Points core could not compute are listed with core's
// reason beneath the plot (and crossed on its input axis), never dropped.
#include <QComboBox>
#include <QDialog>
#include <QLabel>
#include <QListWidget>
#include <QPlainTextEdit>
#include <QSpinBox>
#include <QTableWidget>
#include <optional>

#include "heatchain/project.hpp"
#include "heatchain/sweep.hpp"
#include "heatchain_view/sweep_plot.hpp"
#include "quantity_field.hpp"

namespace heatchain::gui {

class SweepPlotWidget : public QWidget {
public:
    explicit SweepPlotWidget(QWidget* parent = nullptr) : QWidget(parent) {}
    view::SweepPlot& plot() { return plot_; }
    QSize sizeHint() const override { return {560, 420}; }
protected:
    void paintEvent(QPaintEvent*) override;
private:
    view::SweepPlot plot_;
};

class SweepDialog : public QDialog {
    Q_OBJECT
public:
    // `selectedStep`: the step to preselect (−1: the start state).
    SweepDialog(const Project& project, int selectedStep, QWidget* parent = nullptr);

    QComboBox* stepBox() const { return step_; }
    QComboBox* inputBox() const { return input_; }
    QuantityField* fromField() const { return from_; }
    QuantityField* toField() const { return to_; }
    QSpinBox* pointsBox() const { return points_; }
    QListWidget* outputList() const { return outputs_; }
    QTableWidget* table() const { return table_; }
    QPlainTextEdit* failures() const { return failures_; }
    SweepPlotWidget* plotWidget() const { return plot_; }

    // Checks (by output key) the results to compute and plot.
    void chooseOutputs(const std::vector<std::string>& keys);
    // The spec the controls describe.
    SweepSpec spec() const;
    // Runs core sweep(); the reason when the sweep as a whole was refused.
    QString run();
    const std::optional<SweepResult>& result() const { return result_; }
    QString problem() const { return problem_->text(); }

private:
    void fillInputs();
    void prefillRange();
    void showResult();

    Project project_;
    QComboBox* step_;
    QComboBox* input_;
    QuantityField* from_;
    QuantityField* to_;
    QSpinBox* points_;
    QListWidget* outputs_;
    QLabel* problem_;
    SweepPlotWidget* plot_;
    QTableWidget* table_;
    QPlainTextEdit* failures_;
    std::optional<SweepResult> result_;
};

}  // namespace heatchain::gui
