#include "main_window.hpp"

#include <QAction>
#include <QActionGroup>
#include <QApplication>
#include <QClipboard>
#include <QCloseEvent>
#include <QDockWidget>
#include <QFile>
#include <QFileInfo>
#include <QHeaderView>
#include <QKeyEvent>
#include <QMenuBar>
#include <QMessageBox>
#include <QScreen>
#include <QScrollArea>
#include <QSettings>
#include <QSplitter>
#include <QStatusBar>
#include <QTabBar>
#include <QTabWidget>
#include <QToolBar>
#include <QToolButton>
#include <QVBoxLayout>
#include <memory>
#include <optional>

#include <QDateTime>
#include <QDir>
#include <QHBoxLayout>
#include <QLocale>

#include "commands.hpp"
#include "time_chart_widget.hpp"
#include "compare_dialog.hpp"
#include "contribution_widget.hpp"
#include "heatchain/project_file.hpp"
#include "heatchain_view/format.hpp"
#include "heatchain_view/step_icons.hpp"
#include "help_text.hpp"
#include "project_edit.hpp"
#include "settings_dialog.hpp"
#include "sweep_dialog.hpp"
#include "utilities_dialog.hpp"

namespace heatchain::gui {

namespace {
// Text fields bind Ctrl+E to "end of line" on X11, so with the cursor in the
// quick-add line (where it stays after adding a step) or in a step-panel
// field, File ▸ Export ▸ Report never fired. The window's own shortcuts that
// a text field would otherwise swallow are left to the window.
class WindowShortcutsOverTextFields : public QObject {
public:
    using QObject::QObject;
    bool eventFilter(QObject* watched, QEvent* e) override {
        if (e->type() == QEvent::ShortcutOverride && watched->inherits("QLineEdit")) {
            const auto* k = static_cast<QKeyEvent*>(e);
            if (k->modifiers() == Qt::ControlModifier && k->key() == Qt::Key_E) return true;  // not accepted: the shortcut fires
        }
        return QObject::eventFilter(watched, e);
    }
};
}  // namespace

using namespace heatchain::view;

namespace {
using heatchain::view::qs;

}  // namespace

MainWindow::MainWindow(QWidget* parent) : QMainWindow(parent) {
    setWindowIcon(appIcon());
    setDockOptions(QMainWindow::AnimatedDocks | QMainWindow::AllowTabbedDocks);

    chain_ = new ChainView(&doc_, this);
    ledger_ = new LedgerModel(&doc_, this);
    ledgerView_ = new QTableView(this);
    ledgerView_->setObjectName(QStringLiteral("ledger"));
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
    ledgerView_->setColumnWidth(LedgerModel::ColExd, 124);
    // The ± columns show while the worksheet has tolerances and View ▸
    // Uncertainty is on.
    auto showUncertaintyColumns = [this] {
        for (int c : {int(LedgerModel::ColUTout), int(LedgerModel::ColUQ), int(LedgerModel::ColUW)})
            ledgerView_->setColumnHidden(c, !ledger_->showsUncertainty());
    };
    connect(&doc_, &ProjectDocument::changed, this, showUncertaintyColumns);
    showUncertaintyColumns();
    // Area and time show while some step has an exchanger or a batch time,
    // right after the phase: they are what a sized or timed step is for, and
    // at the end of sixteen columns they would sit past the window's edge.
    {
        QHeaderView* header = ledgerView_->horizontalHeader();
        const int after = header->visualIndex(LedgerModel::ColPhase);
        header->moveSection(header->visualIndex(LedgerModel::ColArea), after + 1);
        header->moveSection(header->visualIndex(LedgerModel::ColTime), after + 2);
    }
    auto showTransferColumns = [this] {
        ledgerView_->setColumnHidden(LedgerModel::ColArea, !ledger_->showsArea());
        ledgerView_->setColumnHidden(LedgerModel::ColTime, !ledger_->showsTime());
    };
    connect(&doc_, &ProjectDocument::changed, this, showTransferColumns);
    connect(ledger_, &QAbstractItemModel::modelReset, this, showTransferColumns);  // all streams on or off
    showTransferColumns();
    // A click on "▸ n parts" opens a step's segments, another folds them.
    connect(ledgerView_, &QTableView::clicked, this, [this](const QModelIndex& index) {
        if (index.column() != LedgerModel::ColWhat) return;
        const int step = ledger_->data(index, LedgerModel::RowStepRole).toInt();
        const int stream = ledger_->data(index, LedgerModel::RowStreamRole).toInt();
        if (ledger_->data(index, LedgerModel::RowKindRole).toInt() != int(LedgerModel::RowKind::Step)) return;
        if (ledger_->hasSegments(step, stream))
            ledger_->setSegmentsShown(step, !ledger_->segmentsShown(step, stream), stream);
    });
    // A row of another stream (the ledger of all streams) makes that stream
    // current, with the step selected.
    connect(ledgerView_->selectionModel(), &QItemSelectionModel::currentRowChanged, this,
            [this](const QModelIndex& current) {
                if (!current.isValid()) return;
                const int step = ledger_->data(current, LedgerModel::RowStepRole).toInt();
                const int stream = ledger_->data(current, LedgerModel::RowStreamRole).toInt();
                if (stream != doc_.currentStream()) doc_.setCurrentStream(stream, step);
                else if (step >= 0) doc_.setSelectedStep(step);
            });

    // The canvas with a notice strip above it (file changed on disk).
    auto* centre = new QWidget(this);
    auto* centreLayout = new QVBoxLayout(centre);
    centreLayout->setContentsMargins(0, 0, 0, 0);
    centreLayout->setSpacing(0);
    auto* diskNotice = new DiskWatch(&doc_, centre);
    centreLayout->addWidget(diskNotice);
    centreLayout->addWidget(chain_, 1);
    setCentralWidget(centre);
    // The ledger is wide (14 columns): it gets the full width of the window
    // below the editor, canvas and charts.
    setCorner(Qt::BottomLeftCorner, Qt::BottomDockWidgetArea);
    setCorner(Qt::BottomRightCorner, Qt::BottomDockWidgetArea);

    // The helpers ask through the window and report through it.
    WindowHooks hooks{[this](Question q, const QString& t) { return ask(q, t); },
                      [this] { return confirmDiscard(); },
                      [this](const QString& title, const QString& text) { reportError(title, text); },
                      [this](const QString& text, int ms) { statusBar()->showMessage(text, ms); },
                      [this] { lastError_.clear(); }};
    session_ = new FileSession(&doc_, diskNotice, hooks, this);
    exporter_ = new Exporter(&doc_, this, hooks);
    compare_ = new RevisionCompare(&doc_, this, hooks);
    // Several streams: what the worksheet is for is their heat recovery.
    connect(session_, &FileSession::opened, this, [this] {
        if (doc_.streamCount() > 1) heatRecoveryDock_->raise();
    });

    buildDocks();
    buildActions();
    // Utilities and sweeps: their own menu, before View.
    auto* process = new QMenu(tr("&Process"), this);
    process->addAction(tr("&Utilities and required minimum approach…"), this, &MainWindow::editUtilities);
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
    caution->setToolTip(help::caution());
    statusBar()->addWidget(statusMessages_);
    statusBar()->addWidget(statusSolve_);
    statusBar()->addWidget(statusTime_);
    statusBar()->addPermanentWidget(caution);
    // A passing message (saved, not added, …) takes the place of the
    // standing ones instead of being written over them.
    connect(statusBar(), &QStatusBar::messageChanged, this, [this](const QString& m) {
        for (QLabel* l : {statusMessages_, statusSolve_, statusTime_}) l->setVisible(m.isEmpty());
    });

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
    // Streams: the lane menu and the card's "Copy to stream", and a menu of their own.
    streams_ = new StreamActions(&doc_, this);
    connect(streams_, &StreamActions::refused, this, [this](const QString& why) { statusBar()->showMessage(why, 8000); });
    connect(chain_, &ChainView::addStreamRequested, streams_, &StreamActions::addStreamDialog);
    connect(chain_, &ChainView::removeStreamRequested, streams_, &StreamActions::removeStream);
    connect(chain_, &ChainView::renameStreamRequested, streams_, &StreamActions::renameStreamDialog);
    connect(chain_, &ChainView::moveStreamRequested, streams_, &StreamActions::moveStream);
    connect(chain_, &ChainView::copyStepRequested, streams_, &StreamActions::copyStep);
    auto* streamMenu = new QMenu(tr("S&treams"), this);
    connect(streamMenu, &QMenu::aboutToShow, streams_, [this, streamMenu] { streams_->fillMenu(streamMenu); });
    streams_->fillMenu(streamMenu);
    menuBar()->insertMenu(viewMenu_->menuAction(), streamMenu);
    connect(chain_, &ChainView::editorFocusRequested, this, [this] {
        if (auto* f = editor_->field(QStringLiteral("target")); f && f->isVisible())
            f->lineEdit()->setFocus();
        else editor_->field(QStringLiteral("id"))->lineEdit()->setFocus();
    });

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

MainWindow::~MainWindow() {
    hide();
    qDeleteAll(findChildren<QDockWidget*>(Qt::FindDirectChildrenOnly));
    delete takeCentralWidget();
}

void MainWindow::buildDocks() {
    // The step panel edits the selected card: the Start card (no step
    // selected) or a step.
    auto* panel = new QWidget(this);
    auto* panelLayout = new QVBoxLayout(panel);
    panelLayout->setContentsMargins(0, 0, 0, 0);
    startEditor_ = new StartEditor(&doc_, panel);
    editor_ = new StepEditor(&doc_, panel);
    panelLayout->addWidget(startEditor_);
    panelLayout->addWidget(editor_, 1);
    auto showPanel = [this] {
        const bool start = doc_.selectedStep() < 0;
        startEditor_->setVisible(start);
        editor_->setVisible(!start);
    };
    connect(&doc_, &ProjectDocument::selectionChanged, this, showPanel);
    connect(&doc_, &ProjectDocument::changed, this, showPanel);
    showPanel();
    connect(startEditor_, &StartEditor::rejected, this, [this](const QString& what) {
        statusBar()->showMessage(what, 10000);
    });
    connect(editor_, &StepEditor::rejected, this, [this](const QString& what) {
        statusBar()->showMessage(what, 10000);
    });
    auto* editorScroll = new QScrollArea(this);
    editorScroll->setWidget(panel);
    editorScroll->setWidgetResizable(true);
    editorScroll->setFrameShape(QFrame::NoFrame);
    // The panel follows the dock's width (its texts wrap); it scrolls only
    // up and down.
    editorScroll->setHorizontalScrollBarPolicy(Qt::ScrollBarAlwaysOff);
    auto* editorDock = new QDockWidget(tr("Step panel"), this);
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
    // The exergy bars and, for a batch, the time chart share the third
    // place as two tabs: four charts stacked would leave each too short to
    // read and squeeze the ledger below them. A worksheet that becomes a
    // batch opens on its time chart; steady flow has no times and no tab.
    auto* lower = new QTabWidget(this);
    lower->setObjectName(QStringLiteral("lowerCharts"));
    lower->setDocumentMode(true);
    lower->addTab(exergy_, tr("Exergy destroyed"));
    auto* timeChart = new TimeChartWidget(&doc_, this);
    const int timeTab = lower->addTab(timeChart, tr("Time"));
    auto showTimeTab = [this, lower, timeTab, closed = std::make_shared<std::optional<bool>>()] {
        const bool batch = doc_.project().system == SystemKind::Closed;
        if (*closed == batch) return;
        *closed = batch;
        lower->setTabVisible(timeTab, batch);
        lower->tabBar()->setVisible(batch);  // one tab needs no bar
        lower->setCurrentIndex(batch ? timeTab : 0);
    };
    connect(&doc_, &ProjectDocument::changed, lower, showTimeTab);
    showTimeTab();
    charts->addWidget(lower);
    charts->setStretchFactor(0, 3);
    charts->setStretchFactor(1, 3);
    charts->setStretchFactor(2, 4);
    auto* chartDock = new QDockWidget(tr("Charts"), this);
    chartDock->setObjectName(QStringLiteral("chartDock"));
    chartDock->setWidget(charts);
    chartDock->setMinimumWidth(380);
    addDockWidget(Qt::RightDockWidgetArea, chartDock);

    // Heat recovery: a tab beside the charts (raised when a worksheet of
    // several streams is opened).
    heatRecovery_ = new HeatRecoveryView(&doc_, this);
    heatRecoveryDock_ = new QDockWidget(tr("Heat recovery"), this);
    heatRecoveryDock_->setObjectName(QStringLiteral("heatRecoveryDock"));
    heatRecoveryDock_->setWidget(heatRecovery_);
    tabifyDockWidget(chartDock, heatRecoveryDock_);
    // The charts in front (raised again once the window is shown: before
    // that, the tab last added stays current). Hidden, the heat recovery
    // view computes nothing on an edit.
    chartDock->raise();
    QTimer::singleShot(0, chartDock, [this, chartDock] {
        if (doc_.streamCount() < 2) chartDock->raise();
    });

    auto* ledgerDock = new QDockWidget(tr("Ledger"), this);
    ledgerDock->setObjectName(QStringLiteral("ledgerDock"));
    ledgerDock->setWidget(ledgerView_);
    addDockWidget(Qt::BottomDockWidgetArea, ledgerDock);

    // The messages panel, with one filter button per level above it.
    auto* msgBox = new QWidget(this);
    auto* msgLayout = new QVBoxLayout(msgBox);
    msgLayout->setContentsMargins(0, 0, 0, 0);
    msgLayout->setSpacing(0);
    auto* filters = new QHBoxLayout;
    filters->setContentsMargins(4, 2, 4, 2);
    messages_ = new MessagesPanel(&doc_, msgBox);
    std::vector<std::pair<MessagesPanel::Level, QToolButton*>> levelButtons;
    for (auto level : {MessagesPanel::Level::Error, MessagesPanel::Level::Warning, MessagesPanel::Level::Note,
                       MessagesPanel::Level::Caution}) {
        auto* b = new QToolButton(msgBox);
        b->setCheckable(true);
        b->setChecked(true);
        b->setAutoRaise(true);
        b->setObjectName(QStringLiteral("filter-%1").arg(MessagesPanel::levelName(level)));
        b->setToolTip(tr("Show or hide the %1s").arg(MessagesPanel::levelName(level)));
        connect(b, &QToolButton::toggled, messages_, [this, level](bool on) { messages_->setLevelShown(level, on); });
        filters->addWidget(b);
        levelButtons.emplace_back(level, b);
    }
    filters->addStretch(1);
    msgLayout->addLayout(filters);
    msgLayout->addWidget(messages_, 1);
    auto* msgDock = new QDockWidget(tr("Messages"), this);
    msgDock->setObjectName(QStringLiteral("messagesDock"));
    msgDock->setWidget(msgBox);
    addDockWidget(Qt::BottomDockWidgetArea, msgDock);
    splitDockWidget(ledgerDock, msgDock, Qt::Vertical);
    auto countLabels = [this, msgDock, levelButtons] {
        static const char* const names[] = {QT_TR_NOOP("Errors"), QT_TR_NOOP("Warnings"), QT_TR_NOOP("Notes"),
                                            QT_TR_NOOP("Cautions")};
        for (const auto& [level, button] : levelButtons)
            button->setText(QStringLiteral("%1 %2").arg(tr(names[int(level)])).arg(messages_->count(level)));
        const int e = messages_->errorCount(), w = messages_->warningCount(), n = messages_->noteCount();
        msgDock->setWindowTitle(e + w + n == 0 ? tr("Messages")
                                               : tr("Messages — %1 error(s), %2 warning(s), %3 note(s)").arg(e).arg(w).arg(n));
    };
    connect(messages_, &MessagesPanel::countsChanged, msgDock, countLabels);
    countLabels();
    resizeDocks({ledgerDock, msgDock}, {300, 90}, Qt::Vertical);
    // Utilities and the second law: a tab beside the ledger.
    secondLaw_ = new SecondLawPanel(&doc_, this);
    auto* secondLawDock = new QDockWidget(tr("Utilities and exergy"), this);
    secondLawDock->setObjectName(QStringLiteral("secondLawDock"));
    secondLawDock->setWidget(secondLaw_);
    tabifyDockWidget(ledgerDock, secondLawDock);
    // Which input drives the uncertainty: a third tab.
    contributions_ = new ContributionWidget(&doc_, this);
    auto* uncertaintyDock = new QDockWidget(tr("Uncertainty"), this);
    uncertaintyDock->setObjectName(QStringLiteral("uncertaintyDock"));
    uncertaintyDock->setWidget(contributions_);
    tabifyDockWidget(secondLawDock, uncertaintyDock);
    ledgerDock->raise();
    resizeDocks({editorDock, chartDock}, {440, 640}, Qt::Horizontal);
    viewMenu_ = new QMenu(tr("&View"), this);
    viewMenu_->addAction(editorDock->toggleViewAction());
    viewMenu_->addAction(chartDock->toggleViewAction());
    viewMenu_->addAction(heatRecoveryDock_->toggleViewAction());
    viewMenu_->addAction(ledgerDock->toggleViewAction());
    viewMenu_->addAction(secondLawDock->toggleViewAction());
    viewMenu_->addAction(msgDock->toggleViewAction());
}

void MainWindow::buildActions() {
    QUndoStack* undo = doc_.undoStack();

    QMenu* file = menuBar()->addMenu(tr("&File"));
    QAction* actNew = file->addAction(tr("&New worksheet"), this, &MainWindow::newWorksheet);
    actNew->setShortcut(QKeySequence::New);
    QAction* actOpen = file->addAction(tr("&Open…"), session_, &FileSession::openDialog);
    actOpen->setShortcut(QKeySequence::Open);
    recentMenu_ = file->addMenu(tr("Open &recent"));
    connect(recentMenu_, &QMenu::aboutToShow, session_, [this] { session_->fillRecentMenu(recentMenu_); });
    file->addSeparator();
    QAction* actSave = file->addAction(tr("&Save"), this, &MainWindow::save);
    actSave->setShortcut(QKeySequence::Save);
    QAction* actSaveAs = file->addAction(tr("Save &as…"), session_, &FileSession::saveAsDialog);
    // QKeySequence::SaveAs is empty on some desktops: name the keys.
    actSaveAs->setShortcut(QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_S));
    file->addSeparator();
    file->addAction(tr("Co&mpare with…"), compare_, &RevisionCompare::chooseAndShow);
    exporter_->fillMenu(file->addMenu(tr("&Export")));
    file->addSeparator();
    file->addAction(tr("Worksheet &settings…"), this, &MainWindow::editSettings)
        ->setShortcut(QKeySequence(Qt::CTRL | Qt::Key_Comma));
    file->addSeparator();
    file->addAction(tr("&Quit"), this, &QWidget::close)->setShortcut(QKeySequence::Quit);

    QMenu* edit = menuBar()->addMenu(tr("&Edit"));
    // Undo and Redo keep a fixed text, so nothing on the toolbar moves after
    // an edit; what they would undo or redo is in the tooltip (and the menu's
    // status tip).
    QAction* actUndo = new QAction(tr("&Undo"), this);
    actUndo->setObjectName(QStringLiteral("undoAction"));
    actUndo->setShortcut(QKeySequence::Undo);
    QAction* actRedo = new QAction(tr("&Redo"), this);
    actRedo->setObjectName(QStringLiteral("redoAction"));
    {
        QList<QKeySequence> redoKeys = QKeySequence::keyBindings(QKeySequence::Redo);
        const QKeySequence ctrlY(Qt::CTRL | Qt::Key_Y);
        if (!redoKeys.contains(ctrlY)) redoKeys.prepend(ctrlY);
        actRedo->setShortcuts(redoKeys);
    }
    connect(actUndo, &QAction::triggered, undo, &QUndoStack::undo);
    connect(actRedo, &QAction::triggered, undo, &QUndoStack::redo);
    auto syncUndo = [undo, actUndo, actRedo] {
        actUndo->setEnabled(undo->canUndo());
        actRedo->setEnabled(undo->canRedo());
        const QString u = undo->undoText(), r = undo->redoText();
        actUndo->setToolTip(u.isEmpty() ? tr("Nothing to undo") : tr("Undo: %1").arg(u));
        actRedo->setToolTip(r.isEmpty() ? tr("Nothing to redo") : tr("Redo: %1").arg(r));
        actUndo->setStatusTip(actUndo->toolTip());
        actRedo->setStatusTip(actRedo->toolTip());
    };
    connect(undo, &QUndoStack::indexChanged, this, syncUndo);
    connect(undo, &QUndoStack::cleanChanged, this, syncUndo);
    connect(undo, &QUndoStack::canUndoChanged, this, syncUndo);
    connect(undo, &QUndoStack::canRedoChanged, this, syncUndo);
    syncUndo();
    edit->addAction(actUndo);
    edit->addAction(actRedo);
    edit->addSeparator();
    QMenu* add = edit->addMenu(tr("&Add step after selection"));
    for (StepKind k : allStepKinds())
        add->addAction(stepIcon(k), stepKindTitle(k), this, [this, k] { addStep(doc_.selectedStep() + 1, k); });
    QAction* rename = edit->addAction(tr("Re&name step"), this, &MainWindow::renameSelected);
    rename->setShortcut(QKeySequence(Qt::Key_F2));
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
    units->addSeparator();
    gaugeAction_ = units->addAction(tr("Pressures as &gauge"));
    gaugeAction_->setCheckable(true);
    gaugeAction_->setToolTip(tr("Show pressures above the worksheet's atmosphere (bar(g), kPa(g), psig) instead "
                                "of absolute (bar(a), kPa(a), psia)"));
    connect(gaugeAction_, &QAction::triggered, this, &MainWindow::setGaugeDisplay);
    viewMenu_->addSeparator();
    // The ledger of every stream, one after another (streams of one kind
    // of system: their energies share the columns' units).
    QAction* allStreams = viewMenu_->addAction(tr("Ledger of all &streams"));
    allStreams->setObjectName(QStringLiteral("ledgerAllStreams"));
    allStreams->setCheckable(true);
    allStreams->setToolTip(tr("Show every stream's steps and totals in the ledger, each under its own heading"));
    connect(allStreams, &QAction::toggled, this, [this](bool on) {
        ledger_->setAllStreams(on);
        if (const int row = ledger_->rowOfStep(doc_.selectedStep()); row >= 0) {
            QSignalBlocker block(ledgerView_->selectionModel());
            ledgerView_->selectRow(row);
        }
    });
    auto allStreamsAvailable = [this, allStreams] { allStreams->setEnabled(ledger_->canShowAllStreams()); };
    connect(&doc_, &ProjectDocument::changed, this, allStreamsAvailable);
    allStreamsAvailable();
    QAction* showUncertainty = viewMenu_->addAction(tr("&Uncertainty (±)"));
    showUncertainty->setCheckable(true);
    showUncertainty->setChecked(doc_.uncertaintyShown());
    showUncertainty->setToolTip(tr("Standard uncertainties from the worksheet's tolerances: ± columns in the ledger, "
                                   "bands on the T–s and T–Q charts, and the contributions chart"));
    connect(showUncertainty, &QAction::toggled, &doc_, &ProjectDocument::setUncertaintyShown);
    viewMenu_->addSeparator();
    viewMenu_->addAction(tr("Zoom &in"), this, [this] { chain_->zoomBy(1.2); })->setShortcut(QKeySequence::ZoomIn);
    viewMenu_->addAction(tr("Zoom &out"), this, [this] { chain_->zoomBy(1 / 1.2); })->setShortcut(QKeySequence::ZoomOut);
    viewMenu_->addAction(tr("&Actual size"), this, [this] { chain_->resetZoom(); })
        ->setShortcut(QKeySequence(Qt::CTRL | Qt::Key_0));

    QMenu* help = menuBar()->addMenu(tr("&Help"));
    help->addAction(tr("&Getting started"), this, &MainWindow::showGettingStarted)->setShortcut(QKeySequence::HelpContents);
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
        a->setToolTip(tr("Add a %1 step after the selected card: %2").arg(stepKindTitle(k).toLower(), stepKindMeaning(k)));
    }
    steps->addSeparator();
    quickAdd_ = new QLineEdit(this);
    quickAdd_->setPlaceholderText(tr("quick add (Ctrl+L): heat to 180 degC source 240 degC"));
    quickAdd_->setClearButtonEnabled(true);
    quickAdd_->setMinimumWidth(300);
    quickAdd_->setToolTip(help::quickAddTooltip());
    steps->addWidget(quickAdd_);
    // Ctrl+L: type a step without reaching for the mouse.
    auto* focusQuickAdd = new QAction(tr("Quick add"), this);
    focusQuickAdd->setShortcut(QKeySequence(Qt::CTRL | Qt::Key_L));
    connect(focusQuickAdd, &QAction::triggered, this, [this] {
        quickAdd_->setFocus(Qt::ShortcutFocusReason);
        quickAdd_->selectAll();
    });
    addAction(focusQuickAdd);
    qApp->installEventFilter(new WindowShortcutsOverTextFields(this));
    connect(quickAdd_, &QLineEdit::returnPressed, this, [this] {
        if (quickAddStep(quickAdd_->text())) quickAdd_->clear();
    });
}

void MainWindow::addStep(int index, StepKind kind) {
    index = std::clamp(index, 0, int(doc_.project().steps.size()));
    auto s = placedStep(doc_.project(), index, defaultStep(doc_.project(), doc_.result(), kind, index), false);
    if (!s) {
        statusBar()->showMessage(tr("Not added: %1").arg(qs(s.error().message)), 8000);
        lastError_ = qs(s.error().message);
        return;
    }
    doc_.undoStack()->push(new AddStep(&doc_, index, std::move(*s)));
}

bool MainWindow::quickAddStep(const QString& text) {
    // After the selected card; the Start card (no step selected) puts it first.
    const int index = std::clamp(doc_.selectedStep() + 1, 0, int(doc_.project().steps.size()));
    auto step = parseQuickAdd(text.toStdString(), doc_.project(),
                              stateBefore(doc_.project(), doc_.result(), index).first);
    if (step) {
        // A quick-added step without a target takes the defaults of its kind;
        // then it is held to the rules a saved file is.
        if (step->to.empty() && !isPhaseChangeKind(step->kind))
            step->to = defaultStep(doc_.project(), doc_.result(), step->kind, index).to;
        step = placedStep(doc_.project(), index, std::move(*step), false);
    }
    if (!step) {
        quickAdd_->setStyleSheet(QStringLiteral("QLineEdit { border: 1px solid #b42318; background: #fdecea; }"));
        quickAdd_->setToolTip(qs(step.error().message));
        statusBar()->showMessage(tr("Not added: %1").arg(qs(step.error().message)), 8000);
        lastError_ = qs(step.error().message);
        return false;
    }
    quickAdd_->setStyleSheet({});
    quickAdd_->setToolTip(help::quickAddTooltip());
    // The message of an earlier failure no longer applies.
    if (statusBar()->currentMessage().startsWith(tr("Not added:"))) statusBar()->clearMessage();
    lastError_.clear();
    doc_.undoStack()->push(new AddStep(&doc_, index, std::move(step.value())));
    return true;
}

void MainWindow::removeSelected() {
    const int i = doc_.selectedStep();
    if (i >= 0) doc_.undoStack()->push(new RemoveStep(&doc_, i));
}

void MainWindow::renameSelected() {
    if (doc_.selectedStep() < 0) return;
    QLineEdit* name = editor_->field(QStringLiteral("id"))->lineEdit();
    name->setFocus(Qt::ShortcutFocusReason);
    name->selectAll();
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

void MainWindow::setGaugeDisplay(bool gauge) {
    if (view::gaugeDisplay(doc_.project()) == gauge) return;
    Project p = doc_.project();
    view::setGaugeDisplay(p, gauge);
    doc_.undoStack()->push(new EditProjectSettings(&doc_, std::move(p),
                                                   gauge ? tr("Show gauge pressures") : tr("Show absolute pressures")));
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
    return askInDialog(this, q, text);
}

void MainWindow::updateTitle() {
    const Project& p = doc_.project();
    const QString file = doc_.filePath().isEmpty() ? tr("not saved") : QFileInfo(doc_.filePath()).fileName();
    setWindowTitle(QStringLiteral("%1 — %2[*] — Heatchain")
                       .arg(p.meta.title.empty() ? tr("Untitled worksheet") : qs(p.meta.title), file));
    setWindowModified(doc_.isModified());
    for (QAction* a : unitActions_) a->setChecked(UnitSystem(a->data().toInt()) == p.displayUnits);
    if (gaugeAction_) gaugeAction_->setChecked(view::gaugeDisplay(p));
}

void MainWindow::updateStatus() {
    const SequenceResult& r = doc_.result();
    const Project& p = doc_.project();
    QString solveText = tr("%1 · %2 · %3 steps ·")
                            .arg(qs(p.substance.displayName()),
                                 r.model ? qs(r.model->name()) : qs(modelId(p.model)))
                            .arg(p.steps.size());
    if (doc_.streamCount() > 1)
        solveText = tr("stream %1 (%2 of %3) · ")
                        .arg(qs(doc_.streams().streams[std::size_t(doc_.currentStream())].id))
                        .arg(doc_.currentStream() + 1)
                        .arg(doc_.streamCount()) +
                    solveText;
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

QString MainWindow::gettingStartedHtml() { return help::gettingStartedHtml(); }

void MainWindow::showGettingStarted() { help::showGettingStarted(this); }

void MainWindow::showAbout() { help::showAbout(this, doc_.project(), doc_.result()); }

void MainWindow::startUp(const QStringList& arguments) {
    QSettings s;
    restoreGeometry(s.value(QStringLiteral("window/geometry")).toByteArray());
    const QByteArray state = s.value(QStringLiteral("window/state")).toByteArray();
    restoreState(state);
    if (state.isEmpty()) {
        // No layout kept: once the window has its size, give the ledger room
        // for a dozen rows and the messages a few lines (before it is shown
        // the docks have no height to share).
        QTimer::singleShot(0, this, [this] {
            auto* ledger = findChild<QDockWidget*>(QStringLiteral("ledgerDock"));
            auto* messages = findChild<QDockWidget*>(QStringLiteral("messagesDock"));
            if (ledger && messages) resizeDocks({ledger, messages}, {300, 90}, Qt::Vertical);
        });
    }
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
            QTimer::singleShot(0, compare_, [this, other] { compare_->show(other); });
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
    // Nothing to reopen: a blank worksheet, with the Start card selected so
    // the step panel asks for the material and where it starts.
    doc_.setSelectedStep(-1);
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
    session_->closedCleanly();
}

// ---- the helpers' entry points: the window only forwards -------------------

bool MainWindow::openFile(const QString& path) { return session_->open(path); }
bool MainWindow::saveFile(const QString& path) { return session_->saveTo(path); }
bool MainWindow::save() { return session_->save(); }
bool MainWindow::confirmDiscard() { return session_->confirmDiscard(); }
void MainWindow::newWorksheet() { session_->newWorksheet(); }
QString MainWindow::openDialogFolder() const { return session_->openDialogFolder(); }

void MainWindow::checkDiskNow() { session_->diskWatch()->checkNow(); }
bool MainWindow::diskNoticeShown() const { return session_->diskWatch()->noticeShown(); }
void MainWindow::reloadFromDisk() { session_->reloadFromDisk(); }

void MainWindow::setAutosaveInterval(int ms) { session_->autosave()->setInterval(ms); }
int MainWindow::autosaveInterval() const { return session_->autosave()->interval(); }
void MainWindow::setAutosaveFolder(const QString& folder) { session_->autosave()->setFolder(folder); }
AutosaveStore* MainWindow::autosaveStore() const { return session_->autosave()->store(); }
void MainWindow::autosaveNow() { session_->autosave()->autosaveNow(); }
bool MainWindow::offerRecovery() { return session_->autosave()->offerRecovery(); }

bool MainWindow::exportReport(const QString& path, PageSize pageSize) { return exporter_->exportReport(path, pageSize); }
bool MainWindow::exportChartImage(const QString& path, ChartKind kind) { return exporter_->exportChartImage(path, kind); }
bool MainWindow::exportLedger(const QString& path) { return exporter_->exportLedger(path); }
bool MainWindow::exportResults(const QString& path) { return exporter_->exportResults(path); }
CompareDialog* MainWindow::compareWith(const QString& path) { return compare_->compareWith(path); }

}  // namespace heatchain::gui
