// Several streams in the application: a version-2 worksheet opens as one
// lane per stream, the step panel, ledger and charts follow the selected
// stream, stream edits undo and redo, saving writes the worksheet back, and
// the heat recovery view shows core's targets at the ΔTmin of its slider.
// Core is the oracle: every number is compared with heatchain::solve and
// heatchain::worksheetRecovery of the same file.
#include <QApplication>
#include <QFile>
#include <QLabel>
#include <QSettings>
#include <QSlider>
#include <QTableView>
#include <QAction>
#include <QStandardPaths>
#include <QTemporaryDir>
#include <QtTest>
#include <cmath>

#include "heatchain/project_file.hpp"
#include "heatchain/recovery.hpp"
#include "heatchain/streams.hpp"
#include "heatchain_view/format.hpp"
#include "ledger_model.hpp"
#include "main_window.hpp"

using namespace heatchain;
using heatchain::gui::LedgerModel;
using heatchain::gui::MainWindow;

namespace {

const QString kSample = QStringLiteral(HEATCHAIN_SOURCE_DIR "/sample-projects/ethanol-stripping-heat-recovery.hchain");

StreamSet load(const QString& path) {
    auto s = loadStreamSet(path.toStdString());
    if (!s) qFatal("%s", s.error().text().c_str());
    return *s;
}

QByteArray readAll(const QString& path) {
    QFile f(path);
    if (!f.open(QIODevice::ReadOnly)) return {};
    return f.readAll();
}

QString qs(const std::string& s) { return QString::fromStdString(s); }

// The ledger's step rows: id and Q (SI) of each, in order.
std::vector<std::pair<QString, double>> ledgerSteps(LedgerModel* m) {
    std::vector<std::pair<QString, double>> out;
    for (int row = 0; row < m->rowCount(); ++row) {
        const QModelIndex i = m->index(row, LedgerModel::ColStep);
        if (m->data(i, LedgerModel::RowKindRole).toInt() != int(LedgerModel::RowKind::Step)) continue;
        out.emplace_back(m->data(i, Qt::DisplayRole).toString(),
                         m->data(m->index(row, LedgerModel::ColQ), LedgerModel::SiRole).toDouble());
    }
    return out;
}

bool close(double a, double b, double rel = 1e-9) { return std::fabs(a - b) <= rel * std::max({1.0, std::fabs(a), std::fabs(b)}); }

}  // namespace

class StreamsTest : public QObject {
    Q_OBJECT
private slots:
    void initTestCase() {
        QStandardPaths::setTestModeEnabled(true);
        QSettings().clear();
    }

    void opensOneLanePerStream() {
        const StreamSet set = load(kSample);
        QVERIFY(set.streams.size() >= 4);
        MainWindow w;
        w.setInteractive(false);
        QVERIFY2(w.openFile(kSample), qPrintable(w.lastError()));
        QCOMPARE(w.document()->streamCount(), int(set.streams.size()));
        QCOMPARE(w.chain()->laneCount(), int(set.streams.size()));
        for (int k = 0; k < int(set.streams.size()); ++k) {
            const Stream& s = set.streams[std::size_t(k)];
            QCOMPARE(w.chain()->laneCardCount(k), int(s.project.steps.size()));
            // The lane names its stream: id, name and material.
            const QString label = w.chain()->laneLabel(k);
            QVERIFY2(label.startsWith(qs(s.id)), qPrintable(label));
            if (s.name) QVERIFY2(label.contains(qs(*s.name)), qPrintable(label));
            QVERIFY2(label.contains(qs(s.project.substance.name), Qt::CaseInsensitive), qPrintable(label));
            // Lanes stack downwards, each below the one before.
            if (k > 0) QVERIFY(w.chain()->cardRect(k, -1).top() > w.chain()->cardRect(k - 1, -1).bottom());
        }
        QCOMPARE(w.document()->currentStream(), 0);
        QVERIFY(w.chain()->laneMarkedCurrent(0));
        QVERIFY(!w.chain()->laneMarkedCurrent(1));
        // A worksheet of several streams shows its heat recovery first.
        QVERIFY(w.heatRecoveryDock()->widget()->isVisibleTo(&w));
    }

    void panelLedgerAndChartsFollowTheSelectedStream() {
        const StreamSet set = load(kSample);
        const std::vector<SequenceResult> results = solveStreams(set);
        MainWindow w;
        w.setInteractive(false);
        w.resize(1400, 900);
        w.show();
        QVERIFY(QTest::qWaitForWindowExposed(&w));
        QVERIFY(w.openFile(kSample));
        // A click on the second card of the third stream's lane.
        const int lane = 2;
        QCOMPARE(w.chain()->laneCardCount(lane), 2);
        const QRectF card = w.chain()->cardRect(lane, 1);
        w.chain()->ensureVisible(card);
        QApplication::processEvents();
        const QPoint at = w.chain()->mapFromScene(card.center());
        QTest::mouseClick(w.chain()->viewport(), Qt::LeftButton, {}, at);
        QCOMPARE(w.document()->currentStream(), lane);
        QCOMPARE(w.document()->selectedStep(), 1);
        QVERIFY(w.chain()->laneMarkedCurrent(lane));
        QVERIFY(!w.chain()->laneMarkedCurrent(0));
        const Stream& s = set.streams[std::size_t(lane)];
        const SequenceResult& r = results[std::size_t(lane)];
        QCOMPARE(qs(w.document()->project().substance.id), qs(s.project.substance.id));
        // The ledger lists that stream's steps with core's duties.
        const auto rows = ledgerSteps(w.ledger());
        QCOMPARE(int(rows.size()), int(s.project.steps.size()));
        for (std::size_t i = 0; i < rows.size(); ++i) {
            QVERIFY2(rows[i].first.contains(qs(s.project.steps[i].id)), qPrintable(rows[i].first));
            QVERIFY2(close(rows[i].second, r.steps[i].Q), qPrintable(QString::number(rows[i].second)));
        }
        // The step panel edits the selected step of that stream.
        QCOMPARE(w.editor()->field(QStringLiteral("id"))->lineEdit()->text(), qs(s.project.steps[1].id));
        // The T–Q chart draws that stream's steps against their own sink
        // (the overhead's condenser and subcooler both give heat to "cw").
        QVERIFY(&w.document()->result() == &w.document()->results()[std::size_t(lane)]);
        const auto& lines = w.tqChart()->chart().reservoirLines();
        QCOMPARE(int(lines.size()), int(s.project.steps.size()));
        for (const auto& line : lines) {
            QCOMPARE(line.label, QStringLiteral("cw"));
            QVERIFY(!line.source);
        }

        // Page Down moves on to the next stream, at its Start card.
        w.chain()->setFocus();
        QTest::keyClick(w.chain(), Qt::Key_PageDown);
        QCOMPARE(w.document()->currentStream(), lane + 1);
        QCOMPARE(w.document()->selectedStep(), -1);
        QVERIFY(w.startEditor()->isVisible());
    }

    // View ▸ Ledger of all streams: every stream under its heading row, each
    // step with core's duty and each stream's own total; a row of another
    // stream makes that stream current with the step selected.
    void ledgerOfAllStreams() {
        const StreamSet set = load(kSample);
        const std::vector<SequenceResult> results = solveStreams(set);
        MainWindow w;
        w.setInteractive(false);
        QVERIFY(w.openFile(kSample));
        auto* all = w.findChild<QAction*>(QStringLiteral("ledgerAllStreams"));
        QVERIFY(all);
        QVERIFY(all->isEnabled());  // every stream of the sample is steady flow
        LedgerModel* m = w.ledger();
        QVERIFY(!m->showsAllStreams());
        all->trigger();
        QVERIFY(m->showsAllStreams());
        std::vector<int> headings, steps(set.streams.size(), 0);
        for (int row = 0; row < m->rowCount(); ++row) {
            const QModelIndex i = m->index(row, LedgerModel::ColStep);
            const int k = m->data(i, LedgerModel::RowStreamRole).toInt();
            QVERIFY(k >= 0 && k < int(set.streams.size()));
            const auto kind = LedgerModel::RowKind(m->data(i, LedgerModel::RowKindRole).toInt());
            const SequenceResult& r = results[std::size_t(k)];
            const double q = m->data(m->index(row, LedgerModel::ColQ), LedgerModel::SiRole).toDouble();
            if (kind == LedgerModel::RowKind::Stream) {
                headings.push_back(k);
                QCOMPARE(m->data(i, Qt::DisplayRole).toString(), qs(set.streams[std::size_t(k)].id));
            } else if (kind == LedgerModel::RowKind::Step) {
                const int step = m->data(i, LedgerModel::RowStepRole).toInt();
                QCOMPARE(step, steps[std::size_t(k)]++);
                QVERIFY2(close(q, r.steps[std::size_t(step)].Q), qPrintable(QString::number(q)));
            } else if (kind == LedgerModel::RowKind::Total) {
                QVERIFY2(close(q, r.totals.Q), qPrintable(QString::number(q)));
            }
        }
        QCOMPARE(int(headings.size()), int(set.streams.size()));
        for (std::size_t k = 0; k < set.streams.size(); ++k) {
            QCOMPARE(headings[k], int(k));
            QCOMPARE(steps[k], int(set.streams[k].project.steps.size()));
        }
        // Choosing the first step of the last stream in the ledger.
        const int last = int(set.streams.size()) - 1;
        auto* view = w.findChild<QTableView*>(QStringLiteral("ledger"));
        QVERIFY(view);
        int target = -1;
        for (int row = 0; row < m->rowCount() && target < 0; ++row) {
            const QModelIndex i = m->index(row, LedgerModel::ColStep);
            if (m->data(i, LedgerModel::RowStreamRole).toInt() == last &&
                m->data(i, LedgerModel::RowKindRole).toInt() == int(LedgerModel::RowKind::Step))
                target = row;
        }
        QVERIFY(target >= 0);
        view->setCurrentIndex(m->index(target, LedgerModel::ColQ));
        QCOMPARE(w.document()->currentStream(), last);
        QCOMPARE(w.document()->selectedStep(), 0);
        // Off again: the current stream alone.
        all->trigger();
        QVERIFY(!m->showsAllStreams());
        QCOMPARE(int(ledgerSteps(m).size()), int(set.streams[std::size_t(last)].project.steps.size()));
    }

    void streamEditsUndoAndRedo() {
        MainWindow w;
        w.setInteractive(false);
        QVERIFY(w.openFile(kSample));
        auto* doc = w.document();
        auto* actions = w.streamActions();
        QUndoStack* undo = doc->undoStack();
        const std::string original = doc->fileText();
        const int n = doc->streamCount();

        // Add: after the current stream, with its material and no steps.
        doc->setCurrentStream(1, -1);
        QVERIFY(!actions->addStream(QStringLiteral("feed")));  // id taken
        QVERIFY(actions->lastError().contains(QStringLiteral("feed")));
        QVERIFY(actions->addStream(QStringLiteral("condensate"), QStringLiteral("condensate return")));
        QCOMPARE(doc->streamCount(), n + 1);
        QCOMPARE(doc->currentStream(), 2);
        QCOMPARE(qs(doc->streams().streams[2].id), QStringLiteral("condensate"));
        QVERIFY(doc->project().steps.empty());
        QCOMPARE(w.chain()->laneCount(), n + 1);
        const std::string added = doc->fileText();

        // Rename, move, copy a step into it, remove another.
        QVERIFY(!actions->renameStream(2, QStringLiteral(""), {}));
        QVERIFY(actions->renameStream(2, QStringLiteral("return"), QStringLiteral("condensate return line")));
        QCOMPARE(qs(*doc->streams().streams[2].name), QStringLiteral("condensate return line"));
        QVERIFY(actions->moveStream(2, 0));
        QCOMPARE(qs(doc->streams().streams[0].id), QStringLiteral("return"));
        QCOMPARE(doc->currentStream(), 0);
        doc->setCurrentStream(1, 0);  // "feed" is now second; its preheat
        QCOMPARE(qs(doc->project().steps[0].id), QStringLiteral("preheat"));
        QVERIFY(actions->copyStep(0, 0));
        QCOMPARE(doc->currentStream(), 0);
        QCOMPARE(doc->selectedStep(), 0);
        QCOMPARE(qs(doc->project().steps[0].id), QStringLiteral("preheat"));
        QCOMPARE(w.chain()->laneCardCount(0), 1);
        // A second copy gets an id of its own within the stream.
        doc->setCurrentStream(1, 0);
        QVERIFY(actions->copyStep(0, 0));
        QCOMPARE(qs(doc->project().steps[1].id), QStringLiteral("preheat-2"));
        QVERIFY(actions->removeStream(2));  // the reboiler
        QCOMPARE(doc->streamCount(), n);
        QVERIFY(doc->streamIndexOf("reboiler") < 0);
        const std::string edited = doc->fileText();

        // A step edit in one stream, then a switch to another: undo goes
        // back to the stream it was made in.
        doc->setCurrentStream(3, 0);
        const std::string stepBefore = doc->project().steps[0].id;
        w.chain()->setFocus();
        QVERIFY(w.quickAddStep(QStringLiteral("cool to 30 degC")));
        const std::string withStep = doc->fileText();
        doc->setCurrentStream(0, -1);
        undo->undo();
        QCOMPARE(doc->currentStream(), 3);
        QCOMPARE(doc->fileText(), edited);
        QCOMPARE(doc->project().steps[0].id, stepBefore);
        undo->redo();
        QCOMPARE(doc->fileText(), withStep);
        undo->undo();

        // Undo every stream edit back to the file as opened; redo them all.
        while (doc->fileText() != original && undo->canUndo()) undo->undo();
        QCOMPARE(doc->fileText(), original);
        QCOMPARE(doc->streamCount(), n);
        QCOMPARE(w.chain()->laneCount(), n);
        undo->redo();
        QCOMPARE(doc->fileText(), added);
        while (undo->canRedo()) undo->redo();
        QCOMPARE(doc->fileText(), withStep);
    }

    void savesAndReloadsSeveralStreams() {
        QTemporaryDir dir;
        QVERIFY(dir.isValid());
        MainWindow w;
        w.setInteractive(false);
        QVERIFY(w.openFile(kSample));
        // Untouched, the worksheet is written as core writes the file it read.
        const QString a = dir.filePath(QStringLiteral("a.hchain")), b = dir.filePath(QStringLiteral("b.hchain"));
        QVERIFY(w.saveFile(a));
        QCOMPARE(readAll(a), QByteArray::fromStdString(writeStreamSet(load(kSample))));
        QVERIFY(readAll(a).contains("\"version\": 2"));
        // An edit in the fourth stream survives the save and the reload.
        w.document()->setCurrentStream(3, 0);
        QVERIFY(w.quickAddStep(QStringLiteral("cool to 30 degC")));
        QVERIFY(w.streamActions()->renameStream(3, QStringLiteral("bottoms"), QStringLiteral("bottoms to the drain")));
        QVERIFY(w.saveFile(b));
        const StreamSet back = load(b);
        QCOMPARE(int(back.streams.size()), w.document()->streamCount());
        QCOMPARE(qs(*back.streams[3].name), QStringLiteral("bottoms to the drain"));
        QCOMPARE(int(back.streams[3].project.steps.size()), 2);
        QVERIFY(w.openFile(b));
        QCOMPARE(w.document()->streamCount(), int(back.streams.size()));
        const QString c = dir.filePath(QStringLiteral("c.hchain"));
        QVERIFY(w.saveFile(c));
        QCOMPARE(readAll(c), readAll(b));

        // Down to one plain stream again: written as a version-1 file.
        while (w.document()->streamCount() > 1) QVERIFY(w.streamActions()->removeStream(1));
        QVERIFY(w.streamActions()->renameStream(0, QStringLiteral("feed"), {}));
        const QString d = dir.filePath(QStringLiteral("d.hchain"));
        QVERIFY(w.saveFile(d));
        QVERIFY(readAll(d).contains("\"version\": 1"));
        auto single = loadProject(d.toStdString());
        QVERIFY2(single, single ? "" : single.error().text().c_str());
        QCOMPARE(qs(single->steps.front().id), QStringLiteral("preheat"));
    }

    void recoveryViewShowsCoreTargets() {
        const StreamSet set = load(kSample);
        const std::vector<SequenceResult> results = solveStreams(set);
        MainWindow w;
        w.setInteractive(false);
        w.resize(1400, 900);
        w.show();
        QVERIFY(QTest::qWaitForWindowExposed(&w));
        QVERIFY(w.openFile(kSample));
        auto* view = w.heatRecovery();
        QVERIFY(view->isVisible());
        // At the worksheet's required minimum approach.
        QCOMPARE(view->dTmin(), set.shared.minApproachK());
        auto expect = worksheetRecovery(set, results, set.shared.minApproachK());
        QVERIFY(expect);
        QVERIFY(view->recovery());
        const Recovery& shown = *view->recovery();
        QVERIFY(close(shown.targets.hotUtilityMin, expect->targets.hotUtilityMin));
        QVERIFY(close(shown.targets.coldUtilityMin, expect->targets.coldUtilityMin));
        QCOMPARE(shown.targets.pinchHot.size(), expect->targets.pinchHot.size());
        for (std::size_t i = 0; i < shown.targets.pinchHot.size(); ++i)
            QVERIFY(close(shown.targets.pinchHot[i], expect->targets.pinchHot[i]));
        QVERIFY(close(shown.hotUtilityNow, expect->hotUtilityNow));
        // The table prints the targets as the display units show them.
        const UnitSystem u = set.shared.displayUnits;
        const QString hot = view::formatWithUnit(expect->targets.hotUtilityMin, Dimension::Power, u, view::displayContext(set.shared), 4);
        QVERIFY2(view->targetsText().contains(hot), qPrintable(view->targetsText() + " / " + hot));
        QVERIFY(view->targetsText().contains(QStringLiteral("recoverable")));
        // The sweep is core's.
        auto sweep = worksheetDTminSweep(set, results, 0.0, view->sweep().back().dTmin, int(view->sweep().size()));
        QVERIFY(sweep);
        for (std::size_t i = 0; i < sweep->size(); ++i)
            QVERIFY(close(view->sweep()[i].hotUtilityMin, (*sweep)[i].hotUtilityMin));

        // The slider: 20 K needs at least as much utility as 10 K.
        QSlider* slider = view->slider();
        slider->setValue(slider->value() * 2);
        QCOMPARE(view->dTmin(), 2 * set.shared.minApproachK());
        auto wider = worksheetRecovery(set, results, view->dTmin());
        QVERIFY(wider);
        QVERIFY(close(view->recovery()->targets.hotUtilityMin, wider->targets.hotUtilityMin));
        QVERIFY(close(view->recovery()->targets.coldUtilityMin, wider->targets.coldUtilityMin));
        QVERIFY(wider->targets.hotUtilityMin > expect->targets.hotUtilityMin);
        QVERIFY(view->targetsText().contains(
            view::formatWithUnit(wider->targets.hotUtilityMin, Dimension::Power, u, view::displayContext(set.shared), 4)));

        // An edit of the worksheet updates the targets at the slider's ΔTmin:
        // without the dryer air, less hot utility is needed.
        const int air = w.document()->streamIndexOf("dryer-air");
        QVERIFY(air >= 0);
        QVERIFY(w.streamActions()->removeStream(air));
        StreamSet fewer = set;
        fewer.streams.erase(fewer.streams.begin() + air);
        auto without = worksheetRecovery(fewer, solveStreams(fewer), view->dTmin());
        QVERIFY(without);
        QVERIFY(close(view->recovery()->targets.hotUtilityMin, without->targets.hotUtilityMin));
        QVERIFY(without->targets.hotUtilityMin < wider->targets.hotUtilityMin);
        w.document()->undoStack()->undo();
        QVERIFY(close(view->recovery()->targets.hotUtilityMin, wider->targets.hotUtilityMin));
    }
};

QTEST_MAIN(StreamsTest)
#include "streams_test.moc"
