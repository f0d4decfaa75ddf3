#include "recovery.hpp"
#include "heatchain_view/format.hpp"

#include <QDateTime>
#include <QFile>
#include <QFileInfo>
#include <QLocale>
#include <filesystem>

#include "heatchain/project_file.hpp"
#include "heatchain/streams.hpp"

namespace heatchain::gui {

namespace {
using heatchain::view::qs;
}  // namespace

AutosaveKeeper::AutosaveKeeper(ProjectDocument* doc, WindowHooks hooks, QObject* parent)
    : QObject(parent), doc_(doc), hooks_(std::move(hooks)),
      store_(std::make_unique<AutosaveStore>(AutosaveStore::defaultFolder())) {
    // A minute of work is the most a crash can take.
    timer_.setInterval(60 * 1000);
    connect(&timer_, &QTimer::timeout, this, &AutosaveKeeper::autosaveNow);
    timer_.start();
}

void AutosaveKeeper::setFolder(const QString& folder) {
    if (store_) store_->remove();
    store_ = std::make_unique<AutosaveStore>(folder);
}

void AutosaveKeeper::autosaveNow() {
    // A saved, unedited worksheet is safe in its file.
    if (!doc_->isModified() && !doc_->filePath().isEmpty()) {
        store_->remove();
        return;
    }
    // A blank new worksheet holds nothing to lose.
    if (!doc_->isModified() && doc_->project().steps.empty()) return;
    if (auto st = store_->write(doc_->streams(), doc_->filePath()); !st)
        hooks_.status(tr("Autosave failed: %1").arg(qs(st.error().text())), 8000);
}

bool AutosaveKeeper::offerRecovery() {
    QList<AutosaveEntry> left = store_->orphans();
    // An autosave that says exactly what its file says holds nothing to
    // recover: drop it without a question.
    for (auto it = left.begin(); it != left.end();) {
        QFile sheet(it->worksheetFile);
        auto original = it->originalPath.isEmpty() ? Result<StreamSet>(makeError("never saved"))
                                                   : loadStreamSet(std::filesystem::path(it->originalPath.toStdString()));
        if (original && sheet.open(QIODevice::ReadOnly) &&
            sheet.readAll() == QByteArray::fromStdString(writeStreamSet(original.value()))) {
            AutosaveStore::discard(*it);
            it = left.erase(it);
        } else {
            ++it;
        }
    }
    if (left.isEmpty()) return false;
    const AutosaveEntry& e = left.front();
    const QLocale loc;
    const qint64 minutes = e.saved.secsTo(QDateTime::currentDateTime()) / 60;
    const QString ago = minutes < 1 ? tr("less than a minute ago")
                        : minutes < 120 ? tr("%1 min ago").arg(minutes)
                        : minutes < 48 * 60 ? tr("%1 h ago").arg(minutes / 60)
                                            : tr("%1 days ago").arg(minutes / (24 * 60));
    QString text = tr("Heatchain did not close normally. A worksheet it autosaved can be recovered.\n\n");
    text += tr("“%1”\n").arg(e.title.isEmpty() ? tr("Untitled worksheet") : e.title);
    text += e.originalPath.isEmpty() ? tr("never saved to a file\n") : tr("from %1\n").arg(e.originalPath);
    text += tr("autosaved %1 (%2)\n").arg(loc.toString(e.saved, QLocale::ShortFormat), ago);
    const QFileInfo originalInfo(e.originalPath);
    if (!e.originalPath.isEmpty() && originalInfo.exists() && originalInfo.lastModified() > e.saved)
        text += tr("Note: the file was changed after this autosave (%1); saving the recovered worksheet would replace "
                   "that version.\n").arg(loc.toString(originalInfo.lastModified(), QLocale::ShortFormat));
    else if (!e.originalPath.isEmpty() && !originalInfo.exists())
        text += tr("Note: that file no longer exists.\n");
    text += QLatin1Char('\n');
    text += tr("Recover opens it with its changes not yet saved; Save writes to the original file only when you choose. "
               "Discard deletes the autosave. Later keeps it for the next start.");
    if (left.size() > 1) text += tr("\n\n%n more autosave(s) will be offered afterwards.", nullptr, int(left.size()) - 1);
    switch (hooks_.ask(Question::Recover, text)) {
    case Answer::Recover: {
        if (!hooks_.confirmDiscard()) return false;
        auto p = AutosaveStore::load(e);
        if (!p) {
            hooks_.reportError(tr("Cannot recover worksheet"),
                        tr("The autosave could not be read; it is kept in %1.\n\n%2").arg(store_->folder(), qs(p.error().text())));
            return false;
        }
        doc_->reset(std::move(p.value()), e.originalPath);
        doc_->markModified();
        // Keep it safe under this session before the old copy goes.
        autosaveNow();
        AutosaveStore::discard(e);
        hooks_.status(tr("Recovered the worksheet autosaved %1 — not saved yet").arg(loc.toString(e.saved, QLocale::ShortFormat)), 8000);
        if (left.size() > 1) QTimer::singleShot(0, this, &AutosaveKeeper::offerRecovery);
        return true;
    }
    case Answer::Discard:
        AutosaveStore::discard(e);
        if (left.size() > 1) QTimer::singleShot(0, this, &AutosaveKeeper::offerRecovery);
        return false;
    default: return false;
    }
}

}  // namespace heatchain::gui
