#pragma once
// Two revisions of a worksheet side by side: what the inputs say before and
// after (as typed), and how each step's results and the totals moved, in the
// display units of the newer revision. The comparison is core's
// (heatchain/project_diff.hpp); this only lays it out.
#include <QDialog>
#include <QLabel>
#include <QTreeWidget>

#include "document.hpp"
#include "heatchain/project_diff.hpp"

namespace heatchain::gui {

struct Revision {
    Project project;
    SequenceResult result;
    QString name;  // shown in the header: file name or "this worksheet"
};

class CompareDialog : public QDialog {
    Q_OBJECT
public:
    CompareDialog(Revision before, Revision after, QWidget* parent = nullptr);

    // The revision in `path` (before) against the worksheet as it is now
    // (after); null with the reason in `error` when the file cannot be read.
    static CompareDialog* againstFile(const ProjectDocument& doc, const QString& path, QString* error,
                                      QWidget* parent = nullptr);

    const ProjectDiff& diff() const { return diff_; }
    QTreeWidget* tree() const { return tree_; }
    // Every row of the tree as "col0 | col1 | col2 | col3" lines (tests, clipboard).
    QString visibleText() const;

private:
    void rebuild();
    void swap();

    Revision before_, after_;
    ProjectDiff diff_;
    QLabel* header_;
    QLabel* summary_;
    QTreeWidget* tree_;
};

}  // namespace heatchain::gui
