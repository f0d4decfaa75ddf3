#pragma once
// The main window only wires actions to commands and lays out the views:
// chain canvas and ledger in the middle, step editor on the left, charts on
// the right, messages below.
#include <QLabel>
#include <QLineEdit>
#include <QMainWindow>
#include <QMenu>
#include <QTableView>

#include "chain_view.hpp"
#include "chart_widget.hpp"
#include "document.hpp"
#include "exergy_widget.hpp"
#include "second_law_panel.hpp"
#include "ledger_model.hpp"
#include "messages_panel.hpp"
#include "step_editor.hpp"

namespace heatchain::gui {

class MainWindow : public QMainWindow {
    Q_OBJECT
public:
    explicit MainWindow(QWidget* parent = nullptr);

    ProjectDocument* document() { return &doc_; }
    ChainView* chain() const { return chain_; }
    StepEditor* editor() const { return editor_; }
    LedgerModel* ledger() const { return ledger_; }
    QTableView* ledgerView() const { return ledgerView_; }
    ChartWidget* tsChart() const { return ts_; }
    ChartWidget* tqChart() const { return tq_; }
    MessagesPanel* messages() const { return messages_; }
    ExergyWidget* exergyChart() const { return exergy_; }
    SecondLawPanel* secondLaw() const { return secondLaw_; }
    QLineEdit* quickAdd() const { return quickAdd_; }

    // When false, errors are recorded in lastError() instead of a dialog
    // (tests run without anyone to press OK).
    void setInteractive(bool on) { interactive_ = on; }
    QString lastError() const { return lastError_; }

    bool openFile(const QString& path);
    bool saveFile(const QString& path);
    // Adds the step the quick-add text describes after the selected step.
    bool quickAddStep(const QString& text);
    void setDisplayUnits(UnitSystem u);
    void copyLedger();

    // Restores the window layout and opens what the first start should show.
    void startUp(const QStringList& arguments);

protected:
    void closeEvent(QCloseEvent* e) override;

private:
    void buildActions();
    void buildDocks();
    void newWorksheet();
    void openDialog();
    bool save();
    bool saveAsDialog();
    bool confirmDiscard();
    void editSettings();
    void editUtilities();
    void openSweep();
    void showAbout();
    void addStep(int index, StepKind kind);
    void removeSelected();
    void duplicateSelected();
    void moveSelected(int delta);
    void updateTitle();
    void updateStatus();
    void rememberRecent(const QString& path);
    void fillRecentMenu();
    void reportError(const QString& title, const QString& text);

    ProjectDocument doc_;
    ChainView* chain_;
    StepEditor* editor_;
    LedgerModel* ledger_;
    QTableView* ledgerView_;
    ChartWidget* ts_;
    ChartWidget* tq_;
    MessagesPanel* messages_;
    ExergyWidget* exergy_ = nullptr;
    SecondLawPanel* secondLaw_ = nullptr;
    QLineEdit* quickAdd_;
    QMenu* recentMenu_ = nullptr;
    QMenu* viewMenu_ = nullptr;
    QLabel* statusSolve_;
    QLabel* statusMessages_;
    QList<QAction*> unitActions_;
    bool interactive_ = true;
    QString lastError_;
};

}  // namespace heatchain::gui
