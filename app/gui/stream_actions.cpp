#include "stream_actions.hpp"
#include "heatchain_view/format.hpp"

#include <QDialog>
#include <QDialogButtonBox>
#include <QFormLayout>
#include <QLabel>
#include <QLineEdit>
#include <QPushButton>
#include <algorithm>

#include "commands.hpp"
#include "project_edit.hpp"

namespace heatchain::gui {

namespace {
using heatchain::view::qs;
}  // namespace

StreamActions::StreamActions(ProjectDocument* doc, QWidget* parent) : QObject(parent), doc_(doc), parent_(parent) {}

bool StreamActions::refuse(const QString& why) {
    lastError_ = why;
    emit refused(why);
    return false;
}

QString StreamActions::freeId(const QString& base) const {
    const QString b = base.trimmed().isEmpty() ? QStringLiteral("stream") : base.trimmed();
    if (doc_->streamIndexOf(b.toStdString()) < 0) return b;
    for (int n = 2;; ++n) {
        const QString candidate = QStringLiteral("%1-%2").arg(b).arg(n);
        if (doc_->streamIndexOf(candidate.toStdString()) < 0) return candidate;
    }
}

bool StreamActions::addStream(const QString& id, const QString& name) {
    const QString trimmed = id.trimmed();
    if (trimmed.isEmpty()) return refuse(tr("A stream needs an id (a short name such as “feed”)."));
    if (doc_->streamIndexOf(trimmed.toStdString()) >= 0)
        return refuse(tr("The stream id “%1” is already used; each stream needs its own.").arg(trimmed));
    StreamSet set = doc_->streams();
    Stream s;
    s.id = trimmed.toStdString();
    if (!name.trimmed().isEmpty()) s.name = name.trimmed().toStdString();
    s.project = doc_->project();
    s.project.steps.clear();
    s.project.extra = {};
    const int at = doc_->currentStream() + 1;
    set.streams.insert(set.streams.begin() + at, std::move(s));
    lastError_.clear();
    doc_->undoStack()->push(new EditStreams(doc_, std::move(set), at, -1, tr("Add stream %1").arg(trimmed)));
    return true;
}

bool StreamActions::removeStream(int index) {
    if (index < 0 || index >= doc_->streamCount()) return refuse(tr("There is no such stream."));
    if (doc_->streamCount() < 2) return refuse(tr("A worksheet keeps at least one stream."));
    StreamSet set = doc_->streams();
    const QString id = qs(set.streams[std::size_t(index)].id);
    set.streams.erase(set.streams.begin() + index);
    const int current = std::min(index, int(set.streams.size()) - 1);
    lastError_.clear();
    doc_->undoStack()->push(new EditStreams(doc_, std::move(set), current, -1, tr("Remove stream %1").arg(id)));
    return true;
}

bool StreamActions::renameStream(int index, const QString& id, const QString& name) {
    if (index < 0 || index >= doc_->streamCount()) return refuse(tr("There is no such stream."));
    const QString trimmed = id.trimmed();
    if (trimmed.isEmpty()) return refuse(tr("A stream needs an id (a short name such as “feed”)."));
    const int other = doc_->streamIndexOf(trimmed.toStdString());
    if (other >= 0 && other != index)
        return refuse(tr("The stream id “%1” is already used; each stream needs its own.").arg(trimmed));
    StreamSet set = doc_->streams();
    Stream& s = set.streams[std::size_t(index)];
    const QString before = qs(s.id);
    std::optional<std::string> newName;
    if (!name.trimmed().isEmpty()) newName = name.trimmed().toStdString();
    if (s.id == trimmed.toStdString() && s.name == newName) return true;  // nothing to do
    s.id = trimmed.toStdString();
    s.name = newName;
    lastError_.clear();
    doc_->undoStack()->push(new EditStreams(doc_, std::move(set), index, index == doc_->currentStream() ? doc_->selectedStep() : -1,
                                            tr("Rename stream %1").arg(before)));
    return true;
}

bool StreamActions::moveStream(int from, int to) {
    const int n = doc_->streamCount();
    if (from < 0 || from >= n || to < 0 || to >= n) return refuse(tr("The stream cannot move there."));
    if (from == to) return true;
    StreamSet set = doc_->streams();
    Stream s = std::move(set.streams[std::size_t(from)]);
    set.streams.erase(set.streams.begin() + from);
    const QString id = qs(s.id);
    set.streams.insert(set.streams.begin() + to, std::move(s));
    lastError_.clear();
    doc_->undoStack()->push(new EditStreams(doc_, std::move(set), to,
                                            from == doc_->currentStream() ? doc_->selectedStep() : -1,
                                            tr("Move stream %1").arg(id)));
    return true;
}

bool StreamActions::copyStep(int step, int toStream) {
    const Project& from = doc_->project();
    if (step < 0 || step >= int(from.steps.size())) return refuse(tr("Select a step to copy."));
    if (toStream < 0 || toStream >= doc_->streamCount() || toStream == doc_->currentStream())
        return refuse(tr("Choose another stream to copy the step to."));
    StreamSet set = doc_->streams();
    Project& target = set.streams[std::size_t(toStream)].project;
    Step copy = from.steps[std::size_t(step)];
    // Step ids are unique within a stream.
    copy.id = uniqueStepId(target, copy.id);
    // The other stream may be a batch, or lack a utility the step names: the
    // copy is held to the rules of the stream it joins.
    const int at = int(target.steps.size());
    auto placed = placedStep(target, at, std::move(copy), false);
    if (!placed)
        return refuse(tr("Not copied to stream %1: %2")
                          .arg(qs(doc_->streams().streams[std::size_t(toStream)].id), qs(placed.error().message)));
    target.steps.push_back(std::move(*placed));
    lastError_.clear();
    doc_->undoStack()->push(new EditStreams(doc_, std::move(set), toStream, at,
                                            tr("Copy step %1 to stream %2")
                                                .arg(qs(from.steps[std::size_t(step)].id), qs(doc_->streams().streams[std::size_t(toStream)].id))));
    return true;
}

bool StreamActions::askIdAndName(const QString& title, QString& id, QString& name) {
    QDialog dlg(parent_);
    dlg.setWindowTitle(title);
    auto* form = new QFormLayout(&dlg);
    auto* idField = new QLineEdit(id, &dlg);
    idField->setObjectName(QStringLiteral("streamId"));
    idField->setPlaceholderText(tr("short and unique, e.g. feed"));
    auto* nameField = new QLineEdit(name, &dlg);
    nameField->setObjectName(QStringLiteral("streamName"));
    nameField->setPlaceholderText(tr("optional, e.g. dilute feed to the column"));
    form->addRow(tr("Stream id"), idField);
    form->addRow(tr("Name"), nameField);
    auto* why = new QLabel(&dlg);
    why->setStyleSheet(QStringLiteral("color: #b42318;"));
    why->setWordWrap(true);
    form->addRow(why);
    auto* buttons = new QDialogButtonBox(QDialogButtonBox::Ok | QDialogButtonBox::Cancel, &dlg);
    form->addRow(buttons);
    connect(buttons, &QDialogButtonBox::accepted, &dlg, &QDialog::accept);
    connect(buttons, &QDialogButtonBox::rejected, &dlg, &QDialog::reject);
    auto check = [&] {
        const bool ok = !idField->text().trimmed().isEmpty();
        why->setText(ok ? QString() : tr("A stream needs an id."));
        buttons->button(QDialogButtonBox::Ok)->setEnabled(ok);
    };
    connect(idField, &QLineEdit::textChanged, &dlg, check);
    check();
    idField->selectAll();
    if (dlg.exec() != QDialog::Accepted) return false;
    id = idField->text();
    name = nameField->text();
    return true;
}

void StreamActions::addStreamDialog() {
    QString id = freeId(QStringLiteral("stream")), name;
    while (askIdAndName(tr("Add stream"), id, name)) {
        if (addStream(id, name)) return;  // refused: ask again with the reason shown
    }
}

void StreamActions::renameStreamDialog(int index) {
    if (index < 0 || index >= doc_->streamCount()) return;
    const Stream& s = doc_->streams().streams[std::size_t(index)];
    QString id = qs(s.id), name = s.name ? qs(*s.name) : QString();
    while (askIdAndName(tr("Rename stream %1").arg(id), id, name)) {
        if (renameStream(index, id, name)) return;
    }
}

void StreamActions::fillMenu(QMenu* menu) {
    menu->clear();
    const int current = doc_->currentStream(), n = doc_->streamCount();
    const StreamSet& set = doc_->streams();
    // Which stream the step panel, ledger and charts show.
    for (int k = 0; k < n; ++k) {
        const Stream& s = set.streams[std::size_t(k)];
        QString label = qs(s.id);
        if (s.name) label += QStringLiteral(" — ") + qs(*s.name);
        QAction* a = menu->addAction(label, this, [this, k] { doc_->setCurrentStream(k, -1); });
        a->setCheckable(true);
        a->setChecked(k == current);
    }
    menu->addSeparator();
    menu->addAction(tr("&Add stream…"), this, &StreamActions::addStreamDialog);
    menu->addAction(tr("Re&name stream…"), this, [this] { renameStreamDialog(doc_->currentStream()); });
    QAction* up = menu->addAction(tr("Move stream &up"), this, [this] { moveStream(doc_->currentStream(), doc_->currentStream() - 1); });
    up->setEnabled(current > 0);
    QAction* down = menu->addAction(tr("Move stream &down"), this, [this] { moveStream(doc_->currentStream(), doc_->currentStream() + 1); });
    down->setEnabled(current + 1 < n);
    QAction* remove = menu->addAction(tr("&Remove stream %1").arg(qs(set.streams[std::size_t(current)].id)), this,
                                      [this] { removeStream(doc_->currentStream()); });
    remove->setEnabled(n > 1);
    menu->addSeparator();
    QMenu* copyTo = menu->addMenu(tr("&Copy selected step to"));
    const int step = doc_->selectedStep();
    copyTo->setEnabled(n > 1 && step >= 0);
    for (int k = 0; k < n; ++k) {
        if (k == current) continue;
        copyTo->addAction(qs(set.streams[std::size_t(k)].id), this, [this, step, k] { copyStep(step, k); });
    }
}

}  // namespace heatchain::gui
