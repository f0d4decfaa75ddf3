#include "commands.hpp"

#include <algorithm>

#include "project_edit.hpp"

namespace heatchain::gui {

static QString qs(const std::string& s) { return QString::fromStdString(s); }

// Undo and redo act on the stream the command was made on.
static void onStream(ProjectDocument* doc, int stream) {
    if (doc->currentStream() != stream) doc->setCurrentStream(stream, -1);
}

AddStep::AddStep(ProjectDocument* doc, int index, Step step)
    : doc_(doc), stream_(doc->currentStream()), index_(std::clamp(index, 0, int(doc->project().steps.size()))), step_(std::move(step)) {
    setText(QStringLiteral("Add step %1").arg(qs(step_.id)));
}
void AddStep::redo() {
    onStream(doc_, stream_);
    doc_->mutate([&](Project& p) { p.steps.insert(p.steps.begin() + index_, step_); });
    doc_->setSelectedStep(index_);
}
void AddStep::undo() {
    onStream(doc_, stream_);
    doc_->mutate([&](Project& p) { p.steps.erase(p.steps.begin() + index_); });
    doc_->setSelectedStep(std::min(index_, int(doc_->project().steps.size()) - 1));
}

RemoveStep::RemoveStep(ProjectDocument* doc, int index)
    : doc_(doc), stream_(doc->currentStream()), index_(index), step_(doc->project().steps.at(std::size_t(index))) {
    setText(QStringLiteral("Delete step %1").arg(qs(step_.id)));
}
void RemoveStep::redo() {
    onStream(doc_, stream_);
    doc_->mutate([&](Project& p) { p.steps.erase(p.steps.begin() + index_); });
    doc_->setSelectedStep(std::min(index_, int(doc_->project().steps.size()) - 1));
}
void RemoveStep::undo() {
    onStream(doc_, stream_);
    doc_->mutate([&](Project& p) { p.steps.insert(p.steps.begin() + index_, step_); });
    doc_->setSelectedStep(index_);
}

DuplicateStep::DuplicateStep(ProjectDocument* doc, int index)
    : doc_(doc), stream_(doc->currentStream()), index_(index), copy_(doc->project().steps.at(std::size_t(index))) {
    copy_.id = uniqueStepId(doc->project(), copy_.id);
    setText(QStringLiteral("Duplicate step %1").arg(qs(doc->project().steps[std::size_t(index)].id)));
}
void DuplicateStep::redo() {
    onStream(doc_, stream_);
    doc_->mutate([&](Project& p) { p.steps.insert(p.steps.begin() + index_ + 1, copy_); });
    doc_->setSelectedStep(index_ + 1);
}
void DuplicateStep::undo() {
    onStream(doc_, stream_);
    doc_->mutate([&](Project& p) { p.steps.erase(p.steps.begin() + index_ + 1); });
    doc_->setSelectedStep(index_);
}

MoveStep::MoveStep(ProjectDocument* doc, int from, int to) : doc_(doc), stream_(doc->currentStream()), from_(from), to_(to) {
    setText(QStringLiteral("Move step %1").arg(qs(doc->project().steps.at(std::size_t(from)).id)));
}
static void moveIn(Project& p, int from, int to) {
    Step s = std::move(p.steps[std::size_t(from)]);
    p.steps.erase(p.steps.begin() + from);
    p.steps.insert(p.steps.begin() + to, std::move(s));
}
void MoveStep::redo() {
    onStream(doc_, stream_);
    doc_->mutate([&](Project& p) { moveIn(p, from_, to_); });
    doc_->setSelectedStep(to_);
}
void MoveStep::undo() {
    onStream(doc_, stream_);
    doc_->mutate([&](Project& p) { moveIn(p, to_, from_); });
    doc_->setSelectedStep(from_);
}

EditStepField::EditStepField(ProjectDocument* doc, int index, Step after, const QString& fieldName)
    : doc_(doc), stream_(doc->currentStream()), index_(index), before_(doc->project().steps.at(std::size_t(index))),
      after_(std::move(after)) {
    setText(QStringLiteral("Edit %1 of %2").arg(fieldName, qs(before_.id)));
}
void EditStepField::redo() {
    onStream(doc_, stream_);
    doc_->mutate([&](Project& p) { p.steps[std::size_t(index_)] = after_; });
    doc_->setSelectedStep(index_);
}
void EditStepField::undo() {
    onStream(doc_, stream_);
    doc_->mutate([&](Project& p) { p.steps[std::size_t(index_)] = before_; });
    doc_->setSelectedStep(index_);
}

EditProjectSettings::EditProjectSettings(ProjectDocument* doc, Project after, const QString& what)
    : doc_(doc), stream_(doc->currentStream()), before_(doc->project()), after_(std::move(after)) {
    setText(what);
}
void EditProjectSettings::redo() {
    onStream(doc_, stream_);
    doc_->setProject(after_);
}
void EditProjectSettings::undo() {
    onStream(doc_, stream_);
    doc_->setProject(before_);
}

EditStreams::EditStreams(ProjectDocument* doc, StreamSet after, int currentAfter, int selectedAfter, const QString& what)
    : doc_(doc), before_(doc->streams()), after_(std::move(after)), currentBefore_(doc->currentStream()),
      selectedBefore_(doc->selectedStep()), currentAfter_(currentAfter), selectedAfter_(selectedAfter) {
    setText(what);
}
void EditStreams::redo() { doc_->setStreams(after_, currentAfter_, selectedAfter_); }
void EditStreams::undo() { doc_->setStreams(before_, currentBefore_, selectedBefore_); }

}  // namespace heatchain::gui
