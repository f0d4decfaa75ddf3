#pragma once
// Never lose a worksheet: a copy of the open worksheet written every so
// often to the application's data folder, and the copies a session left
// behind when it did not close cleanly.
//
// One session keeps three files in the folder, named by a session id:
//   <id>.hchain   the worksheet as Save would write it
//   <id>.json     where it came from (original path, title, time)
//   <id>.lock     held (QLockFile) while the session runs
// An autosave whose lock nobody holds belongs to a session that ended
// without a clean close: a crash, a kill, a power cut.
#include <QDateTime>
#include <QList>
#include <QLockFile>
#include <QString>
#include <memory>
#include <string>

#include "heatchain/project.hpp"
#include "heatchain/streams.hpp"
#include "heatchain/result.hpp"

namespace heatchain::gui {

struct AutosaveEntry {
    QString session;
    QString worksheetFile;  // <id>.hchain
    QString originalPath;   // empty: the worksheet was never saved
    QString title;
    QDateTime saved;        // local time of the autosave
};

class AutosaveStore {
public:
    // `folder` is created when the first autosave is written.
    explicit AutosaveStore(QString folder);
    ~AutosaveStore();  // releases the lock, keeps the files (only a clean close removes them)
    AutosaveStore(const AutosaveStore&) = delete;
    AutosaveStore& operator=(const AutosaveStore&) = delete;

    // <AppDataLocation>/autosave
    static QString defaultFolder();
    const QString& folder() const { return folder_; }
    const QString& session() const { return session_; }

    // Writes the worksheet and its side file atomically. Writes nothing when
    // the bytes equal the last autosave of this session.
    Status write(const StreamSet& worksheet, const QString& originalPath);
    bool hasAutosave() const { return !lastBytes_.empty(); }
    // Removes this session's autosave (clean close, or nothing left to lose).
    void remove();

    // Autosaves of sessions that are not running, newest first.
    QList<AutosaveEntry> orphans() const;
    static Result<StreamSet> load(const AutosaveEntry& entry);
    static void discard(const AutosaveEntry& entry);

private:
    QString path(const QString& session, const char* ext) const;
    QString folder_;
    QString session_;
    std::unique_ptr<QLockFile> lock_;
    std::string lastBytes_;
};

}  // namespace heatchain::gui
