#include "autosave.hpp"

#include <QDir>
#include <QFile>
#include <QFileInfo>
#include <QJsonDocument>
#include <QJsonObject>
#include <QStandardPaths>
#include <QUuid>
#include <algorithm>
#include <filesystem>

#include "heatchain/project_file.hpp"
#include "heatchain/streams.hpp"

namespace heatchain::gui {

namespace {
std::filesystem::path fsPath(const QString& p) { return std::filesystem::path(p.toStdString()); }
}  // namespace

AutosaveStore::AutosaveStore(QString folder)
    : folder_(std::move(folder)), session_(QUuid::createUuid().toString(QUuid::WithoutBraces)) {}

AutosaveStore::~AutosaveStore() = default;

QString AutosaveStore::defaultFolder() {
    return QStandardPaths::writableLocation(QStandardPaths::AppDataLocation) + QStringLiteral("/autosave");
}

QString AutosaveStore::path(const QString& session, const char* ext) const {
    return folder_ + QLatin1Char('/') + session + QLatin1String(ext);
}

Status AutosaveStore::write(const StreamSet& worksheet, const QString& originalPath) {
    const std::string bytes = writeStreamSet(worksheet);
    if (bytes == lastBytes_) return Ok{};
    if (!QDir().mkpath(folder_)) return makeError("cannot create the autosave folder", folder_.toStdString());
    if (!lock_) {
        // Held for the life of the session; a lock left by a dead process is
        // recognised by its process id, never by its age (a session may run
        // for days), hence no stale time.
        lock_ = std::make_unique<QLockFile>(path(session_, ".lock"));
        lock_->setStaleLockTime(0);
        if (!lock_->tryLock(0)) {
            lock_.reset();
            return makeError("cannot take the autosave lock", path(session_, ".lock").toStdString());
        }
    }
    if (auto st = writeFileAtomically(fsPath(path(session_, ".hchain")), bytes, /*keepBackup=*/false); !st) return st;
    QJsonObject side{{QStringLiteral("original"), originalPath},
                     {QStringLiteral("title"), QString::fromStdString(worksheet.shared.meta.title)},
                     {QStringLiteral("saved"), QDateTime::currentDateTimeUtc().toString(Qt::ISODateWithMs)}};
    const QByteArray json = QJsonDocument(side).toJson();
    if (auto st = writeFileAtomically(fsPath(path(session_, ".json")), std::string_view(json.constData(), std::size_t(json.size())),
                                      /*keepBackup=*/false);
        !st)
        return st;
    lastBytes_ = bytes;
    return Ok{};
}

void AutosaveStore::remove() {
    QFile::remove(path(session_, ".json"));
    QFile::remove(path(session_, ".hchain"));
    lastBytes_.clear();
}

QList<AutosaveEntry> AutosaveStore::orphans() const {
    QList<AutosaveEntry> out;
    const QDir dir(folder_);
    for (const QFileInfo& side : dir.entryInfoList({QStringLiteral("*.json")}, QDir::Files)) {
        const QString id = side.completeBaseName();
        if (id == session_) continue;
        const QString sheet = path(id, ".hchain");
        if (!QFileInfo::exists(sheet)) continue;
        // Free lock: its session is gone. A running session (this process or
        // another window) holds it.
        QLockFile probe(path(id, ".lock"));
        probe.setStaleLockTime(0);
        if (!probe.tryLock(0)) continue;
        probe.unlock();
        QFile f(side.filePath());
        if (!f.open(QIODevice::ReadOnly)) continue;
        const QJsonObject o = QJsonDocument::fromJson(f.readAll()).object();
        AutosaveEntry e{id, sheet, o.value(QStringLiteral("original")).toString(),
                        o.value(QStringLiteral("title")).toString(),
                        QDateTime::fromString(o.value(QStringLiteral("saved")).toString(), Qt::ISODateWithMs).toLocalTime()};
        if (!e.saved.isValid()) e.saved = QFileInfo(sheet).lastModified();
        out << e;
    }
    std::sort(out.begin(), out.end(), [](const AutosaveEntry& a, const AutosaveEntry& b) { return a.saved > b.saved; });
    return out;
}

Result<StreamSet> AutosaveStore::load(const AutosaveEntry& entry) { return loadStreamSet(fsPath(entry.worksheetFile)); }

void AutosaveStore::discard(const AutosaveEntry& entry) {
    const QString base = QFileInfo(entry.worksheetFile).path() + QLatin1Char('/') + entry.session;
    QFile::remove(base + QStringLiteral(".json"));
    QFile::remove(base + QStringLiteral(".hchain"));
    QFile::remove(base + QStringLiteral(".lock"));
}

}  // namespace heatchain::gui
