#include "file_session.hpp"

#include <QFileDialog>
#include <QFileInfo>

#include "heatchain_view/format.hpp"
#include "project_edit.hpp"
#include "recent_files.hpp"

namespace heatchain::gui {

namespace {
using heatchain::view::qs;
}  // namespace

FileSession::FileSession(ProjectDocument* doc, DiskWatch* watch, WindowHooks hooks, QWidget* dialogParent)
    : QObject(dialogParent), doc_(doc), watch_(watch), hooks_(std::move(hooks)), dialogParent_(dialogParent) {
    // Recovering an autosave replaces the worksheet: it asks this session's
    // question about unsaved work, whatever the window passed.
    hooks_.confirmDiscard = [this] { return confirmDiscard(); };
    keeper_ = new AutosaveKeeper(doc_, hooks_, this);
    connect(watch_, &DiskWatch::reloadRequested, this, &FileSession::reloadFromDisk);
}

bool FileSession::open(const QString& path) {
    auto st = doc_->open(path);
    if (!st) {
        hooks_.reportError(tr("Cannot open worksheet"),
                           tr("%1 could not be opened. The current worksheet is unchanged.\n\n%2")
                               .arg(QFileInfo(path).fileName(), view::escapedText(st.error().text())));
        return false;
    }
    hooks_.clearError();
    recent::remember(path);
    emit opened();
    return true;
}

bool FileSession::saveTo(const QString& path) {
    const bool replacing = QFileInfo::exists(path);
    auto st = doc_->saveAs(path);
    if (!st) {
        hooks_.reportError(tr("Cannot save worksheet"),
                           tr("The worksheet was not saved; the file on disk is unchanged.\n\n%1").arg(qs(st.error().text())));
        return false;
    }
    recent::remember(path);
    watch_->hide();
    watch_->watchFile();
    // Saved: nothing left to lose, so no autosave to recover from.
    keeper_->forget();
    // Save keeps the version it replaces as <file>.bak; say so once a session.
    if (replacing && !bakMentioned_) {
        bakMentioned_ = true;
        hooks_.status(tr("Saved %1. The version it replaced is kept as %2.bak (once, overwritten at each save).")
                          .arg(path, QFileInfo(path).fileName()),
                      10000);
    } else {
        hooks_.status(tr("Saved %1").arg(path), 4000);
    }
    return true;
}

bool FileSession::save() {
    if (doc_->filePath().isEmpty()) return saveAsDialog();
    if (doc_->fileChangedOnDisk()) {
        // Never overwrite someone else's change without saying so.
        switch (hooks_.ask(Question::ChangedOnDisk, watch_->describeChange())) {
        case Answer::Overwrite: break;
        case Answer::SaveAs: return saveAsDialog();
        default: return false;
        }
    }
    return saveTo(doc_->filePath());
}

bool FileSession::saveAsDialog() {
    QString path = QFileDialog::getSaveFileName(dialogParent_, tr("Save worksheet as"), doc_->filePath(),
                                                tr("Heatchain worksheets (*.hchain)"));
    if (path.isEmpty()) return false;
    if (!path.endsWith(QStringLiteral(".hchain"))) path += QStringLiteral(".hchain");
    return saveTo(path);
}

bool FileSession::confirmDiscard() {
    if (!doc_->isModified()) return true;
    const QString name = doc_->filePath().isEmpty() ? tr("The new worksheet")
                                                    : QStringLiteral("“%1”").arg(QFileInfo(doc_->filePath()).fileName());
    const Answer a = hooks_.ask(Question::UnsavedChanges,
                                tr("%1 has changes that are not saved.\n\nSave them first? Without saving, the changes are lost.").arg(name));
    if (a == Answer::Save) return save();
    return a == Answer::Discard;
}

void FileSession::newWorksheet() {
    if (!confirmDiscard()) return;
    auto p = newProject();
    if (!p) {
        hooks_.reportError(tr("Cannot start a worksheet"), qs(p.error().text()));
        return;
    }
    doc_->reset(std::move(p.value()));
}

QString FileSession::openDialogFolder() const {
    // The folder of the last worksheet opened or saved, then the open
    // worksheet's, then the samples.
    if (const QString last = recent::lastFolder(); !last.isEmpty()) return last;
    if (!doc_->filePath().isEmpty()) return QFileInfo(doc_->filePath()).path();
    return QStringLiteral(HEATCHAIN_SAMPLES_DIR);
}

void FileSession::openDialog() {
    if (!confirmDiscard()) return;
    const QString path = QFileDialog::getOpenFileName(dialogParent_, tr("Open worksheet"), openDialogFolder(),
                                                      tr("Heatchain worksheets (*.hchain);;All files (*)"));
    if (!path.isEmpty()) open(path);
}

void FileSession::reloadFromDisk() {
    const QString path = doc_->filePath();
    if (path.isEmpty()) return;
    if (open(path)) {
        watch_->hide();
        hooks_.status(tr("Reloaded %1 from disk").arg(QFileInfo(path).fileName()), 4000);
    }
}

void FileSession::fillRecentMenu(QMenu* menu) {
    recent::fillMenu(menu, [this](const QString& path) {
        if (confirmDiscard()) open(path);
    });
}

void FileSession::closedCleanly() {
    keeper_->stop();
    keeper_->forget();
}

}  // namespace heatchain::gui
