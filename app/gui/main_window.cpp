#include "main_window.hpp"

#include <QAction>
#include <QActionGroup>
#include <QApplication>
#include <QClipboard>
#include <QCloseEvent>
#include <QDockWidget>
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

#include "commands.hpp"
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

    setCentralWidget(chain_);
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
    statusMessages_ = new QLabel(this);
    auto* caution = new QLabel(tr("Idealised paths — have results checked by a qualified engineer."), this);
    caution->setStyleSheet(QStringLiteral("color: #8a5a00;"));
    caution->setToolTip(tr(kCaution));
    statusBar()->addWidget(statusMessages_);
    statusBar()->addWidget(statusSolve_);
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
    statusBar()->showMessage(tr("Saved %1").arg(path), 4000);
    return true;
}

bool MainWindow::confirmDiscard() {
    if (!doc_.isModified() || !interactive_) return true;
    const auto answer = QMessageBox::question(
        this, tr("Unsaved changes"), tr("The worksheet has unsaved changes. Save them first?"),
        QMessageBox::Save | QMessageBox::Discard | QMessageBox::Cancel, QMessageBox::Save);
    if (answer == QMessageBox::Save) return save();
    return answer == QMessageBox::Discard;
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
    statusSolve_->setText(tr("%1 · %2 · %3 steps · solved in %4 ms")
                              .arg(qs(p.substance.name.empty() ? p.substanceId : p.substance.name),
                                   r.model ? qs(r.model->name()) : qs(modelId(p.model)))
                              .arg(p.steps.size())
                              .arg(QString::number(doc_.lastSolveMs(), 'f', 2)));
    const int e = messages_->errorCount(), w = messages_->warningCount();
    if (e > 0)
        statusMessages_->setText(tr("<span style='color:#b42318'><b>%1 error(s)</b></span>, %2 warning(s)").arg(e).arg(w));
    else if (w > 0)
        statusMessages_->setText(tr("<span style='color:#8a5a00'>%1 warning(s)</span>").arg(w));
    else
        statusMessages_->setText(tr("<span style='color:#2e7d32'>no warnings</span>"));
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
        html += QStringLiteral("<li><b>%1</b>: %2</li>").arg(qs(n.field).toHtmlEscaped(), qs(n.text).toHtmlEscaped());
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
}

}  // namespace heatchain::gui
