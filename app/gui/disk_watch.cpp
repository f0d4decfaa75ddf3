#include "disk_watch.hpp"

#include <QFileInfo>
#include <QHBoxLayout>
#include <QLocale>

namespace heatchain::gui {

DiskWatch::DiskWatch(ProjectDocument* doc, QWidget* parent) : QFrame(parent), doc_(doc) {
    setObjectName(QStringLiteral("diskNotice"));
    setStyleSheet(QStringLiteral(
        "#diskNotice { background: #fff6e0; border-bottom: 1px solid #e0c36a; }"
        "#diskNotice QLabel { color: #5c4300; }"));
    auto* row = new QHBoxLayout(this);
    row->setContentsMargins(10, 5, 8, 5);
    text_ = new QLabel(this);
    text_->setTextFormat(Qt::PlainText);
    text_->setWordWrap(true);
    reload_ = new QPushButton(tr("Reload"), this);
    dismiss_ = new QPushButton(tr("Keep mine"), this);
    dismiss_->setToolTip(tr("Hide this notice. Save will still ask before overwriting the other version."));
    row->addWidget(text_, 1);
    row->addWidget(reload_);
    row->addWidget(dismiss_);
    connect(reload_, &QPushButton::clicked, this, &DiskWatch::reloadRequested);
    connect(dismiss_, &QPushButton::clicked, this, &QWidget::hide);
    hide();

    // Someone else's change to the file: the watcher fires (often several
    // times for one save); look once things have settled.
    settle_.setSingleShot(true);
    settle_.setInterval(300);
    connect(&settle_, &QTimer::timeout, this, &DiskWatch::checkNow);
    connect(&watcher_, &QFileSystemWatcher::fileChanged, this, [this] { settle_.start(); });
    connect(doc_, &ProjectDocument::fileStateChanged, this, &DiskWatch::watchFile);
}

void DiskWatch::watchFile() {
    const QString path = doc_->filePath();
    const QStringList watched = watcher_.files();
    // An atomic save by anyone (us included) replaces the file, and the
    // watch on the old one is gone: watch the path again.
    if (watched.size() == 1 && watched.front() == path && QFileInfo::exists(path)) return;
    if (!watched.isEmpty()) watcher_.removePaths(watched);
    if (!path.isEmpty() && QFileInfo::exists(path)) watcher_.addPath(path);
}

void DiskWatch::checkNow() {
    watchFile();
    if (!doc_->fileChangedOnDisk()) {
        hide();
        return;
    }
    const bool exists = QFileInfo::exists(doc_->filePath());
    const QString name = QFileInfo(doc_->filePath()).fileName();
    text_->setText(exists ? tr("“%1” was changed on disk by another program. What you see here is your version; "
                               "Save will ask before overwriting theirs.")
                                .arg(name)
                          : tr("“%1” was removed or renamed on disk. Save writes it again.").arg(name));
    reload_->setVisible(exists);
    reload_->setText(doc_->isModified() ? tr("Reload (drop my edits)") : tr("Reload"));
    dismiss_->setText(doc_->isModified() ? tr("Keep mine") : tr("Dismiss"));
    show();
}

QString DiskWatch::describeChange() const {
    const QString path = doc_->filePath();
    const QString name = QFileInfo(path).fileName();
    const QFileInfo now(path);
    if (!now.exists())
        return tr("“%1” was removed or renamed since this worksheet last read or wrote it.\n\n%2").arg(name, path);
    const DiskStamp& was = doc_->diskStamp();
    const QLocale loc;
    return tr("“%1” was changed on disk by someone else since this worksheet last read or wrote it.\n\n"
              "Then: %2, %3 bytes\nNow:  %4, %5 bytes\n%6")
        .arg(name, loc.toString(was.modified, QLocale::ShortFormat), loc.toString(was.size),
             loc.toString(now.lastModified(), QLocale::ShortFormat), loc.toString(now.size()), path);
}

}  // namespace heatchain::gui
