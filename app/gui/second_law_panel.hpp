#pragma once
// Utilities and the second law, beside the ledger: per step its utility,
// how much of it the step uses, the smallest approach and where, exergy
// supplied and destroyed and η_II; then each utility's total use and the
// sequence's η_II. Every number is core's, formatted in display units.
#include <QTableWidget>

#include "document.hpp"

namespace heatchain::gui {

class SecondLawPanel : public QTableWidget {
    Q_OBJECT
public:
    explicit SecondLawPanel(ProjectDocument* doc, QWidget* parent = nullptr);
    enum Column { ColStep, ColUtility, ColUse, ColApproach, ColWhere, ColSupplied, ColDestroyed, ColShare, ColEta, ColumnCount };
    // Row of step `index` (−1 when not shown), for tests and selection;
    // brings a panel that was out of sight up to date first.
    int rowOfStep(int index) const;
    int rowOfUtility(const QString& id) const;

public slots:
    void refresh();

protected:
    void showEvent(QShowEvent* e) override;
    bool viewportEvent(QEvent* e) override;

private:
    // An edit: rebuilt now when the panel can be seen, else when it next is.
    void documentChanged();
    void catchUp() const;
    void fitColumns();
    bool columnsStale_ = false;
    bool stale_ = false;

    ProjectDocument* doc_;
    std::vector<int> stepOfRow_;
    std::vector<QString> utilityOfRow_;
};

}  // namespace heatchain::gui
