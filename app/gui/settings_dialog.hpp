#pragma once
// Project settings: description (title, author, revision, notes), the
// material and model, the basis, the start state, the surroundings (the dead
// state for exergy), the atmosphere (for gauge pressures) and display units.
// OK checks the whole worksheet through core's parser before it is applied.
#include <QComboBox>
#include <QLabel>
#include <QLineEdit>
#include <QPlainTextEdit>
#include <optional>

#include "heatchain/project.hpp"
#include "quantity_field.hpp"
#include "worksheet_dialog.hpp"

namespace heatchain::gui {

class ProjectSettingsDialog : public WorksheetDialog {
    Q_OBJECT
public:
    explicit ProjectSettingsDialog(const Project& project, QWidget* parent = nullptr);

    QLineEdit* titleEdit() const { return title_; }
    QuantityField* startT() const { return startT_; }
    QuantityField* startP() const { return startP_; }
    QComboBox* substanceBox() const { return substance_; }

private:
    QString build(Project& p) override;
    QLineEdit *title_, *author_, *revision_;
    QPlainTextEdit* notes_;
    QComboBox *system_, *basisKind_, *model_, *substance_, *units_;
    QuantityField *basis_, *startT_, *startP_, *startX_, *startMelt_, *surrT_, *surrP_, *atm_;
};

}  // namespace heatchain::gui
