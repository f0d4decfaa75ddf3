#pragma once
// File ▸ Export: the PDF report, the T–s and T–Q charts, the ledger (CSV) and
// the results (JSON) of the worksheet as it is now. Never changes the
// worksheet; refuses to write over a worksheet file.
#include <QMenu>
#include <QObject>
#include <QWidget>

#include "document.hpp"
#include "heatchain/report.hpp"
#include "questions.hpp"

namespace heatchain::gui {

class Exporter : public QObject {
    Q_OBJECT
public:
    Exporter(ProjectDocument* doc, QWidget* dialogParent, WindowHooks hooks);

    bool exportReport(const QString& path, PageSize pageSize);
    bool exportChartImage(const QString& path, ChartKind kind);
    bool exportLedger(const QString& path);
    bool exportResults(const QString& path);

    // The same, with a file dialog first.
    void reportDialog();
    void chartDialog(ChartKind kind);
    void dataDialog(bool csv);
    // File ▸ Export's entries, each opening its dialog.
    void fillMenu(QMenu* menu);

private:
    bool finish(const Status& st, const QString& what, const QString& path);
    bool refuseWorksheetPath(const QString& path);
    QString startPath(const QString& suffix) const;

    ProjectDocument* doc_;
    QWidget* dialogParent_;
    WindowHooks hooks_;
};

}  // namespace heatchain::gui
