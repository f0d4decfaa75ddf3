// Offscreen tests of "never lose a worksheet": autosave and recovery after a
// session that did not close cleanly, the question before unsaved changes
// are dropped, a file changed on disk by someone else, the exports and the
// revision comparison. Answers to the window's questions are injected.
#include <QDir>
#include <QFile>
#include <QJsonDocument>
#include <QProcess>
#include <QTemporaryDir>
#include <QXmlStreamReader>
#include <QtTest>

#include "compare_dialog.hpp"
#include "heatchain/project_file.hpp"
#include "heatchain/solver.hpp"
#include "heatchain_view/format.hpp"
#include "heatchain_view/process_chart.hpp"
#include <cmath>
#include "main_window.hpp"

using namespace heatchain;
using heatchain::gui::Answer;
using heatchain::gui::MainWindow;
using heatchain::gui::Question;

namespace {

// A feed-water line of our own invention (steady flow, IAPWS-IF97).
constexpr const char* kBaseText = R"({
  "format": "heatchain-project",
  "version": 1,
  "meta": { "title": "Safety test: feed water" },
  "display": { "units": "metric-engineering" },
  "system": "steady-flow",
  "model": "reference",
  "substance": "water",
  "basis": { "massFlow": "2 kg/s" },
  "start": { "T": "30 degC", "P": "5 bar" },
  "steps": [
    { "id": "preheat", "kind": "heat", "to": { "T": "120 degC" }, "source": { "T": "160 degC" } },
    { "id": "pump", "kind": "compress", "to": { "P": "12 bar" }, "path": "adiabatic", "efficiency": 0.7 },
    { "id": "trim", "kind": "cool", "to": { "T": "100 degC" }, "sink": { "T": "25 degC" } }
  ]
})";

Project parse(const char* text) {
    auto p = parseProject(text, "test");
    if (!p) qFatal("test project does not parse: %s", p.error().text().c_str());
    return std::move(p.value());
}

QByteArray readAll(const QString& path) {
    QFile f(path);
    if (!f.open(QIODevice::ReadOnly)) return {};
    return f.readAll();
}

void writeBytes(const QString& path, const QByteArray& bytes) {
    QFile f(path);
    if (!f.open(QIODevice::WriteOnly | QIODevice::Truncate)) qFatal("cannot write %s", qPrintable(path));
    f.write(bytes);
}

// A saved file without the revision time Save stamps into meta.modified.
std::string withoutSaveStamp(const QByteArray& file) {
    auto p = parseProject(file.toStdString(), "saved");
    if (!p) return "(does not parse: " + p.error().text() + ")";
    p.value().meta.modified.clear();
    return writeProject(p.value());
}

QByteArray canonicalBase() { return QByteArray::fromStdString(writeProject(parse(kBaseText))); }

// Answers questions from a script and records what was asked.
struct Answers {
    QList<QPair<Question, QString>> asked;
    QList<Answer> script;
    gui::Asker asker() {
        return [this](Question q, const QString& text) {
            asked.append({q, text});
            return script.isEmpty() ? Answer::Cancel : script.takeFirst();
        };
    }
};

QStringList filesIn(const QString& folder, const QString& pattern) {
    return QDir(folder).entryList({pattern}, QDir::Files);
}

}  // namespace

class SafetyTest : public QObject {
    Q_OBJECT
private slots:
    void initTestCase() {
        QCoreApplication::setOrganizationName(QStringLiteral("HeatchainSafetyTests"));
        QStandardPaths::setTestModeEnabled(true);
    }

    void recoveryRestoresTheAutosavedWorksheet() {
        QTemporaryDir dir;
        QVERIFY(dir.isValid());
        const QString folder = dir.filePath(QStringLiteral("autosave"));
        const QString original = dir.filePath(QStringLiteral("line.hchain"));
        writeBytes(original, canonicalBase());

        std::string autosaved;
        {
            auto* w = new MainWindow;
            w->setInteractive(false);
            w->setAutosaveFolder(folder);
            QVERIFY(w->openFile(original));
            // Unedited and saved: nothing to autosave.
            w->autosaveNow();
            QVERIFY(filesIn(folder, QStringLiteral("*.hchain")).isEmpty());
            w->document()->setSelectedStep(2);
            QVERIFY(w->quickAddStep(QStringLiteral("throttle to 2 bar")));
            autosaved = writeProject(w->document()->project());
            w->autosaveNow();
            QCOMPARE(filesIn(folder, QStringLiteral("*.hchain")).size(), 1);
            QCOMPARE(readAll(folder + QLatin1Char('/') + filesIn(folder, QStringLiteral("*.hchain")).front()),
                     QByteArray::fromStdString(autosaved));

            // While that session runs, another window does not offer its autosave.
            MainWindow other;
            other.setAutosaveFolder(folder);
            Answers none;
            other.setAsker(none.asker());
            QVERIFY(!other.offerRecovery());
            QVERIFY(none.asked.isEmpty());

            // The crash: the window goes away without a close.
            delete w;
        }
        // The user's file was never touched by the autosave.
        QCOMPARE(readAll(original), canonicalBase());

        // "Later" keeps the autosave for the next start.
        {
            MainWindow w;
            w.setAutosaveFolder(folder);
            Answers later;
            later.script = {Answer::Later};
            w.setAsker(later.asker());
            QVERIFY(!w.offerRecovery());
            QCOMPARE(later.asked.size(), 1);
            QCOMPARE(later.asked.front().first, Question::Recover);
            QVERIFY2(later.asked.front().second.contains(original), qPrintable(later.asked.front().second));
            QVERIFY(later.asked.front().second.contains(QStringLiteral("Safety test: feed water")));
        }

        MainWindow w;
        w.setInteractive(false);
        w.setAutosaveFolder(folder);
        Answers recover;
        recover.script = {Answer::Recover};
        w.setAsker(recover.asker());
        QVERIFY(w.offerRecovery());
        QCOMPARE(writeProject(w.document()->project()), autosaved);
        // Recovered as an unsaved change of the original file.
        QVERIFY(w.document()->isModified());
        QCOMPARE(w.document()->filePath(), original);
        QCOMPARE(readAll(original), canonicalBase());
        QVERIFY(w.isWindowModified());
        // The old session's files are gone; the recovered worksheet is safe
        // again under this session.
        QCOMPARE(filesIn(folder, QStringLiteral("*.hchain")),
                 QStringList{w.autosaveStore()->session() + QStringLiteral(".hchain")});

        // Save writes to the original file when the user chooses.
        QVERIFY(w.save());
        QCOMPARE(withoutSaveStamp(readAll(original)), autosaved);
        QVERIFY(!w.document()->isModified());
        QVERIFY(filesIn(folder, QStringLiteral("*.hchain")).isEmpty());
    }

    void autosaveEqualToItsFileIsDroppedWithoutAQuestion() {
        QTemporaryDir dir;
        const QString folder = dir.filePath(QStringLiteral("autosave"));
        const QString original = dir.filePath(QStringLiteral("line.hchain"));
        writeBytes(original, canonicalBase());
        {
            auto* crashed = new MainWindow;
            crashed->setAutosaveFolder(folder);
            QVERIFY(crashed->openFile(original));
            crashed->document()->markModified();  // modified flag, same content
            crashed->autosaveNow();
            QCOMPARE(filesIn(folder, QStringLiteral("*.hchain")).size(), 1);
            delete crashed;
        }
        MainWindow w;
        w.setAutosaveFolder(folder);
        Answers none;
        w.setAsker(none.asker());
        QVERIFY(!w.offerRecovery());
        QVERIFY(none.asked.isEmpty());
        QVERIFY(filesIn(folder, QStringLiteral("*.hchain")).isEmpty());
    }

    void chartLinesKeepTheirShape() {
        // A straight run collapses to its ends; a corner survives; no dropped
        // point lies farther than the tolerance from the kept line.
        QPolygonF straight;
        for (int i = 0; i <= 63; ++i) straight << QPointF(i * 2.0, 100 - i * 1.5);
        const QPolygonF s = view::simplifyPolyline(straight, 0.25);
        QCOMPARE(s.size(), 2);
        QCOMPARE(s.front(), straight.front());
        QCOMPARE(s.back(), straight.back());
        QPolygonF corner;
        for (int i = 0; i <= 20; ++i) corner << QPointF(i, 0);
        for (int i = 1; i <= 20; ++i) corner << QPointF(20, i);
        const QPolygonF c = view::simplifyPolyline(corner, 0.25);
        QCOMPARE(c.size(), 3);
        QCOMPARE(c[1], QPointF(20, 0));
        QPolygonF wave;
        for (int i = 0; i <= 200; ++i) wave << QPointF(i, 30 * std::sin(i / 15.0));
        const QPolygonF w = view::simplifyPolyline(wave, 0.25);
        QVERIFY(w.size() < wave.size());
        for (QPointF v : wave) {
            double best = 1e9;
            for (qsizetype k = 0; k + 1 < w.size(); ++k) {
                const QPointF a = w[k], d = w[k + 1] - a, r = v - a;
                const double t = std::clamp((r.x() * d.x() + r.y() * d.y()) / (d.x() * d.x() + d.y() * d.y()), 0.0, 1.0);
                const QPointF q = a + t * d - v;
                best = std::min(best, std::hypot(q.x(), q.y()));
            }
            QVERIFY2(best <= 0.25 + 1e-9, qPrintable(QString::number(best)));
        }
    }

    void autosaveRunsOnItsTimerAndACleanCloseRemovesIt() {
        QTemporaryDir dir;
        const QString folder = dir.filePath(QStringLiteral("autosave"));
        MainWindow w;
        w.setInteractive(false);
        w.setAutosaveFolder(folder);
        QCOMPARE(w.autosaveInterval(), 60 * 1000);  // the brief: every minute
        w.setAutosaveInterval(30);
        w.document()->reset(parse(kBaseText));  // never saved: worth keeping
        QTRY_COMPARE_WITH_TIMEOUT(filesIn(folder, QStringLiteral("*.hchain")).size(), 1, 5000);
        QCOMPARE(filesIn(folder, QStringLiteral("*.json")).size(), 1);
        QVERIFY(w.close());  // non-interactive: unsaved changes are discarded
        QVERIFY(filesIn(folder, QStringLiteral("*.hchain")).isEmpty());
        QVERIFY(filesIn(folder, QStringLiteral("*.json")).isEmpty());

        // Discard at the recovery question deletes the autosave.
        {
            auto* crashed = new MainWindow;
            crashed->setAutosaveFolder(folder);
            crashed->document()->reset(parse(kBaseText));
            crashed->autosaveNow();
            delete crashed;
        }
        MainWindow next;
        next.setAutosaveFolder(folder);
        Answers discard;
        discard.script = {Answer::Discard};
        next.setAsker(discard.asker());
        QVERIFY(!next.offerRecovery());
        QCOMPARE(discard.asked.size(), 1);
        QVERIFY(filesIn(folder, QStringLiteral("*.hchain")).isEmpty());
        QVERIFY(!next.offerRecovery());
        QCOMPARE(discard.asked.size(), 1);
    }

    void closingModifiedWorksheetAsks() {
        QTemporaryDir dir;
        const QString file = dir.filePath(QStringLiteral("line.hchain"));
        writeBytes(file, canonicalBase());
        MainWindow w;
        w.setAutosaveFolder(dir.filePath(QStringLiteral("autosave")));
        Answers answers;
        w.setAsker(answers.asker());
        QVERIFY(w.openFile(file));

        // Unmodified: nothing to ask.
        QVERIFY(w.confirmDiscard());
        QVERIFY(answers.asked.isEmpty());

        w.document()->setSelectedStep(0);
        QVERIFY(w.quickAddStep(QStringLiteral("heat to 130 degC source 200 degC")));
        const std::string edited = writeProject(w.document()->project());

        // Cancel keeps the window and the edit, for close and for New.
        answers.script = {Answer::Cancel};
        QVERIFY(!w.close());
        QCOMPARE(answers.asked.size(), 1);
        QCOMPARE(answers.asked.back().first, Question::UnsavedChanges);
        QVERIFY(answers.asked.back().second.contains(QStringLiteral("line.hchain")));
        answers.script = {Answer::Cancel};
        w.newWorksheet();
        QCOMPARE(answers.asked.size(), 2);
        QCOMPARE(writeProject(w.document()->project()), edited);
        QCOMPARE(readAll(file), canonicalBase());

        // Save writes the edit, then the close goes ahead.
        answers.script = {Answer::Save};
        QVERIFY(w.close());
        QCOMPARE(answers.asked.size(), 3);
        QCOMPARE(withoutSaveStamp(readAll(file)), edited);
        const QByteArray saved = readAll(file);

        // Discard drops the edit without writing.
        MainWindow v;
        v.setAutosaveFolder(dir.filePath(QStringLiteral("autosave")));
        Answers drop;
        drop.script = {Answer::Discard};
        v.setAsker(drop.asker());
        QVERIFY(v.openFile(file));
        QVERIFY(v.quickAddStep(QStringLiteral("throttle to 2 bar")));
        QVERIFY(v.close());
        QCOMPARE(drop.asked.size(), 1);
        QCOMPARE(readAll(file), saved);
    }

    void fileChangedOnDiskIsNotSilentlyOverwritten() {
        QTemporaryDir dir;
        const QString file = dir.filePath(QStringLiteral("line.hchain"));
        writeBytes(file, canonicalBase());
        MainWindow w;
        w.setAutosaveFolder(dir.filePath(QStringLiteral("autosave")));
        Answers answers;
        w.setAsker(answers.asker());
        QVERIFY(w.openFile(file));
        w.document()->setSelectedStep(0);
        QVERIFY(w.quickAddStep(QStringLiteral("throttle to 2 bar")));

        // Someone else saves a version of the same length (one letter of the
        // title differs): size and perhaps time agree, the content does not.
        Project theirs = parse(kBaseText);
        theirs.meta.title = "Safety test: feed wateR";
        const QByteArray theirBytes = QByteArray::fromStdString(writeProject(theirs));
        QCOMPARE(theirBytes.size(), canonicalBase().size());
        writeBytes(file, theirBytes);

        // The watcher notices and the notice offers Reload.
        QTRY_VERIFY_WITH_TIMEOUT(w.diskNoticeShown(), 5000);

        answers.script = {Answer::Cancel};
        QVERIFY(!w.save());
        QCOMPARE(answers.asked.size(), 1);
        QCOMPARE(answers.asked.back().first, Question::ChangedOnDisk);
        QVERIFY2(answers.asked.back().second.contains(QStringLiteral("changed on disk")), qPrintable(answers.asked.back().second));
        QCOMPARE(readAll(file), theirBytes);
        QVERIFY(w.document()->isModified());

        // Overwrite is the user's explicit choice.
        answers.script = {Answer::Overwrite};
        QVERIFY(w.save());
        QCOMPARE(readAll(file), QByteArray::fromStdString(writeProject(w.document()->project())));
        QVERIFY(!w.diskNoticeShown());
        // After our own save, nothing is reported as changed.
        QVERIFY(!w.document()->fileChangedOnDisk());
        QVERIFY(w.save());
        QCOMPARE(answers.asked.size(), 2);

        // A change while unedited: Reload brings their version in.
        writeBytes(file, theirBytes);
        w.checkDiskNow();
        QVERIFY(w.diskNoticeShown());
        w.reloadFromDisk();
        QCOMPARE(writeProject(w.document()->project()), theirBytes.toStdString());
        QVERIFY(!w.diskNoticeShown());

        // A removed file is reported too, and Save asks first.
        QVERIFY(w.quickAddStep(QStringLiteral("throttle to 3 bar")));
        QVERIFY(QFile::remove(file));
        answers.script = {Answer::Cancel};
        QVERIFY(!w.save());
        QVERIFY(answers.asked.back().second.contains(QStringLiteral("removed")));
        QVERIFY(!QFile::exists(file));
    }

    void exportsWriteFilesAndNeverTouchTheWorksheet() {
        QTemporaryDir dir;
        const QString file = dir.filePath(QStringLiteral("line.hchain"));
        writeBytes(file, canonicalBase());
        MainWindow w;
        w.setInteractive(false);
        w.setAutosaveFolder(dir.filePath(QStringLiteral("autosave")));
        QVERIFY(w.openFile(file));
        const std::string before = writeProject(w.document()->project());

        const QString pdf = dir.filePath(QStringLiteral("r.pdf")), letter = dir.filePath(QStringLiteral("r-letter.pdf"));
        QVERIFY2(w.exportReport(pdf, PageSize::A4), qPrintable(w.lastError()));
        QVERIFY(readAll(pdf).startsWith("%PDF-"));
        QVERIFY2(w.exportReport(letter, PageSize::Letter), qPrintable(w.lastError()));
        // Page sizes read back with poppler's pdfinfo, which rounds to whole
        // points. A4 is 210 × 297 mm = 595.276 × 841.89 pt (ISO 216); US
        // Letter 8.5 × 11 in = 612 × 792 pt (ANSI/ASME Y14.1).
        auto pageSize = [](const QString& path) {
            QProcess p;
            p.start(QStringLiteral("pdfinfo"), {path});
            if (!p.waitForFinished(20000)) return QString();
            for (const QString& line : QString::fromUtf8(p.readAllStandardOutput()).split(QLatin1Char('\n')))
                if (line.startsWith(QStringLiteral("Page size:"))) return line.simplified();
            return QString();
        };
        if (!QStandardPaths::findExecutable(QStringLiteral("pdfinfo")).isEmpty()) {
            QVERIFY2(pageSize(pdf).startsWith(QStringLiteral("Page size: 595 x 842")), qPrintable(pageSize(pdf)));
            QVERIFY2(pageSize(letter).startsWith(QStringLiteral("Page size: 612 x 792")), qPrintable(pageSize(letter)));
        }

        const QString svg = dir.filePath(QStringLiteral("ts.svg")), png = dir.filePath(QStringLiteral("tq.png"));
        QVERIFY2(w.exportChartImage(svg, ChartKind::TemperatureEntropy), qPrintable(w.lastError()));
        QXmlStreamReader xml(readAll(svg));
        bool sawSvg = false;
        while (!xml.atEnd())
            if (xml.readNext() == QXmlStreamReader::StartElement && !sawSvg) sawSvg = xml.name() == QStringLiteral("svg");
        QVERIFY2(!xml.hasError(), qPrintable(xml.errorString()));
        QVERIFY(sawSvg);
        QVERIFY2(w.exportChartImage(png, ChartKind::TemperatureDuty), qPrintable(w.lastError()));
        QVERIFY(readAll(png).startsWith("\x89PNG\r\n\x1a\n"));  // PNG signature, ISO/IEC 15948 §5.2

        const QString csv = dir.filePath(QStringLiteral("ledger.csv")), json = dir.filePath(QStringLiteral("results.json"));
        QVERIFY2(w.exportLedger(csv), qPrintable(w.lastError()));
        const QByteArray header = readAll(csv).split('\n').front();
        QVERIFY2(header.contains("T_end [K]") && header.contains("Q [W]"), header.constData());
        // One row per step of the worksheet, in its order, after the header.
        const QList<QByteArray> rows = readAll(csv).split('\n');
        QVERIFY(rows.size() > 3);
        QVERIFY(rows[1].startsWith("preheat,heat,"));
        QVERIFY(rows[2].startsWith("pump,compress,"));
        QVERIFY(rows[3].startsWith("trim,cool,"));
        QVERIFY2(w.exportResults(json), qPrintable(w.lastError()));
        QJsonParseError err{};
        const QJsonDocument doc = QJsonDocument::fromJson(readAll(json), &err);
        QCOMPARE(err.error, QJsonParseError::NoError);
        QVERIFY(doc.isObject());

        // A failed export says why and leaves the worksheet and its file alone.
        const QString nowhere = dir.filePath(QStringLiteral("no-such-folder/ledger.csv"));
        QVERIFY(!w.exportLedger(nowhere));
        QVERIFY(!w.lastError().isEmpty());
        QVERIFY(w.lastError().contains(QStringLiteral("no-such-folder")));
        QVERIFY(!w.exportReport(file, PageSize::A4));  // never over the worksheet itself
        QCOMPARE(readAll(file), canonicalBase());
        QCOMPARE(writeProject(w.document()->project()), before);
        QVERIFY(!w.document()->isModified());
        QCOMPARE(w.document()->filePath(), file);
    }

    void compareShowsTheChangedFieldAndTheResults() {
        QTemporaryDir dir;
        const QString older = dir.filePath(QStringLiteral("rev-a.hchain"));
        writeBytes(older, canonicalBase());
        Project after = parse(kBaseText);
        after.steps[0].source->T = Quantity{"180 degC", *parseQuantity("180 degC", Dimension::Temperature)};
        MainWindow w;
        w.setInteractive(false);
        w.setAutosaveFolder(dir.filePath(QStringLiteral("autosave")));
        w.document()->reset(after);
        QVERIFY(w.quickAddStep(QStringLiteral("throttle to 2 bar")));

        std::unique_ptr<gui::CompareDialog> d(w.compareWith(older));
        QVERIFY2(d, qPrintable(w.lastError()));
        const QString text = d->visibleText();
        // The field as typed, before and after.
        QVERIFY2(text.contains(QStringLiteral("source.T | 160 degC | 180 degC")), qPrintable(text));
        QVERIFY2(text.contains(QStringLiteral("throttle — added")), qPrintable(text));
        // The preheat step's S_gen moved; the numbers shown are core's solve of
        // each revision in the display units.
        const SequenceResult ra = solve(parse(kBaseText)), rb = solve(w.document()->project());
        const Dimension s = view::entropyDimension(SystemKind::SteadyFlow);
        const QString expect = QStringLiteral(" | %1 | %2 | ")
                                   .arg(view::formatDisplay(ra.steps[0].Sgen, s, UnitSystem::MetricEngineering),
                                        view::formatDisplay(rb.steps[0].Sgen, s, UnitSystem::MetricEngineering));
        QVERIFY2(text.contains(expect), qPrintable(expect + QStringLiteral("\n") + text));
        QVERIFY(d->diff().resultsCompared);

        // A file that cannot be read is refused with its reason.
        QVERIFY(!w.compareWith(dir.filePath(QStringLiteral("missing.hchain"))));
        QVERIFY(w.lastError().contains(QStringLiteral("missing.hchain")));
    }
};

QTEST_MAIN(SafetyTest)
#include "safety_test.moc"
