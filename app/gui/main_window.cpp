#include "main_window.hpp"

#include <QAction>
#include <QActionGroup>
#include <QApplication>
#include <QClipboard>
#include <QCloseEvent>
#include <QDockWidget>
#include <QFile>
#include <QFileDialog>
#include <QFileInfo>
#include <QHeaderView>
#include <QMenuBar>
#include <QMessageBox>
#include <QScreen>
#include <QScrollArea>
#include <QSettings>
#include <QSplitter>
#include <QStatusBar>
#include <QToolBar>
#include <QToolButton>
#include <QVBoxLayout>

#include <QDateTime>
#include <QDir>
#include <QHBoxLayout>
#include <QLocale>

#include "commands.hpp"
#include "compare_dialog.hpp"
#include "heatchain/project_file.hpp"
#include "heatchain_qt/format.hpp"
#include "heatchain_qt/step_icons.hpp"
#include "project_edit.hpp"
#include "settings_dialog.hpp"
#include "sweep_dialog.hpp"
#include "utilities_dialog.hpp"

namespace heatchain::gui {

using namespace heatchain::view;

namespace {
constexpr int kMaxRecent = 8;
const char* kCaution =
    "Heatchain computes idealised process paths. Pressure equipment, steam, cryogens and hot "
    "surfaces are governed by local codes and licensed practice; have results checked by a "
    "qualified engineer.";
QString qs(const std::string& s) { return QString::fromStdString(s); }
QString qs(std::string_view s) { return QString::fromUtf8(s.data(), qsizetype(s.size())); }
}  // namespace

MainWindow::MainWindow(QWidget* parent) : QMainWindow(parent) {
    setWindowIcon(appIcon());
    setDockOptions(QMainWindow::AnimatedDocks | QMainWindow::AllowTabbedDocks);

    chain_ = new ChainView(&doc_, this);
    ledger_ = new LedgerModel(&doc_, this);
    ledgerView_ = new QTableView(this);
    ledgerView_->setModel(ledger_);
    ledgerView_->setSortingEnabled(false);  // sequence order is the process; see LedgerModel
    ledgerView_->setSelectionBehavior(QAbstractItemView::SelectRows);
    ledgerView_->setSelectionMode(QAbstractItemView::ExtendedSelection);
    ledgerView_->verticalHeader()->hide();
    ledgerView_->verticalHeader()->setDefaultSectionSize(20);
    ledgerView_->horizontalHeader()->setDefaultAlignment(Qt::AlignRight | Qt::AlignVCenter);
    ledgerView_->horizontalHeader()->setHighlightSections(false);
    ledgerView_->setAlternatingRowColors(true);
    ledgerView_->setWordWrap(false);
    ledgerView_->setShowGrid(false);
    ledgerView_->setStyleSheet(QStringLiteral(
        "QTableView { alternate-background-color: #f7f9fb; gridline-color: #e3e6ea; }"
        "QHeaderView::section { padding: 2px 6px; background: #eceff2; border: none; "
        "border-bottom: 1px solid #c9ced4; border-right: 1px solid #dde1e5; }"));
    // Column widths set once for the usual magnitudes (resizing to contents
    // on every edit would cost a scan of the whole ledger).
    ledgerView_->setColumnWidth(LedgerModel::ColStep, 150);
    ledgerView_->setColumnWidth(LedgerModel::ColWhat, 160);
    for (int c = LedgerModel::ColTin; c < LedgerModel::ColumnCount; ++c) ledgerView_->setColumnWidth(c, 82);
    ledgerView_->setColumnWidth(LedgerModel::ColPhase, 170);
    ledgerView_->setColumnWidth(LedgerModel::ColExd, 100);
    connect(ledgerView_->selectionModel(), &QItemSelectionModel::currentRowChanged, this,
            [this](const QModelIndex& current) {
                if (!current.isValid()) return;
                const int step = ledger_->data(current, LedgerModel::RowStepRole).toInt();
                if (step >= 0) doc_.setSelectedStep(step);
            });

    // The canvas with a notice strip above it (file changed on disk).
    auto* centre = new QWidget(this);
    auto* centreLayout = new QVBoxLayout(centre);
    centreLayout->setContentsMargins(0, 0, 0, 0);
    centreLayout->setSpacing(0);
    buildNotice();
    centreLayout->addWidget(notice_);
    centreLayout->addWidget(chain_, 1);
    setCentralWidget(centre);
    // The ledger is wide (14 columns): it gets the full width of the window
    // below the editor, canvas and charts.
    setCorner(Qt::BottomLeftCorner, Qt::BottomDockWidgetArea);
    setCorner(Qt::BottomRightCorner, Qt::BottomDockWidgetArea);

    buildDocks();
    buildActions();
    // Utilities and sweeps (issue 7): their own menu, before View.
    auto* process = new QMenu(tr("&Process"), this);
    process->addAction(tr("&Utilities and minimum approach…"), this, &MainWindow::editUtilities);
    process->addAction(tr("&Sweep an input…"), this, &MainWindow::openSweep);
    menuBar()->insertMenu(viewMenu_->menuAction(), process);

    statusSolve_ = new QLabel(this);
    // The solve time changes on every edit. A label whose width follows its
    // text would relayout the status bar, and with it repaint the whole
    // window, on each keystroke: a fixed size keeps the update to the label.
    statusTime_ = new QLabel(this);
    statusTime_->setFixedSize(statusTime_->fontMetrics().horizontalAdvance(tr("solved in 8888.88 ms")) + 8,
                              statusTime_->sizeHint().height());
    statusMessages_ = new QLabel(this);
    auto* caution = new QLabel(tr("Idealised paths — have results checked by a qualified engineer."), this);
    caution->setStyleSheet(QStringLiteral("color: #8a5a00;"));
    caution->setToolTip(tr(kCaution));
    statusBar()->addWidget(statusMessages_);
    statusBar()->addWidget(statusSolve_);
    statusBar()->addWidget(statusTime_);
    statusBar()->addPermanentWidget(caution);

    connect(&doc_, &ProjectDocument::changed, this, [this] {
        updateTitle();
        updateStatus();
    });
    connect(&doc_, &ProjectDocument::fileStateChanged, this, &MainWindow::updateTitle);
    connect(&doc_, &ProjectDocument::selectionChanged, this, [this](int step) {
        const int row = ledger_->rowOfStep(step);
        if (row >= 0 && ledgerView_->currentIndex().row() != row) {
            QSignalBlocker block(ledgerView_->selectionModel());
            ledgerView_->selectRow(row);
        }
    });
    connect(chain_, &ChainView::addRequested, this, &MainWindow::addStep);
    connect(chain_, &ChainView::removeRequested, this, [this](int i) {
        doc_.undoStack()->push(new RemoveStep(&doc_, i));
    });
    connect(chain_, &ChainView::duplicateRequested, this, [this](int i) {
        doc_.undoStack()->push(new DuplicateStep(&doc_, i));
    });
    connect(chain_, &ChainView::moveRequested, this, [this](int from, int to) {
        doc_.undoStack()->push(new MoveStep(&doc_, from, to));
    });
    connect(chain_, &ChainView::settingsRequested, this, &MainWindow::editSettings);
    connect(chain_, &ChainView::editorFocusRequested, this, [this] {
        if (auto* f = editor_->field(QStringLiteral("target")); f && f->isVisible())
            f->lineEdit()->setFocus();
        else editor_->field(QStringLiteral("id"))->lineEdit()->setFocus();
    });
    connect(&doc_, &ProjectDocument::fileStateChanged, this, &MainWindow::watchFile);

    // Autosave: a minute of work is the most a crash can take.
    autosave_ = std::make_unique<AutosaveStore>(AutosaveStore::defaultFolder());
    autosaveTimer_.setInterval(60 * 1000);
    connect(&autosaveTimer_, &QTimer::timeout, this, &MainWindow::autosaveNow);
    autosaveTimer_.start();

    // Someone else's change to the file: the watcher fires (often several
    // times for one save); look once things have settled.
    diskCheck_.setSingleShot(true);
    diskCheck_.setInterval(300);
    connect(&diskCheck_, &QTimer::timeout, this, &MainWindow::checkDiskNow);
    connect(&watcher_, &QFileSystemWatcher::fileChanged, this, [this] { diskCheck_.start(); });

    updateTitle();
    updateStatus();
    // First start: fill most of the screen; later starts restore the last layout.
    if (const QScreen* screen = QGuiApplication::primaryScreen()) {
        const QRect avail = screen->availableGeometry();
        resize(avail.size() * 0.96);
        move(avail.topLeft() + QPoint(avail.width() * 0.02, avail.height() * 0.01));
    } else {
        resize(1500, 920);
    }
}

void MainWindow::buildDocks() {
    editor_ = new StepEditor(&doc_, this);
    auto* editorScroll = new QScrollArea(this);
    editorScroll->setWidget(editor_);
    editorScroll->setWidgetResizable(true);
    editorScroll->setFrameShape(QFrame::NoFrame);
    auto* editorDock = new QDockWidget(tr("Step"), this);
    editorDock->setObjectName(QStringLiteral("stepDock"));
    editorDock->setWidget(editorScroll);
    editorDock->setMinimumWidth(430);
    addDockWidget(Qt::LeftDockWidgetArea, editorDock);

    ts_ = new ChartWidget(&doc_, ProcessChart::Kind::TemperatureEntropy, this);
    tq_ = new ChartWidget(&doc_, ProcessChart::Kind::TemperatureDuty, this);
    auto* charts = new QSplitter(Qt::Vertical, this);
    charts->addWidget(ts_);
    charts->addWidget(tq_);
    exergy_ = new ExergyWidget(&doc_, this);
    charts->addWidget(exergy_);
    charts->setStretchFactor(0, 3);
    charts->setStretchFactor(1, 3);
    charts->setStretchFactor(2, 2);
    auto* chartDock = new QDockWidget(tr("Charts"), this);
    chartDock->setObjectName(QStringLiteral("chartDock"));
    chartDock->setWidget(charts);
    chartDock->setMinimumWidth(380);
    addDockWidget(Qt::RightDockWidgetArea, chartDock);

    auto* ledgerDock = new QDockWidget(tr("Ledger"), this);
    ledgerDock->setObjectName(QStringLiteral("ledgerDock"));
    ledgerDock->setWidget(ledgerView_);
    addDockWidget(Qt::BottomDockWidgetArea, ledgerDock);

    messages_ = new MessagesPanel(&doc_, this);
    auto* msgDock = new QDockWidget(tr("Messages"), this);
    msgDock->setObjectName(QStringLiteral("messagesDock"));
    msgDock->setWidget(messages_);
    addDockWidget(Qt::BottomDockWidgetArea, msgDock);
    splitDockWidget(ledgerDock, msgDock, Qt::Vertical);
    connect(messages_, &MessagesPanel::countsChanged, msgDock, [msgDock](int e, int w) {
        msgDock->setWindowTitle(e + w == 0 ? tr("Messages") : tr("Messages — %1 error(s), %2 warning(s)").arg(e).arg(w));
    });
    resizeDocks({ledgerDock, msgDock}, {215, 64}, Qt::Vertical);
    // Utilities and the second law: a tab beside the ledger.
    secondLaw_ = new SecondLawPanel(&doc_, this);
    auto* secondLawDock = new QDockWidget(tr("Utilities and exergy"), this);
    secondLawDock->setObjectName(QStringLiteral("secondLawDock"));
    secondLawDock->setWidget(secondLaw_);
    tabifyDockWidget(ledgerDock, secondLawDock);
    ledgerDock->raise();
    resizeDocks({editorDock, chartDock}, {440, 520}, Qt::Horizontal);
    viewMenu_ = new QMenu(tr("&View"), this);
    viewMenu_->addAction(editorDock->toggleViewAction());
    viewMenu_->addAction(chartDock->toggleViewAction());
    viewMenu_->addAction(ledgerDock->toggleViewAction());
    viewMenu_->addAction(secondLawDock->toggleViewAction());
    viewMenu_->addAction(msgDock->toggleViewAction());
}

void MainWindow::buildActions() {
    QUndoStack* undo = doc_.undoStack();

    QMenu* file = menuBar()->addMenu(tr("&File"));
    QAction* actNew = file->addAction(tr("&New worksheet"), this, &MainWindow::newWorksheet);
    actNew->setShortcut(QKeySequence::New);
    QAction* actOpen = file->addAction(tr("&Open…"), this, &MainWindow::openDialog);
    actOpen->setShortcut(QKeySequence::Open);
    recentMenu_ = file->addMenu(tr("Open &recent"));
    connect(recentMenu_, &QMenu::aboutToShow, this, &MainWindow::fillRecentMenu);
    file->addSeparator();
    QAction* actSave = file->addAction(tr("&Save"), this, &MainWindow::save);
    actSave->setShortcut(QKeySequence::Save);
    QAction* actSaveAs = file->addAction(tr("Save &as…"), this, &MainWindow::saveAsDialog);
    actSaveAs->setShortcut(QKeySequence::SaveAs);
    file->addSeparator();
    file->addAction(tr("Co&mpare with…"), this, &MainWindow::compareDialog);
    QMenu* exp = file->addMenu(tr("&Export"));
    exp->addAction(tr("Step &report (PDF)…"), this, &MainWindow::exportReportDialog)
        ->setShortcut(QKeySequence(Qt::CTRL | Qt::Key_E));
    exp->addSeparator();
    exp->addAction(tr("&T–s chart (PNG or SVG)…"), this, [this] { exportChartDialog(ChartKind::TemperatureEntropy); });
    exp->addAction(tr("T–&Q chart (PNG or SVG)…"), this, [this] { exportChartDialog(ChartKind::TemperatureDuty); });
    exp->addSeparator();
    exp->addAction(tr("&Ledger as CSV…"), this, [this] { exportDataDialog(true); });
    exp->addAction(tr("Results as &JSON…"), this, [this] { exportDataDialog(false); });
    file->addSeparator();
    file->addAction(tr("Worksheet &settings…"), this, &MainWindow::editSettings)
        ->setShortcut(QKeySequence(Qt::CTRL | Qt::Key_Comma));
    file->addSeparator();
    file->addAction(tr("&Quit"), this, &QWidget::close)->setShortcut(QKeySequence::Quit);

    QMenu* edit = menuBar()->addMenu(tr("&Edit"));
    QAction* actUndo = undo->createUndoAction(this, tr("&Undo"));
    actUndo->setShortcut(QKeySequence::Undo);
    QAction* actRedo = undo->createRedoAction(this, tr("&Redo"));
    actRedo->setShortcut(QKeySequence::Redo);
    edit->addAction(actUndo);
    edit->addAction(actRedo);
    edit->addSeparator();
    QMenu* add = edit->addMenu(tr("&Add step after selection"));
    for (StepKind k : allStepKinds())
        add->addAction(stepIcon(k), stepKindTitle(k), this, [this, k] { addStep(doc_.selectedStep() + 1, k); });
    QAction* dup = edit->addAction(tr("D&uplicate step"), this, &MainWindow::duplicateSelected);
    dup->setShortcut(QKeySequence(Qt::CTRL | Qt::Key_D));
    QAction* del = edit->addAction(tr("&Delete step"), this, &MainWindow::removeSelected);
    del->setShortcut(QKeySequence(Qt::CTRL | Qt::Key_Delete));
    edit->addAction(tr("Move step &earlier"), this, [this] { moveSelected(-1); })
        ->setShortcut(QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_Left));
    edit->addAction(tr("Move step &later"), this, [this] { moveSelected(+1); })
        ->setShortcut(QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_Right));
    edit->addSeparator();
    QAction* copy = edit->addAction(tr("&Copy ledger as text"), this, &MainWindow::copyLedger);
    copy->setShortcut(QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_C));

    menuBar()->addMenu(viewMenu_);
    viewMenu_->addSeparator();
    QMenu* units = viewMenu_->addMenu(tr("&Units"));
    auto* group = new QActionGroup(this);
    for (UnitSystem u : {UnitSystem::SI, UnitSystem::MetricEngineering, UnitSystem::USCustomary}) {
        QAction* a = units->addAction(u == UnitSystem::SI ? tr("SI (K, kPa, kJ)")
                                      : u == UnitSystem::MetricEngineering ? tr("Metric engineering (°C, bar)")
                                                                           : tr("US customary (°F, psia)"));
        a->setCheckable(true);
        a->setData(int(u));
        group->addAction(a);
        unitActions_ << a;
        connect(a, &QAction::triggered, this, [this, u] { setDisplayUnits(u); });
    }
    viewMenu_->addSeparator();
    viewMenu_->addAction(tr("Zoom &in"), this, [this] { chain_->zoomBy(1.2); })->setShortcut(QKeySequence::ZoomIn);
    viewMenu_->addAction(tr("Zoom &out"), this, [this] { chain_->zoomBy(1 / 1.2); })->setShortcut(QKeySequence::ZoomOut);
    viewMenu_->addAction(tr("&Actual size"), this, [this] { chain_->resetZoom(); })
        ->setShortcut(QKeySequence(Qt::CTRL | Qt::Key_0));

    QMenu* help = menuBar()->addMenu(tr("&Help"));
    help->addAction(tr("&About Heatchain"), this, &MainWindow::showAbout);

    // Toolbar: file, undo, the step kinds, and the quick-add line.
    QToolBar* tb = addToolBar(tr("Worksheet"));
    tb->setObjectName(QStringLiteral("mainToolbar"));
    tb->setIconSize(QSize(22, 22));
    tb->setToolButtonStyle(Qt::ToolButtonTextOnly);
    tb->addAction(actNew);
    tb->addAction(actOpen);
    tb->addAction(actSave);
    tb->addSeparator();
    tb->addAction(actUndo);
    tb->addAction(actRedo);
    tb->addSeparator();
    QToolBar* steps = addToolBar(tr("Add step"));
    steps->setObjectName(QStringLiteral("stepToolbar"));
    steps->setIconSize(QSize(22, 22));
    for (StepKind k : allStepKinds()) {
        QAction* a = steps->addAction(stepIcon(k), stepKindTitle(k), this, [this, k] { addStep(doc_.selectedStep() + 1, k); });
        a->setToolTip(tr("Add a %1 step after the selected one").arg(stepKindTitle(k).toLower()));
    }
    steps->addSeparator();
    quickAdd_ = new QLineEdit(this);
    quickAdd_->setPlaceholderText(tr("quick add: heat to 180 degC source 240 degC"));
    quickAdd_->setClearButtonEnabled(true);
    quickAdd_->setMinimumWidth(300);
    quickAdd_->setToolTip(tr("Type a step and press Enter, e.g.\n"
                             "  heat to 180 degC source 240 degC\n"
                             "  boil\n  compress to 14 barg eff 0.72\n"
                             "  expand ratio 3 isentropic\n  cool to x 0.2 sink 30 degC"));
    steps->addWidget(quickAdd_);
    connect(quickAdd_, &QLineEdit::returnPressed, this, [this] {
        if (quickAddStep(quickAdd_->text())) quickAdd_->clear();
    });
}

void MainWindow::addStep(int index, StepKind kind) {
    index = std::clamp(index, 0, int(doc_.project().steps.size()));
    Step s = defaultStep(doc_.project(), doc_.result(), kind, index);
    doc_.undoStack()->push(new AddStep(&doc_, index, std::move(s)));
}

bool MainWindow::quickAddStep(const QString& text) {
    auto step = parseQuickAdd(text.toStdString(), doc_.project());
    if (!step) {
        quickAdd_->setStyleSheet(QStringLiteral("QLineEdit { border: 1px solid #b42318; background: #fdecea; }"));
        quickAdd_->setToolTip(qs(step.error().message));
        statusBar()->showMessage(tr("Not added: %1").arg(qs(step.error().message)), 8000);
        lastError_ = qs(step.error().message);
        return false;
    }
    quickAdd_->setStyleSheet({});
    Step s = std::move(step.value());
    const int index = doc_.selectedStep() + 1 > 0 ? doc_.selectedStep() + 1 : int(doc_.project().steps.size());
    // A quick-added step without a target takes the defaults of its kind.
    if (!s.hasTo && !isPhaseChangeKind(s.kind)) {
        Step d = defaultStep(doc_.project(), doc_.result(), s.kind, index);
        s.to = d.to;
        s.hasTo = d.hasTo;
    }
    doc_.undoStack()->push(new AddStep(&doc_, index, std::move(s)));
    return true;
}

void MainWindow::removeSelected() {
    const int i = doc_.selectedStep();
    if (i >= 0) doc_.undoStack()->push(new RemoveStep(&doc_, i));
}

void MainWindow::duplicateSelected() {
    const int i = doc_.selectedStep();
    if (i >= 0) doc_.undoStack()->push(new DuplicateStep(&doc_, i));
}

void MainWindow::moveSelected(int delta) {
    const int i = doc_.selectedStep();
    const int to = i + delta;
    if (i >= 0 && to >= 0 && to < int(doc_.project().steps.size()))
        doc_.undoStack()->push(new MoveStep(&doc_, i, to));
}

void MainWindow::setDisplayUnits(UnitSystem u) {
    if (doc_.project().displayUnits == u) return;
    Project p = doc_.project();
    p.displayUnits = u;
    doc_.undoStack()->push(new EditProjectSettings(&doc_, std::move(p), tr("Change display units")));
}

void MainWindow::copyLedger() {
    QApplication::clipboard()->setText(ledger_->toTabSeparated());
    statusBar()->showMessage(tr("Ledger copied as tab-separated text."), 4000);
}

void MainWindow::editUtilities() {
    UtilitiesDialog dlg(doc_.project(), this);
    if (dlg.exec() != QDialog::Accepted || !dlg.edited()) return;
    doc_.undoStack()->push(new EditProjectSettings(&doc_, *dlg.edited(), tr("Edit utilities")));
}

void MainWindow::openSweep() {
    // Sweeps a copy of the worksheet as it is now; the worksheet is not changed.
    auto* dlg = new SweepDialog(doc_.project(), doc_.selectedStep(), this);
    dlg->setAttribute(Qt::WA_DeleteOnClose);
    dlg->show();
}

void MainWindow::editSettings() {
    ProjectSettingsDialog dlg(doc_.project(), this);
    if (dlg.exec() != QDialog::Accepted || !dlg.edited()) return;
    doc_.undoStack()->push(new EditProjectSettings(&doc_, *dlg.edited(), tr("Edit worksheet settings")));
}

void MainWindow::reportError(const QString& title, const QString& text) {
    lastError_ = text;
    if (interactive_) QMessageBox::critical(this, title, text);
}

bool MainWindow::openFile(const QString& path) {
    auto st = doc_.open(path);
    if (!st) {
        reportError(tr("Cannot open worksheet"),
                    tr("%1 could not be opened. The current worksheet is unchanged.\n\n%2")
                        .arg(QFileInfo(path).fileName(), qs(st.error().text())));
        return false;
    }
    lastError_.clear();
    rememberRecent(path);
    return true;
}

bool MainWindow::saveFile(const QString& path) {
    auto st = doc_.saveAs(path);
    if (!st) {
        reportError(tr("Cannot save worksheet"),
                    tr("The worksheet was not saved; the file on disk is unchanged.\n\n%1").arg(qs(st.error().text())));
        return false;
    }
    rememberRecent(path);
    notice_->hide();
    watchFile();
    // Saved: nothing left to lose, so no autosave to recover from.
    autosave_->remove();
    statusBar()->showMessage(tr("Saved %1").arg(path), 4000);
    return true;
}

Answer MainWindow::ask(Question q, const QString& text) {
    lastQuestion_ = text;
    if (asker_) return asker_(q, text);
    if (!interactive_) {
        switch (q) {
        case Question::UnsavedChanges: return Answer::Discard;
        case Question::ChangedOnDisk: return Answer::Cancel;
        case Question::Recover: return Answer::Later;
        }
    }
    QMessageBox box(this);
    box.setIcon(q == Question::Recover ? QMessageBox::Information : QMessageBox::Warning);
    box.setText(text.section(QStringLiteral("\n\n"), 0, 0));
    box.setInformativeText(text.section(QStringLiteral("\n\n"), 1));
    QList<std::pair<QAbstractButton*, Answer>> buttons;
    auto add = [&](const QString& label, QMessageBox::ButtonRole role, Answer a) {
        buttons.append({box.addButton(label, role), a});
        return buttons.back().first;
    };
    switch (q) {
    case Question::UnsavedChanges:
        box.setWindowTitle(tr("Unsaved changes"));
        box.setDefaultButton(qobject_cast<QPushButton*>(add(tr("&Save"), QMessageBox::AcceptRole, Answer::Save)));
        add(tr("&Don't save"), QMessageBox::DestructiveRole, Answer::Discard);
        add(tr("Cancel"), QMessageBox::RejectRole, Answer::Cancel);
        break;
    case Question::ChangedOnDisk:
        box.setWindowTitle(tr("File changed on disk"));
        add(tr("&Overwrite"), QMessageBox::DestructiveRole, Answer::Overwrite);
        box.setDefaultButton(qobject_cast<QPushButton*>(add(tr("Save &as…"), QMessageBox::AcceptRole, Answer::SaveAs)));
        add(tr("Cancel"), QMessageBox::RejectRole, Answer::Cancel);
        break;
    case Question::Recover:
        box.setWindowTitle(tr("Recover worksheet"));
        box.setDefaultButton(qobject_cast<QPushButton*>(add(tr("&Recover"), QMessageBox::AcceptRole, Answer::Recover)));
        add(tr("&Discard"), QMessageBox::DestructiveRole, Answer::Discard);
        add(tr("&Later"), QMessageBox::RejectRole, Answer::Later);
        break;
    }
    box.exec();
    for (const auto& [button, answer] : buttons)
        if (box.clickedButton() == button) return answer;
    return q == Question::Recover ? Answer::Later : Answer::Cancel;
}

bool MainWindow::confirmDiscard() {
    if (!doc_.isModified()) return true;
    const QString name = doc_.filePath().isEmpty() ? tr("The new worksheet") : QStringLiteral("“%1”").arg(QFileInfo(doc_.filePath()).fileName());
    const Answer a = ask(Question::UnsavedChanges,
                         tr("%1 has changes that are not saved.\n\nSave them first? Without saving, the changes are lost.").arg(name));
    if (a == Answer::Save) return save();
    return a == Answer::Discard;
}

QString MainWindow::describeDiskChange() const {
    const QString path = doc_.filePath();
    const QString name = QFileInfo(path).fileName();
    const QFileInfo now(path);
    if (!now.exists())
        return tr("“%1” was removed or renamed since this worksheet last read or wrote it.\n\n%2").arg(name, path);
    const DiskStamp& was = doc_.diskStamp();
    const QLocale loc;
    return tr("“%1” was changed on disk by someone else since this worksheet last read or wrote it.\n\n"
              "Then: %2, %3 bytes\nNow:  %4, %5 bytes\n%6")
        .arg(name, loc.toString(was.modified, QLocale::ShortFormat), loc.toString(was.size),
             loc.toString(now.lastModified(), QLocale::ShortFormat), loc.toString(now.size()), path);
}

void MainWindow::newWorksheet() {
    if (!confirmDiscard()) return;
    auto p = newProject();
    if (!p) {
        reportError(tr("Cannot start a worksheet"), qs(p.error().text()));
        return;
    }
    doc_.reset(std::move(p.value()));
}

void MainWindow::openDialog() {
    if (!confirmDiscard()) return;
    const QString start = doc_.filePath().isEmpty() ? QStringLiteral(HEATCHAIN_SAMPLES_DIR) : QFileInfo(doc_.filePath()).path();
    const QString path = QFileDialog::getOpenFileName(this, tr("Open worksheet"), start,
                                                      tr("Heatchain worksheets (*.hchain);;All files (*)"));
    if (!path.isEmpty()) openFile(path);
}

bool MainWindow::save() {
    if (doc_.filePath().isEmpty()) return saveAsDialog();
    if (doc_.fileChangedOnDisk()) {
        // Never overwrite someone else's change without saying so.
        switch (ask(Question::ChangedOnDisk, describeDiskChange())) {
        case Answer::Overwrite: break;
        case Answer::SaveAs: return saveAsDialog();
        default: return false;
        }
    }
    return saveFile(doc_.filePath());
}

bool MainWindow::saveAsDialog() {
    QString path = QFileDialog::getSaveFileName(this, tr("Save worksheet as"), doc_.filePath(),
                                                tr("Heatchain worksheets (*.hchain)"));
    if (path.isEmpty()) return false;
    if (!path.endsWith(QStringLiteral(".hchain"))) path += QStringLiteral(".hchain");
    return saveFile(path);
}

void MainWindow::rememberRecent(const QString& path) {
    QSettings s;
    QStringList recent = s.value(QStringLiteral("recentFiles")).toStringList();
    const QString abs = QFileInfo(path).absoluteFilePath();
    recent.removeAll(abs);
    recent.prepend(abs);
    while (recent.size() > kMaxRecent) recent.removeLast();
    s.setValue(QStringLiteral("recentFiles"), recent);
}

void MainWindow::fillRecentMenu() {
    recentMenu_->clear();
    const QStringList recent = QSettings().value(QStringLiteral("recentFiles")).toStringList();
    for (const QString& path : recent) {
        QAction* a = recentMenu_->addAction(QFileInfo(path).fileName(), this, [this, path] {
            if (confirmDiscard()) openFile(path);
        });
        a->setToolTip(path);
        a->setEnabled(QFileInfo::exists(path));
    }
    if (recent.isEmpty()) recentMenu_->addAction(tr("(none yet)"))->setEnabled(false);
}

void MainWindow::updateTitle() {
    const Project& p = doc_.project();
    const QString file = doc_.filePath().isEmpty() ? tr("not saved") : QFileInfo(doc_.filePath()).fileName();
    setWindowTitle(QStringLiteral("%1 — %2[*] — Heatchain")
                       .arg(p.meta.title.empty() ? tr("Untitled worksheet") : qs(p.meta.title), file));
    setWindowModified(doc_.isModified());
    for (QAction* a : unitActions_) a->setChecked(UnitSystem(a->data().toInt()) == p.displayUnits);
}

void MainWindow::updateStatus() {
    const SequenceResult& r = doc_.result();
    const Project& p = doc_.project();
    const QString solveText = tr("%1 · %2 · %3 steps ·")
                                  .arg(qs(p.substance.name.empty() ? p.substanceId : p.substance.name),
                                       r.model ? qs(r.model->name()) : qs(modelId(p.model)))
                                  .arg(p.steps.size());
    if (statusSolve_->text() != solveText) statusSolve_->setText(solveText);
    statusTime_->setText(tr("solved in %1 ms").arg(QString::number(doc_.lastSolveMs(), 'f', 2)));
    const int e = messages_->errorCount(), w = messages_->warningCount();
    // (QLabel relayouts on every setText, even of the same text.)
    auto setMessages = [this](const QString& t) {
        if (statusMessages_->text() != t) statusMessages_->setText(t);
    };
    if (e > 0)
        setMessages(tr("<span style='color:#b42318'><b>%1 error(s)</b></span>, %2 warning(s)").arg(e).arg(w));
    else if (w > 0)
        setMessages(tr("<span style='color:#8a5a00'>%1 warning(s)</span>").arg(w));
    else
        setMessages(tr("<span style='color:#2e7d32'>no warnings</span>"));
}

void MainWindow::showAbout() {
    const SequenceResult& r = doc_.result();
    const Project& p = doc_.project();
    QString html = tr("<h3>Heatchain %1</h3><p>A worksheet for thermal processes: chain the steps a "
                      "material goes through and read the state after each step with Q, W, ΔH, ΔS, "
                      "S<sub>gen</sub> and exergy destroyed.</p>")
                       .arg(QApplication::applicationVersion());
    html += QStringLiteral("<p style='color:#8a5a00'><b>%1</b></p>").arg(tr(kCaution).toHtmlEscaped());
    if (r.model) {
        html += tr("<h4>Property model: %1</h4><p>%2</p><p><i>Range:</i> %3</p>")
                    .arg(qs(r.model->name()).toHtmlEscaped(),
                         qs(r.model->sourceText()).toHtmlEscaped().replace(QLatin1Char('\n'), QStringLiteral("<br>")),
                         qs(r.model->rangeText()).toHtmlEscaped());
    }
    html += tr("<h4>Substance data: %1</h4><ul>").arg(qs(p.substance.name).toHtmlEscaped());
    for (const SourceNote& n : p.substance.sources)
        html += QStringLiteral("<li><b>%1</b>: %2%3</li>")
                    .arg(qs(sourceFieldLabel(n.field)).toHtmlEscaped(), qs(n.text).toHtmlEscaped(),
                         n.confirmed ? QString() : tr(" (not independently confirmed)"));
    if (p.substance.sources.empty()) html += tr("<li>no sources recorded</li>");
    html += QStringLiteral("</ul>");
    QMessageBox box(this);
    box.setWindowTitle(tr("About Heatchain"));
    box.setIconPixmap(appIcon().pixmap(64, 64));
    box.setTextFormat(Qt::RichText);
    box.setText(html);
    box.exec();
}

void MainWindow::startUp(const QStringList& arguments) {
    QSettings s;
    restoreGeometry(s.value(QStringLiteral("window/geometry")).toByteArray());
    restoreState(s.value(QStringLiteral("window/state")).toByteArray());
    const bool first = !s.value(QStringLiteral("started")).toBool();
    s.setValue(QStringLiteral("started"), true);
    // Once the window is up, offer what a session that did not close
    // cleanly left behind (over whatever this start opens).
    if (!arguments.contains(QStringLiteral("--no-recovery")) && !arguments.contains(QStringLiteral("--quit-after-show")))
        QTimer::singleShot(0, this, &MainWindow::offerRecovery);
    // --compare=<file>: open the comparison with that revision once up.
    for (const QString& a : arguments) {
        if (a.startsWith(QStringLiteral("--compare="))) {
            const QString other = a.mid(10);
            QTimer::singleShot(0, this, [this, other] {
                if (CompareDialog* d = compareWith(other)) {
                    d->setAttribute(Qt::WA_DeleteOnClose);
                    d->show();
                }
            });
        }
    }
    for (const QString& a : arguments) {
        if (!a.startsWith(QLatin1Char('-'))) {
            openFile(a);
            return;
        }
    }
    if (!first) {
        const QStringList recent = s.value(QStringLiteral("recentFiles")).toStringList();
        if (!recent.isEmpty() && QFileInfo::exists(recent.front()) && openFile(recent.front())) return;
    }
    const QString sample = QStringLiteral(HEATCHAIN_SAMPLES_DIR "/melt-tank.hchain");
    if (QFileInfo::exists(sample)) openFile(sample);
}

void MainWindow::closeEvent(QCloseEvent* e) {
    if (!confirmDiscard()) {
        e->ignore();
        return;
    }
    QSettings s;
    s.setValue(QStringLiteral("window/geometry"), saveGeometry());
    s.setValue(QStringLiteral("window/state"), saveState());
    e->accept();
    // A clean close: this session's autosave has nothing left to protect.
    autosaveTimer_.stop();
    autosave_->remove();
}

// ---- notice strip: the file changed on disk --------------------------------

void MainWindow::buildNotice() {
    notice_ = new QFrame(this);
    notice_->setObjectName(QStringLiteral("diskNotice"));
    notice_->setStyleSheet(QStringLiteral(
        "#diskNotice { background: #fff6e0; border-bottom: 1px solid #e0c36a; }"
        "#diskNotice QLabel { color: #5c4300; }"));
    auto* row = new QHBoxLayout(notice_);
    row->setContentsMargins(10, 5, 8, 5);
    noticeText_ = new QLabel(notice_);
    noticeText_->setTextFormat(Qt::PlainText);
    noticeText_->setWordWrap(true);
    noticeReload_ = new QPushButton(tr("Reload"), notice_);
    auto* dismiss = noticeDismiss_ = new QPushButton(tr("Keep mine"), notice_);
    dismiss->setToolTip(tr("Hide this notice. Save will still ask before overwriting the other version."));
    row->addWidget(noticeText_, 1);
    row->addWidget(noticeReload_);
    row->addWidget(dismiss);
    connect(noticeReload_, &QPushButton::clicked, this, &MainWindow::reloadFromDisk);
    connect(dismiss, &QPushButton::clicked, notice_, &QWidget::hide);
    notice_->hide();
}

void MainWindow::watchFile() {
    const QString path = doc_.filePath();
    const QStringList watched = watcher_.files();
    // An atomic save by anyone (us included) replaces the file, and the
    // watch on the old one is gone: watch the path again.
    if (watched.size() == 1 && watched.front() == path && QFileInfo::exists(path)) return;
    if (!watched.isEmpty()) watcher_.removePaths(watched);
    if (!path.isEmpty() && QFileInfo::exists(path)) watcher_.addPath(path);
}

void MainWindow::checkDiskNow() {
    watchFile();
    if (!doc_.fileChangedOnDisk()) {
        notice_->hide();
        return;
    }
    const bool exists = QFileInfo::exists(doc_.filePath());
    const QString name = QFileInfo(doc_.filePath()).fileName();
    noticeText_->setText(exists ? tr("“%1” was changed on disk by another program. What you see here is your version; "
                                     "Save will ask before overwriting theirs.")
                                      .arg(name)
                                : tr("“%1” was removed or renamed on disk. Save writes it again.").arg(name));
    noticeReload_->setVisible(exists);
    noticeReload_->setText(doc_.isModified() ? tr("Reload (drop my edits)") : tr("Reload"));
    noticeDismiss_->setText(doc_.isModified() ? tr("Keep mine") : tr("Dismiss"));
    notice_->show();
}

void MainWindow::reloadFromDisk() {
    const QString path = doc_.filePath();
    if (path.isEmpty()) return;
    if (openFile(path)) {
        notice_->hide();
        statusBar()->showMessage(tr("Reloaded %1 from disk").arg(QFileInfo(path).fileName()), 4000);
    }
}

// ---- autosave and recovery --------------------------------------------------

void MainWindow::setAutosaveFolder(const QString& folder) {
    if (autosave_) autosave_->remove();
    autosave_ = std::make_unique<AutosaveStore>(folder);
}

void MainWindow::autosaveNow() {
    // A saved, unedited worksheet is safe in its file.
    if (!doc_.isModified() && !doc_.filePath().isEmpty()) {
        autosave_->remove();
        return;
    }
    // A blank new worksheet holds nothing to lose.
    if (!doc_.isModified() && doc_.project().steps.empty()) return;
    if (auto st = autosave_->write(doc_.project(), doc_.filePath()); !st)
        statusBar()->showMessage(tr("Autosave failed: %1").arg(qs(st.error().text())), 8000);
}

bool MainWindow::offerRecovery() {
    QList<AutosaveEntry> left = autosave_->orphans();
    // An autosave that says exactly what its file says holds nothing to
    // recover: drop it without a question.
    for (auto it = left.begin(); it != left.end();) {
        QFile sheet(it->worksheetFile);
        auto original = it->originalPath.isEmpty() ? Result<Project>(makeError("never saved"))
                                                   : loadProject(std::filesystem::path(it->originalPath.toStdString()));
        if (original && sheet.open(QIODevice::ReadOnly) &&
            sheet.readAll() == QByteArray::fromStdString(writeProject(original.value()))) {
            AutosaveStore::discard(*it);
            it = left.erase(it);
        } else {
            ++it;
        }
    }
    if (left.isEmpty()) return false;
    const AutosaveEntry& e = left.front();
    const QLocale loc;
    const qint64 minutes = e.saved.secsTo(QDateTime::currentDateTime()) / 60;
    const QString ago = minutes < 1 ? tr("less than a minute ago")
                        : minutes < 120 ? tr("%1 min ago").arg(minutes)
                        : minutes < 48 * 60 ? tr("%1 h ago").arg(minutes / 60)
                                            : tr("%1 days ago").arg(minutes / (24 * 60));
    QString text = tr("Heatchain did not close normally. A worksheet it autosaved can be recovered.\n\n");
    text += tr("“%1”\n").arg(e.title.isEmpty() ? tr("Untitled worksheet") : e.title);
    text += e.originalPath.isEmpty() ? tr("never saved to a file\n") : tr("from %1\n").arg(e.originalPath);
    text += tr("autosaved %1 (%2)\n").arg(loc.toString(e.saved, QLocale::ShortFormat), ago);
    const QFileInfo originalInfo(e.originalPath);
    if (!e.originalPath.isEmpty() && originalInfo.exists() && originalInfo.lastModified() > e.saved)
        text += tr("Note: the file was changed after this autosave (%1); saving the recovered worksheet would replace "
                   "that version.\n").arg(loc.toString(originalInfo.lastModified(), QLocale::ShortFormat));
    else if (!e.originalPath.isEmpty() && !originalInfo.exists())
        text += tr("Note: that file no longer exists.\n");
    text += QLatin1Char('\n');
    text += tr("Recover opens it with its changes not yet saved; Save writes to the original file only when you choose. "
               "Discard deletes the autosave. Later keeps it for the next start.");
    if (left.size() > 1) text += tr("\n\n%n more autosave(s) will be offered afterwards.", nullptr, int(left.size()) - 1);
    switch (ask(Question::Recover, text)) {
    case Answer::Recover: {
        if (!confirmDiscard()) return false;
        auto p = AutosaveStore::load(e);
        if (!p) {
            reportError(tr("Cannot recover worksheet"),
                        tr("The autosave could not be read; it is kept in %1.\n\n%2").arg(autosave_->folder(), qs(p.error().text())));
            return false;
        }
        doc_.reset(std::move(p.value()), e.originalPath);
        doc_.markModified();
        // Keep it safe under this session before the old copy goes.
        autosaveNow();
        AutosaveStore::discard(e);
        statusBar()->showMessage(tr("Recovered the worksheet autosaved %1 — not saved yet").arg(loc.toString(e.saved, QLocale::ShortFormat)), 8000);
        if (left.size() > 1) QTimer::singleShot(0, this, &MainWindow::offerRecovery);
        return true;
    }
    case Answer::Discard:
        AutosaveStore::discard(e);
        if (left.size() > 1) QTimer::singleShot(0, this, &MainWindow::offerRecovery);
        return false;
    default: return false;
    }
}

// ---- exports ------------------------------------------------------------------

QString MainWindow::exportStartPath(const QString& suffix) const {
    const QString path = doc_.filePath();
    if (path.isEmpty()) return QDir::home().filePath(QStringLiteral("worksheet") + suffix);
    const QFileInfo info(path);
    return info.dir().filePath(info.completeBaseName() + suffix);
}

bool MainWindow::refuseWorksheetPath(const QString& path) {
    const QFileInfo out(path);
    const bool own = !doc_.filePath().isEmpty() && out.absoluteFilePath() == QFileInfo(doc_.filePath()).absoluteFilePath();
    if (own || out.suffix().compare(QStringLiteral("hchain"), Qt::CaseInsensitive) == 0) {
        reportError(tr("Cannot export"), tr("%1 is a worksheet file; an export never writes over a worksheet.").arg(path));
        return true;
    }
    return false;
}

bool MainWindow::finishExport(const Status& st, const QString& what, const QString& path) {
    if (!st) {
        reportError(tr("Cannot export %1").arg(what),
                    tr("Nothing was written to %1; the worksheet is unchanged.\n\n%2").arg(path, qs(st.error().text())));
        return false;
    }
    lastError_.clear();
    statusBar()->showMessage(tr("Exported %1 to %2").arg(what, path), 6000);
    return true;
}

bool MainWindow::exportReport(const QString& path, PageSize pageSize) {
    if (refuseWorksheetPath(path)) return false;
    // The report checksums the worksheet file. With unsaved edits (or a file
    // someone else changed) that file is not what the report shows, so the
    // report checksums the worksheet as it would be saved instead.
    const bool fileMatches = !doc_.filePath().isEmpty() && !doc_.isModified() && !doc_.fileChangedOnDisk();
    const std::string file = fileMatches ? doc_.filePath().toStdString() : std::string();
    const bool ok = finishExport(writeReportPdf(doc_.project(), doc_.result(), file, path.toStdString(), ReportOptions{pageSize}),
                                 tr("the step report"), path);
    if (ok && !fileMatches && !doc_.filePath().isEmpty())
        statusBar()->showMessage(tr("Exported the step report to %1. The worksheet differs from its file, so the report "
                                    "carries the checksum of what you see, not of the file.").arg(path), 10000);
    return ok;
}

bool MainWindow::exportChartImage(const QString& path, ChartKind kind) {
    if (refuseWorksheetPath(path)) return false;
    return finishExport(exportChart(doc_.project(), doc_.result(), kind, path.toStdString()),
                        kind == ChartKind::TemperatureEntropy ? tr("the T–s chart") : tr("the T–Q chart"), path);
}

bool MainWindow::exportLedger(const QString& path) {
    if (refuseWorksheetPath(path)) return false;
    return finishExport(exportLedgerCsv(doc_.project(), doc_.result(), path.toStdString()), tr("the ledger"), path);
}

bool MainWindow::exportResults(const QString& path) {
    if (refuseWorksheetPath(path)) return false;
    return finishExport(exportResultsJson(doc_.project(), doc_.result(), path.toStdString()), tr("the results"), path);
}

void MainWindow::exportReportDialog() {
    const QString a4 = tr("PDF report, A4 (*.pdf)"), letter = tr("PDF report, US Letter (*.pdf)");
    QString filter = doc_.project().displayUnits == UnitSystem::USCustomary ? letter : a4;
    QString path = QFileDialog::getSaveFileName(this, tr("Export step report"), exportStartPath(QStringLiteral("-report.pdf")),
                                                a4 + QStringLiteral(";;") + letter, &filter);
    if (path.isEmpty()) return;
    if (QFileInfo(path).suffix().isEmpty()) path += QStringLiteral(".pdf");
    exportReport(path, filter == letter ? PageSize::Letter : PageSize::A4);
}

void MainWindow::exportChartDialog(ChartKind kind) {
    const QString png = tr("PNG image (*.png)"), svg = tr("SVG drawing (*.svg)");
    QString filter = png;
    const QString suffix = kind == ChartKind::TemperatureEntropy ? QStringLiteral("-Ts.png") : QStringLiteral("-TQ.png");
    QString path = QFileDialog::getSaveFileName(this, kind == ChartKind::TemperatureEntropy ? tr("Export T–s chart") : tr("Export T–Q chart"),
                                                exportStartPath(suffix), png + QStringLiteral(";;") + svg, &filter);
    if (path.isEmpty()) return;
    const QString ext = QFileInfo(path).suffix().toLower();
    if (ext != QStringLiteral("png") && ext != QStringLiteral("svg"))
        path += filter == svg ? QStringLiteral(".svg") : QStringLiteral(".png");
    exportChartImage(path, kind);
}

void MainWindow::exportDataDialog(bool csv) {
    const QString suffix = csv ? QStringLiteral("-ledger.csv") : QStringLiteral("-results.json");
    QString path = QFileDialog::getSaveFileName(this, csv ? tr("Export ledger") : tr("Export results"), exportStartPath(suffix),
                                                csv ? tr("CSV table (*.csv)") : tr("JSON (*.json)"));
    if (path.isEmpty()) return;
    if (QFileInfo(path).suffix().isEmpty()) path += csv ? QStringLiteral(".csv") : QStringLiteral(".json");
    if (csv) exportLedger(path);
    else exportResults(path);
}

// ---- compare ------------------------------------------------------------------

CompareDialog* MainWindow::compareWith(const QString& path) {
    auto other = loadProject(std::filesystem::path(path.toStdString()));
    if (!other) {
        reportError(tr("Cannot compare"), tr("%1 could not be read.\n\n%2").arg(QFileInfo(path).fileName(), qs(other.error().text())));
        return nullptr;
    }
    lastError_.clear();
    SequenceResult otherResult = solve(other.value());
    QString mine = doc_.filePath().isEmpty() ? tr("this worksheet (not saved)")
                                             : tr("this worksheet, %1").arg(QFileInfo(doc_.filePath()).fileName());
    if (doc_.isModified() && !doc_.filePath().isEmpty()) mine += tr(" with unsaved changes");
    return new CompareDialog(Revision{std::move(other.value()), std::move(otherResult), QFileInfo(path).fileName()},
                             Revision{doc_.project(), doc_.result(), mine}, this);
}

void MainWindow::compareDialog() {
    const QString start = doc_.filePath().isEmpty() ? QStringLiteral(HEATCHAIN_SAMPLES_DIR) : QFileInfo(doc_.filePath()).path();
    const QString path = QFileDialog::getOpenFileName(this, tr("Compare with worksheet"), start,
                                                      tr("Heatchain worksheets (*.hchain);;All files (*)"));
    if (path.isEmpty()) return;
    if (CompareDialog* d = compareWith(path)) {
        d->setAttribute(Qt::WA_DeleteOnClose);
        d->show();
    }
}

}  // namespace heatchain::gui
