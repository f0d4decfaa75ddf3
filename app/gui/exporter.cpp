#include "exporter.hpp"
#include "heatchain_view/format.hpp"

#include <QAction>
#include <QDir>
#include <QFileDialog>
#include <QFileInfo>

namespace heatchain::gui {

namespace {
using heatchain::view::qs;
}  // namespace

Exporter::Exporter(ProjectDocument* doc, QWidget* dialogParent, WindowHooks hooks)
    : QObject(dialogParent), doc_(doc), dialogParent_(dialogParent), hooks_(std::move(hooks)) {}

QString Exporter::startPath(const QString& suffix) const {
    const QString path = doc_->filePath();
    if (path.isEmpty()) return QDir::home().filePath(QStringLiteral("worksheet") + suffix);
    const QFileInfo info(path);
    return info.dir().filePath(info.completeBaseName() + suffix);
}

bool Exporter::refuseWorksheetPath(const QString& path) {
    const QFileInfo out(path);
    const bool own = !doc_->filePath().isEmpty() && out.absoluteFilePath() == QFileInfo(doc_->filePath()).absoluteFilePath();
    if (own || out.suffix().compare(QStringLiteral("hchain"), Qt::CaseInsensitive) == 0) {
        hooks_.reportError(tr("Cannot export"), tr("%1 is a worksheet file; an export never writes over a worksheet.").arg(path));
        return true;
    }
    return false;
}

bool Exporter::finish(const Status& st, const QString& what, const QString& path) {
    if (!st) {
        hooks_.reportError(tr("Cannot export %1").arg(what),
                    tr("Nothing was written to %1; the worksheet is unchanged.\n\n%2").arg(path, qs(st.error().text())));
        return false;
    }
    hooks_.clearError();
    hooks_.status(tr("Exported %1 to %2").arg(what, path), 6000);
    return true;
}

bool Exporter::exportReport(const QString& path, PageSize pageSize) {
    if (refuseWorksheetPath(path)) return false;
    // The report checksums the worksheet file. With unsaved edits (or a file
    // someone else changed) that file is not what the report shows, so the
    // report checksums the worksheet as it would be saved instead.
    const bool fileMatches = !doc_->filePath().isEmpty() && !doc_->isModified() && !doc_->fileChangedOnDisk();
    const std::string file = fileMatches ? doc_->filePath().toStdString() : std::string();
    // A worksheet of several streams: every stream and their heat recovery.
    const bool ok = finish(writeReportPdf(doc_->streams(), doc_->results(), file, path.toStdString(), ReportOptions{pageSize}),
                                 tr("the report"), path);
    if (ok && !fileMatches && !doc_->filePath().isEmpty())
        hooks_.status(tr("Exported the report to %1. The worksheet differs from its file, so the report "
                                    "carries the checksum of what you see, not of the file.").arg(path), 10000);
    return ok;
}

bool Exporter::exportChartImage(const QString& path, ChartKind kind) {
    if (refuseWorksheetPath(path)) return false;
    return finish(exportChart(doc_->project(), doc_->result(), kind, path.toStdString()),
                        kind == ChartKind::TemperatureEntropy ? tr("the T–s chart") : tr("the T–Q chart"), path);
}

bool Exporter::exportLedger(const QString& path) {
    if (refuseWorksheetPath(path)) return false;
    return finish(exportLedgerCsv(doc_->project(), doc_->result(), path.toStdString()), tr("the ledger"), path);
}

bool Exporter::exportResults(const QString& path) {
    if (refuseWorksheetPath(path)) return false;
    return finish(exportResultsJson(doc_->project(), doc_->result(), path.toStdString()), tr("the results"), path);
}

void Exporter::reportDialog() {
    const QString a4 = tr("PDF report, A4 (*.pdf)"), letter = tr("PDF report, US Letter (*.pdf)");
    QString filter = doc_->project().displayUnits == UnitSystem::USCustomary ? letter : a4;
    QString path = QFileDialog::getSaveFileName(dialogParent_, tr("Export report"), startPath(QStringLiteral("-report.pdf")),
                                                a4 + QStringLiteral(";;") + letter, &filter);
    if (path.isEmpty()) return;
    if (QFileInfo(path).suffix().isEmpty()) path += QStringLiteral(".pdf");
    exportReport(path, filter == letter ? PageSize::Letter : PageSize::A4);
}

void Exporter::chartDialog(ChartKind kind) {
    const QString png = tr("PNG image (*.png)"), svg = tr("SVG drawing (*.svg)");
    QString filter = png;
    const QString suffix = kind == ChartKind::TemperatureEntropy ? QStringLiteral("-Ts.png") : QStringLiteral("-TQ.png");
    QString path = QFileDialog::getSaveFileName(dialogParent_, kind == ChartKind::TemperatureEntropy ? tr("Export T–s chart") : tr("Export T–Q chart"),
                                                startPath(suffix), png + QStringLiteral(";;") + svg, &filter);
    if (path.isEmpty()) return;
    const QString ext = QFileInfo(path).suffix().toLower();
    if (ext != QStringLiteral("png") && ext != QStringLiteral("svg"))
        path += filter == svg ? QStringLiteral(".svg") : QStringLiteral(".png");
    exportChartImage(path, kind);
}

void Exporter::dataDialog(bool csv) {
    const QString suffix = csv ? QStringLiteral("-ledger.csv") : QStringLiteral("-results.json");
    QString path = QFileDialog::getSaveFileName(dialogParent_, csv ? tr("Export ledger") : tr("Export results"), startPath(suffix),
                                                csv ? tr("CSV table (*.csv)") : tr("JSON (*.json)"));
    if (path.isEmpty()) return;
    if (QFileInfo(path).suffix().isEmpty()) path += csv ? QStringLiteral(".csv") : QStringLiteral(".json");
    if (csv) exportLedger(path);
    else exportResults(path);
}

void Exporter::fillMenu(QMenu* menu) {
    menu->addAction(tr("&Report (PDF)…"), this, &Exporter::reportDialog)->setShortcut(QKeySequence(Qt::CTRL | Qt::Key_E));
    menu->addSeparator();
    menu->addAction(tr("&T–s chart (PNG or SVG)…"), this, [this] { chartDialog(ChartKind::TemperatureEntropy); });
    menu->addAction(tr("T–&Q chart (PNG or SVG)…"), this, [this] { chartDialog(ChartKind::TemperatureDuty); });
    menu->addSeparator();
    menu->addAction(tr("&Ledger as CSV…"), this, [this] { dataDialog(true); });
    menu->addAction(tr("Results as &JSON…"), this, [this] { dataDialog(false); });
}

}  // namespace heatchain::gui
