#pragma once
// The editor beside the canvas: every option of the selected step's kind,
// each field committed as one EditStepField command, and the step's result
// (end state, Q, W, ΔH, ΔS, S_gen, exergy destroyed, messages) read-only
// below it.
#include <QComboBox>
#include <QFormLayout>
#include <QGroupBox>
#include <QLabel>
#include <QLineEdit>
#include <QWidget>
#include <functional>

#include "document.hpp"
#include "quantity_field.hpp"
#include "result_table.hpp"

namespace heatchain::gui {

class StepEditor : public QWidget {
    Q_OBJECT
public:
    explicit StepEditor(ProjectDocument* doc, QWidget* parent = nullptr);

    // For tests and the quick keyboard path: the field widgets by name
    // ("id", "target", "source", "sink", "fraction", "n", "efficiency", "note").
    QuantityField* field(const QString& name) const;
    QComboBox* kindBox() const { return kind_; }
    QComboBox* targetBox() const { return targetKind_; }
    // Why the last edit was not applied; empty when it was (tests).
    QString problem() const;
    QComboBox* pathBox() const { return path_; }
    QComboBox* atBox() const { return at_; }
    // Beside the source / sink temperature: "temperature…" (item 0) or one of
    // the worksheet's utilities (item data: the utility id).
    QComboBox* sourceBox() const { return sourceUtility_; }
    QComboBox* sinkBox() const { return sinkUtility_; }

public slots:
    void refresh();

signals:
    // An entry that failed its check and was not applied, for the status bar.
    void rejected(const QString& what);

private:
    enum class Target { None, Temperature, Duty, Quality, Pressure, Ratio, Rated, Time };
    QString checkTarget(const QString& text, Target t) const;
    Target currentTarget() const;
    void applyTarget(const QString& text);
    void apply(const QString& fieldName, const std::function<void(Step&)>& change);
    const Step* step() const;
    void fillTargetChoices(StepKind k, Target current);
    void setRow(QWidget* w, bool visible);
    void fillUtilityChoices(QComboBox* box, QuantityField* field, const std::optional<Reservoir>& r);

    ProjectDocument* doc_;
    bool filling_ = false;
    QString shownKey_;  // what the editor shows; refresh() skips an identical refill
    QLabel* header_;
    QWidget* form_;
    QFormLayout* formLayout_;
    QuantityField* id_;
    QComboBox* kind_;
    QComboBox* targetKind_;
    QuantityField* target_;
    QComboBox* at_;
    QuantityField* fraction_;
    QComboBox* path_;
    QuantityField* n_;
    QuantityField* efficiency_;
    QuantityField* source_;
    QuantityField* sink_;
    QComboBox* sourceUtility_;
    QComboBox* sinkUtility_;
    QuantityField* note_;
    class TransferFields* transfer_;
    QGroupBox* resultBox_;
    ResultTable* resultText_;
    QLabel* messages_;
    QLabel* empty_;
    QLabel* problem_;
};

}  // namespace heatchain::gui
