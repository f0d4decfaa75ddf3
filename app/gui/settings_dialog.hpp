#pragma once
// Project settings: description (title, author, revision, notes), the
// material and model, the basis, the start state, the surroundings (the dead
// state for exergy), the atmosphere (for gauge pressures) and display units.
// OK checks the whole worksheet through core's parser before it is applied.
#include <QComboBox>
#include <QDialog>
#include <QLabel>
#include <QLineEdit>
#include <QPlainTextEdit>
#include <optional>

#include "heatchain/project.hpp"
#include "quantity_field.hpp"

namespace heatchain::gui {

class ProjectSettingsDialog : public QDialog {
    Q_OBJECT
public:
    explicit ProjectSettingsDialog(const Project& project, QWidget* parent = nullptr);
    // The edited project, once accepted.
    const std::optional<Project>& edited() const { return edited_; }
    // Tries to build the edited project; returns the reason when it cannot.
    QString tryBuild();

    QLineEdit* titleEdit() const { return title_; }
    QuantityField* startT() const { return startT_; }
    QuantityField* startP() const { return startP_; }
    QComboBox* substanceBox() const { return substance_; }

    void accept() override;

private:
    Dimension basisDimension() const;
    Project base_;
    std::optional<Project> edited_;
    QLineEdit *title_, *author_, *revision_;
    QPlainTextEdit* notes_;
    QComboBox *system_, *basisKind_, *model_, *substance_, *units_;
    QuantityField *basis_, *startT_, *startP_, *startX_, *startMelt_, *surrT_, *surrP_, *atm_;
    QLabel* problem_;
};

}  // namespace heatchain::gui
