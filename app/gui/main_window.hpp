#pragma once
// The main window only wires: it builds the menus, toolbars and docks and
// connects them to the document and to the classes that do the work. The
// worksheet's life as a file (open, save, ask before discarding, disk watch,
// autosave and recovery) is FileSession's; exports are Exporter's; the
// revision comparison is RevisionCompare's. The public file and export calls
// below forward to them, so tests drive the window as a user would.
#include <QDockWidget>
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
#include "exporter.hpp"
#include "file_session.hpp"
#include "heatchain/report.hpp"
#include "questions.hpp"
#include "revision_compare.hpp"

#include "chain_view.hpp"
#include "chart_widget.hpp"
#include "document.hpp"
#include "contribution_widget.hpp"
#include "exergy_widget.hpp"
#include "second_law_panel.hpp"
#include "ledger_model.hpp"
#include "messages_panel.hpp"
#include "start_editor.hpp"
#include "step_editor.hpp"
#include "heat_recovery_view.hpp"
#include "stream_actions.hpp"

namespace heatchain::gui {

class CompareDialog;


class MainWindow : public QMainWindow {
    Q_OBJECT
public:
    explicit MainWindow(QWidget* parent = nullptr);
    // The views read the document until they go: they go first.
    ~MainWindow() override;

    ProjectDocument* document() { return &doc_; }
    ChainView* chain() const { return chain_; }
    StepEditor* editor() const { return editor_; }
    LedgerModel* ledger() const { return ledger_; }
    QTableView* ledgerView() const { return ledgerView_; }
    ChartWidget* tsChart() const { return ts_; }
    ChartWidget* tqChart() const { return tq_; }
    MessagesPanel* messages() const { return messages_; }
    ExergyWidget* exergyChart() const { return exergy_; }
    ContributionWidget* contributionChart() const { return contributions_; }
    SecondLawPanel* secondLaw() const { return secondLaw_; }
    QLineEdit* quickAdd() const { return quickAdd_; }
    StreamActions* streamActions() const { return streams_; }
    HeatRecoveryView* heatRecovery() const { return heatRecovery_; }
    QDockWidget* heatRecoveryDock() const { return heatRecoveryDock_; }

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
    void setAutosaveInterval(int ms);
    int autosaveInterval() const;
    void setAutosaveFolder(const QString& folder);
    AutosaveStore* autosaveStore() const;
    void autosaveNow();
    // Offers the newest autosave of a session that did not close cleanly.
    // True when a worksheet was recovered.
    bool offerRecovery();

    // The file changed on disk: checks now (the watcher calls this too) and
    // shows or hides the notice offering Reload.
    void checkDiskNow();
    bool diskNoticeShown() const;
    void reloadFromDisk();
    // Adds the step the quick-add text describes after the selected step.
    bool quickAddStep(const QString& text);
    void setDisplayUnits(UnitSystem u);
    // View ▸ Units ▸ Pressures as gauge: one undoable settings edit.
    void setGaugeDisplay(bool gauge);
    StartEditor* startEditor() const { return startEditor_; }
    // The folder File ▸ Open starts in: the last one a worksheet was opened
    // from or saved to.
    QString openDialogFolder() const;
    // Help ▸ Getting started, as text (the dialog shows it).
    static QString gettingStartedHtml();
    void copyLedger();

    // Restores the window layout and opens what the first start should show.
    void startUp(const QStringList& arguments);

protected:
    void closeEvent(QCloseEvent* e) override;

private:
    void buildActions();
    void buildDocks();
    void showGettingStarted();
    Answer ask(Question q, const QString& text);
    void editSettings();
    void editUtilities();
    void openSweep();
    void showAbout();
    void addStep(int index, StepKind kind);
    void removeSelected();
    void renameSelected();
    void duplicateSelected();
    void moveSelected(int delta);
    void updateTitle();
    void updateStatus();
    void reportError(const QString& title, const QString& text);

    ProjectDocument doc_;
    ChainView* chain_;
    StepEditor* editor_;
    StartEditor* startEditor_ = nullptr;
    QAction* gaugeAction_ = nullptr;
    LedgerModel* ledger_;
    QTableView* ledgerView_;
    ChartWidget* ts_;
    ChartWidget* tq_;
    MessagesPanel* messages_;
    ExergyWidget* exergy_ = nullptr;
    ContributionWidget* contributions_ = nullptr;
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
    FileSession* session_ = nullptr;
    Exporter* exporter_ = nullptr;
    RevisionCompare* compare_ = nullptr;
    StreamActions* streams_ = nullptr;
    HeatRecoveryView* heatRecovery_ = nullptr;
    QDockWidget* heatRecoveryDock_ = nullptr;

};

}  // namespace heatchain::gui
