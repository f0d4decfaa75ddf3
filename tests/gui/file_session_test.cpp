// FileSession on its own, without a main window: a failed save loses
// nothing (the file on disk keeps its bytes, the worksheet keeps its edit and
// its modified flag), and a file that cannot be read is refused with the
// line and column of what is wrong while the open worksheet stays as it was.
// The save failures are the operating system's, simulated through core's
// test seam for the atomic write.
#include <QFile>
#include <QSignalSpy>
#include <QStandardPaths>
#include <QTemporaryDir>
#include <QtTest>

#include "../../core/src/atomic_save_faults.hpp"
#include "commands.hpp"
#include "file_session.hpp"

using namespace heatchain;
using namespace heatchain::gui;

namespace {

// A one-step worksheet of our own, one member per line so that a test can
// name the line and column of any value by construction.
QStringList worksheetLines(const QString& heatTarget) {
    return {
        QStringLiteral("{"),
        QStringLiteral("  \"format\": \"heatchain-project\","),
        QStringLiteral("  \"version\": 1,"),
        QStringLiteral("  \"meta\": {\"title\": \"Feed heater\"},"),
        QStringLiteral("  \"system\": \"steady-flow\","),
        QStringLiteral("  \"model\": \"reference\","),
        QStringLiteral("  \"substance\": \"water\","),
        QStringLiteral("  \"basis\": {\"massFlow\": \"1 kg/s\"},"),
        QStringLiteral("  \"start\": {\"T\": \"40 degC\", \"P\": \"3 bar\"},"),
        QStringLiteral("  \"steps\": ["),
        QStringLiteral("    {\"id\": \"h1\", \"kind\": \"heat\", \"to\": {\"T\": \"%1\"}, \"source\": {\"T\": \"90 degC\"}}")
            .arg(heatTarget),
        QStringLiteral("  ]"),
        QStringLiteral("}"),
    };
}

QByteArray bytesOf(const QString& path) {
    QFile f(path);
    if (!f.open(QIODevice::ReadOnly)) return {};
    return f.readAll();
}

bool writeBytes(const QString& path, const QByteArray& bytes) {
    QFile f(path);
    return f.open(QIODevice::WriteOnly | QIODevice::Truncate) && f.write(bytes) == bytes.size();
}

// What the session told the window.
struct Heard {
    QStringList errors;
    QStringList questions;
    Answer answer = Answer::Cancel;
};

}  // namespace

class FileSessionTest : public QObject {
    Q_OBJECT

    QTemporaryDir dir_;
    Heard heard_;
    std::unique_ptr<ProjectDocument> doc_;
    std::unique_ptr<QWidget> window_;
    FileSession* session_ = nullptr;

    WindowHooks hooks() {
        return {[this](Question, const QString& text) {
                    heard_.questions << text;
                    return heard_.answer;
                },
                [] { return false; },  // the session asks its own question
                [this](const QString&, const QString& text) { heard_.errors << text; },
                [](const QString&, int) {},
                [this] { heard_.errors.clear(); }};
    }

    QString goodFile() {
        const QString path = dir_.filePath(QStringLiteral("feed.hchain"));
        writeBytes(path, worksheetLines(QStringLiteral("50 degC")).join(QLatin1Char('\n')).toUtf8() + '\n');
        return path;
    }

    // Gives the open worksheet a new title through the undo stack, as the
    // settings dialog does.
    void retitle(const std::string& title) {
        Project p = doc_->project();
        p.meta.title = title;
        doc_->undoStack()->push(new EditProjectSettings(doc_.get(), std::move(p), QStringLiteral("retitle")));
    }

private slots:
    void initTestCase() {
        QStandardPaths::setTestModeEnabled(true);
        QCoreApplication::setOrganizationName(QStringLiteral("HeatchainFileSessionTest"));
        QVERIFY(dir_.isValid());
    }

    void init() {
        heard_ = {};
        detail::atomicSaveFaultsForTests() = {};
        doc_ = std::make_unique<ProjectDocument>();
        window_ = std::make_unique<QWidget>();
        session_ = new FileSession(doc_.get(), new DiskWatch(doc_.get(), window_.get()), hooks(), window_.get());
        session_->autosave()->setFolder(dir_.filePath(QStringLiteral("autosave")));
        session_->autosave()->stop();
    }

    void cleanup() {
        detail::atomicSaveFaultsForTests() = {};
        window_.reset();  // the session and its watch go with it, before the document
        doc_.reset();
    }

    void failedSaveKeepsFileAndEdit_data() {
        QTest::addColumn<int>("stage");
        QTest::newRow("disk full mid-write") << 0;
        QTest::newRow("fsync fails") << 1;
        QTest::newRow("rename refused") << 2;
    }

    void failedSaveKeepsFileAndEdit() {
        QFETCH(int, stage);
        const QString path = goodFile();
        const QByteArray before = bytesOf(path);
        QVERIFY(session_->open(path));
        QVERIFY(!doc_->isModified());
        retitle("Feed heater, revised");
        QVERIFY(doc_->isModified());

        detail::AtomicSaveFaults& faults = detail::atomicSaveFaultsForTests();
        if (stage == 0) faults.failWriteAfterBytes = 10;
        if (stage == 1) faults.failSync = true;
        if (stage == 2) faults.failRename = true;
        QVERIFY(!session_->saveTo(path));

        QCOMPARE(bytesOf(path), before);  // the user's file, byte for byte
        QVERIFY(doc_->isModified());      // the edit is still unsaved, and says so
        QCOMPARE(doc_->project().meta.title, std::string("Feed heater, revised"));
        QCOMPARE(doc_->filePath(), path);
        QCOMPARE(heard_.errors.size(), 1);
        QVERIFY2(heard_.errors.front().contains(QStringLiteral("not saved")), qPrintable(heard_.errors.front()));
        // No temporary file is left beside it.
        const QStringList left = QDir(dir_.path()).entryList(QStringList{QStringLiteral(".feed.hchain.saving-*")},
                                                            QDir::Files | QDir::Hidden);
        QVERIFY2(left.isEmpty(), qPrintable(left.join(QLatin1Char(' '))));

        // The disk recovers: the same edit saves, and reads back.
        faults = {};
        QVERIFY(session_->saveTo(path));
        QVERIFY(!doc_->isModified());
        QVERIFY(bytesOf(path) != before);
        ProjectDocument again;
        QVERIFY(again.open(path));
        QCOMPARE(again.project().meta.title, std::string("Feed heater, revised"));
    }

    // Asked whether to save before a new worksheet, the user says Save; the
    // save fails, so the worksheet must not be replaced.
    void failedSaveBeforeDiscardKeepsWorksheet() {
        const QString path = goodFile();
        QVERIFY(session_->open(path));
        retitle("Edited");
        heard_.answer = Answer::Save;
        detail::atomicSaveFaultsForTests().failRename = true;
        QVERIFY(!session_->confirmDiscard());
        session_->newWorksheet();
        QCOMPARE(heard_.questions.size(), 2);  // asked each time, never assumed
        QCOMPARE(doc_->project().meta.title, std::string("Edited"));
        QCOMPARE(doc_->project().steps.size(), std::size_t(1));
        QVERIFY(doc_->isModified());
        QCOMPARE(doc_->filePath(), path);
    }

    // A value the reader refuses: the error names the file, the line and the
    // column of that value (known here from the text written), and nothing
    // of the open worksheet is lost.
    void badValueNamesLineAndColumn() {
        const QString good = goodFile();
        QVERIFY(session_->open(good));
        retitle("Unsaved work");
        const int undoDepth = doc_->undoStack()->count();

        const QStringList lines = worksheetLines(QStringLiteral("warm"));
        const QString bad = dir_.filePath(QStringLiteral("broken.hchain"));
        QVERIFY(writeBytes(bad, lines.join(QLatin1Char('\n')).toUtf8()));
        const int line = 11;  // the step's line, 1-based
        const int column = int(lines[line - 1].indexOf(QStringLiteral("\"warm\""))) + 1;
        QVERIFY(column > 1);

        QSignalSpy opened(session_, &FileSession::opened);
        QVERIFY(!session_->open(bad));
        QCOMPARE(opened.count(), 0);
        QCOMPARE(heard_.errors.size(), 1);
        const QString error = heard_.errors.front();
        QVERIFY2(error.contains(QStringLiteral("broken.hchain")), qPrintable(error));
        QVERIFY2(error.contains(QStringLiteral("(line %1, column %2)").arg(line).arg(column)), qPrintable(error));
        QVERIFY2(error.contains(QStringLiteral("unchanged")), qPrintable(error));

        QCOMPARE(doc_->filePath(), good);
        QCOMPARE(doc_->project().meta.title, std::string("Unsaved work"));
        QVERIFY(doc_->isModified());
        QCOMPARE(doc_->undoStack()->count(), undoDepth);
    }

    // Broken JSON: the reader stops on the line of the missing comma.
    void brokenJsonNamesTheLine() {
        const QString good = goodFile();
        QVERIFY(session_->open(good));
        QStringList lines = worksheetLines(QStringLiteral("50 degC"));
        lines[6].chop(1);  // "substance": "water" without its comma; line 8 then starts unexpectedly
        const QString bad = dir_.filePath(QStringLiteral("nocomma.hchain"));
        QVERIFY(writeBytes(bad, lines.join(QLatin1Char('\n')).toUtf8()));
        QVERIFY(!session_->open(bad));
        QCOMPARE(heard_.errors.size(), 1);
        QVERIFY2(heard_.errors.front().contains(QStringLiteral("(line 8, column ")), qPrintable(heard_.errors.front()));
        QCOMPARE(doc_->filePath(), good);
        QVERIFY(!doc_->isModified());
        QCOMPARE(doc_->project().meta.title, std::string("Feed heater"));

        // A good open afterwards clears the error the window keeps.
        QVERIFY(session_->open(good));
        QVERIFY(heard_.errors.isEmpty());
    }
};

QTEST_MAIN(FileSessionTest)
#include "file_session_test.moc"
