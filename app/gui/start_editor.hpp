#pragma once
// The step panel's face for the Start card: the material (substance and
// property model), where it starts (T, P, and on a phase line quality or
// liquid fraction) and how much of it (basis). Each field commits on Enter or
// leaving it as one undoable settings edit; core's parser checks the whole
// worksheet and its reason is shown under the field.
#include <QComboBox>
#include <QLabel>
#include <QWidget>
#include <functional>

#include "document.hpp"
#include "quantity_field.hpp"

namespace heatchain::gui {

class StartEditor : public QWidget {
    Q_OBJECT
public:
    explicit StartEditor(ProjectDocument* doc, QWidget* parent = nullptr);

    // For tests: "T", "P", "quality", "meltFraction", "basis".
    QuantityField* field(const QString& name) const;
    QComboBox* substanceBox() const { return substance_; }
    QComboBox* modelBox() const { return model_; }

public slots:
    void refresh();

signals:
    // An entry that could not be applied, for the status bar.
    void rejected(const QString& what);

private:
    // Applies `change` to a copy of the worksheet; core re-reads it. Returns
    // the reason when core refuses.
    QString apply(const QString& what, const std::function<void(Project&)>& change);

    ProjectDocument* doc_;
    bool filling_ = false;
    QLabel* lead_;
    QComboBox* substance_;
    QComboBox* model_;
    QComboBox* basisKind_;
    QuantityField* basis_;
    QuantityField* T_;
    QuantityField* P_;
    QuantityField* quality_;
    QuantityField* melt_;
    QLabel* state_;
    QLabel* problem_;
};

}  // namespace heatchain::gui
