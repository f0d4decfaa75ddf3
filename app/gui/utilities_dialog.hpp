#pragma once
// The worksheet's utilities (steam at a pressure; a sensible stream with
// in/out temperatures, cp and an optional density; a fixed temperature) and
// the minimum approach a heat exchanger with a utility should keep. One row
// per utility; OK re-reads the whole worksheet through core's parser, so a
// utility a step still names cannot be removed and a bad value is refused
// with core's reason. A renamed utility is renamed in the steps that use it.
#include <QLabel>
#include <QTableWidget>
#include <optional>

#include "heatchain/project.hpp"
#include "quantity_field.hpp"
#include "worksheet_dialog.hpp"

namespace heatchain::gui {

class UtilitiesDialog : public WorksheetDialog {
    Q_OBJECT
public:
    explicit UtilitiesDialog(const Project& project, QWidget* parent = nullptr);

    enum Column { ColId, ColKind, ColName, ColP, ColIn, ColOut, ColCp, ColDensity, ColT, ColGives, ColumnCount };

    // For tests and the keyboard: add a row of `kind`, set a cell's text.
    int addUtility(UtilityKind kind);
    void setCell(int row, Column c, const QString& text);
    void removeRow(int row);
    QuantityField* minApproachField() const { return minApproach_; }
    QTableWidget* table() const { return table_; }


private:
    QString build(Project& p) override;
    void addRow(const Utility& u, const QString& originalId);
    void updateRowKind(int row);
    void updateResolved(int row);
    UtilityKind rowKind(int row) const;

    QTableWidget* table_;
    QuantityField* minApproach_;
};

}  // namespace heatchain::gui
