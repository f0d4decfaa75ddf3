#pragma once
// The worksheet's life as a file: open, save, save as, new, reload from disk,
// and the question before unsaved work is dropped. Watching the file on disk
// (DiskWatch) and autosave with recovery (AutosaveKeeper) hang off it, since
// each open and save changes what they guard. The path and the modified flag
// themselves are the document's (ProjectDocument::filePath, isModified);
// this class decides when they change.
#include <QMenu>
#include <QObject>
#include <QWidget>

#include "disk_watch.hpp"
#include "document.hpp"
#include "questions.hpp"
#include "recovery.hpp"

namespace heatchain::gui {

class FileSession : public QObject {
    Q_OBJECT
public:
    // `watch` is the notice strip the window lays out; `dialogParent` carries
    // the file dialogs.
    FileSession(ProjectDocument* doc, DiskWatch* watch, WindowHooks hooks, QWidget* dialogParent);

    // Reads `path`; on error the worksheet stays exactly as it was and the
    // error names the file and what is wrong in it.
    bool open(const QString& path);
    // Writes to `path` atomically; on error the file on disk and the
    // worksheet's modified flag stay as they were.
    bool saveTo(const QString& path);
    // File ▸ Save: asks before overwriting a file someone else changed.
    bool save();
    bool saveAsDialog();
    // Asks about unsaved changes; true when the worksheet may be replaced.
    bool confirmDiscard();
    void newWorksheet();
    void openDialog();
    void reloadFromDisk();
    // The folder File ▸ Open starts in.
    QString openDialogFolder() const;
    void fillRecentMenu(QMenu* menu);
    // The window closed cleanly: this session's autosave has nothing left to protect.
    void closedCleanly();

    DiskWatch* diskWatch() const { return watch_; }
    AutosaveKeeper* autosave() const { return keeper_; }

signals:
    // A worksheet was read from a file (open, reload, recent).
    void opened();

private:
    ProjectDocument* doc_;
    DiskWatch* watch_;
    WindowHooks hooks_;
    QWidget* dialogParent_;
    AutosaveKeeper* keeper_;
    bool bakMentioned_ = false;
};

}  // namespace heatchain::gui
