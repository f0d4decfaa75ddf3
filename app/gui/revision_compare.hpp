#pragma once
// File ▸ Compare with…: picks the other revision's file and opens the
// comparison (CompareDialog) of it against the worksheet as it is now.
#include <QObject>
#include <QWidget>

#include "document.hpp"
#include "questions.hpp"

namespace heatchain::gui {

class CompareDialog;

class RevisionCompare : public QObject {
    Q_OBJECT
public:
    RevisionCompare(ProjectDocument* doc, QWidget* dialogParent, WindowHooks hooks);

    // The worksheet (after) against the revision in `path` (before), unshown;
    // null, with the error reported, when that file cannot be read.
    CompareDialog* compareWith(const QString& path);
    // The same, shown, closing by itself.
    void show(const QString& path);
    // With a file dialog first.
    void chooseAndShow();

private:
    ProjectDocument* doc_;
    QWidget* dialogParent_;
    WindowHooks hooks_;
};

}  // namespace heatchain::gui
