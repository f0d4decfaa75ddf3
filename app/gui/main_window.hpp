#pragma once
// The main window only wires actions to commands and lays out the views:
// chain canvas and ledger in the middle, step editor on the left, charts on
// the right, messages below.
#include <QFileSystemWatcher>
#include <QFrame>
#include <QLabel>
#include <QLineEdit>
#include <QMainWindow>
#include <QMenu>
#include <QPushButton>
#include <QTableView>
#include <QTimer>
#include <functional>
#include <memory>

#include "autosave.hpp"
#include "heatchain/report.hpp"

#include "chain_view.hpp"
#include "chart_widget.hpp"
#include "document.hpp"
#include "exergy_widget.hpp"
#include "second_law_panel.hpp"
#include "ledger_model.hpp"
#include "messages_panel.hpp"
#include "step_editor.hpp"

namespace heatchain::gui {

class CompareDialog;

// The questions the window asks the user, and their possible answers. Tests
// inject the answers (setAsker) instead of pressing buttons.
enum class Question { UnsavedChanges, ChangedOnDisk, Recover };
enum class Answer { Save, Discard, Cancel, Overwrite, SaveAs, Recover, Later };
using Asker = std::function<Answer(Question, const QString& text)>;

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
    // Without an asker, a non-interactive window answers every question with
    // the answer that loses nothing: Discard for unsaved changes (tests build
    // and drop worksheets freely), Cancel for a file changed on disk, Later
    // for recovery.
    void setInteractive(bool on) { interactive_ = on; }
    void setAsker(Asker asker) { asker_ = std::move(asker); }
    QString lastError() const { return lastError_; }
    // The text of the last question asked (what the user was shown).
    QString lastQuestion() const { return lastQuestion_; }

    bool openFile(const QString& path);
    bool saveFile(const QString& path);
    // File → Save: asks before overwriting a file someone else changed.
    bool save();
    // Asks about unsaved changes; true when the worksheet may be replaced.
    bool confirmDiscard();
    void newWorksheet();

    // Exports of the current worksheet and its results. Never change the
    // worksheet; refuse to write over the worksheet's own file.
    bool exportReport(const QString& path, PageSize pageSize);
    bool exportChartImage(const QString& path, ChartKind kind);
    bool exportLedger(const QString& path);
    bool exportResults(const QString& path);

    // Compares the worksheet (after) with the revision in `path` (before).
    // The dialog is returned unshown for tests; the menu shows it.
    CompareDialog* compareWith(const QString& path);

    // Autosave: every `ms` (default one minute) into `folder` (default
    // <AppDataLocation>/autosave).
    void setAutosaveInterval(int ms) { autosaveTimer_.setInterval(ms); }
    int autosaveInterval() const { return autosaveTimer_.interval(); }
    void setAutosaveFolder(const QString& folder);
    AutosaveStore* autosaveStore() const { return autosave_.get(); }
    void autosaveNow();
    // Offers the newest autosave of a session that did not close cleanly.
    // True when a worksheet was recovered.
    bool offerRecovery();

    // The file changed on disk: checks now (the watcher calls this too) and
    // shows or hides the notice offering Reload.
    void checkDiskNow();
    bool diskNoticeShown() const { return !notice_->isHidden(); }
    void reloadFromDisk();
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
    void openDialog();
    bool saveAsDialog();
    Answer ask(Question q, const QString& text);
    QString describeDiskChange() const;
    void watchFile();
    void buildNotice();
    void exportReportDialog();
    void exportChartDialog(ChartKind kind);
    void exportDataDialog(bool csv);
    void compareDialog();
    bool finishExport(const Status& st, const QString& what, const QString& path);
    bool refuseWorksheetPath(const QString& path);
    QString exportStartPath(const QString& suffix) const;
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
    QLabel* statusTime_;
    QLabel* statusMessages_;
    QList<QAction*> unitActions_;
    bool interactive_ = true;
    Asker asker_;
    QString lastError_;
    QString lastQuestion_;
    QTimer autosaveTimer_;
    std::unique_ptr<AutosaveStore> autosave_;
    QFileSystemWatcher watcher_;
    QTimer diskCheck_;
    QFrame* notice_ = nullptr;
    QLabel* noticeText_ = nullptr;
    QPushButton* noticeReload_ = nullptr;
    QPushButton* noticeDismiss_ = nullptr;

};

}  // namespace heatchain::gui
