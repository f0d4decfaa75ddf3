#pragma once
// Watches the worksheet's file for changes by other programs and shows the
// notice strip above the chain (Reload / Keep mine). The document decides
// what counts as a change (ProjectDocument::fileChangedOnDisk).
#include <QFileSystemWatcher>
#include <QFrame>
#include <QLabel>
#include <QPushButton>
#include <QTimer>

#include "document.hpp"

namespace heatchain::gui {

class DiskWatch : public QFrame {
    Q_OBJECT
public:
    explicit DiskWatch(ProjectDocument* doc, QWidget* parent = nullptr);

    // Follows the document's path (after open, save or an atomic replace).
    void watchFile();
    // Looks now: shows or hides the notice.
    void checkNow();
    bool noticeShown() const { return !isHidden(); }
    // The change in words, for the question Save asks before overwriting.
    QString describeChange() const;

signals:
    void reloadRequested();

private:
    ProjectDocument* doc_;
    QFileSystemWatcher watcher_;
    QTimer settle_;
    QLabel* text_;
    QPushButton* reload_;
    QPushButton* dismiss_;
};

}  // namespace heatchain::gui
