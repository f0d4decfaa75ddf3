#include "commands.hpp"
#include "heatchain_view/format.hpp"

#include <algorithm>

#include "project_edit.hpp"

namespace heatchain::gui {

using heatchain::view::qs;

void StepCommand::onStream() const {
    if (doc_->currentStream() != stream_) doc_->setCurrentStream(stream_, -1);
}

StepInOrOut::StepInOrOut(ProjectDocument* doc, int index, Step step, bool insertOnRedo, int selectAfterErase)
    : StepCommand(doc), index_(index), step_(std::move(step)), insertOnRedo_(insertOnRedo),
      selectAfterErase_(selectAfterErase) {}

void StepInOrOut::insert() {
    onStream();
    doc_->mutate([&](Project& p) { p.steps.insert(p.steps.begin() + index_, step_); });
    doc_->setSelectedStep(index_);
}

void StepInOrOut::erase() {
    onStream();
    doc_->mutate([&](Project& p) { p.steps.erase(p.steps.begin() + index_); });
    doc_->setSelectedStep(std::min(selectAfterErase_, int(doc_->project().steps.size()) - 1));
}

static int clampedInsert(const ProjectDocument* doc, int index) {
    return std::clamp(index, 0, int(doc->project().steps.size()));
}

static const Step& stepAt(const ProjectDocument* doc, int index) { return doc->project().steps.at(std::size_t(index)); }

AddStep::AddStep(ProjectDocument* doc, int index, Step step)
    : StepInOrOut(doc, clampedInsert(doc, index), step, true, clampedInsert(doc, index)) {
    setText(QStringLiteral("Add step %1").arg(qs(step.id)));
}

RemoveStep::RemoveStep(ProjectDocument* doc, int index) : StepInOrOut(doc, index, stepAt(doc, index), false, index) {
    setText(QStringLiteral("Delete step %1").arg(qs(stepAt(doc, index).id)));
}

static Step copyOf(const ProjectDocument* doc, int index) {
    Step copy = stepAt(doc, index);
    copy.id = uniqueStepId(doc->project(), copy.id);
    return copy;
}

// Taken out again, the copy leaves the original selected.
DuplicateStep::DuplicateStep(ProjectDocument* doc, int index)
    : StepInOrOut(doc, index + 1, copyOf(doc, index), true, index) {
    setText(QStringLiteral("Duplicate step %1").arg(qs(stepAt(doc, index).id)));
}

MoveStep::MoveStep(ProjectDocument* doc, int from, int to) : StepCommand(doc), from_(from), to_(to) {
    setText(QStringLiteral("Move step %1").arg(qs(stepAt(doc, from).id)));
}
static void moveIn(Project& p, int from, int to) {
    Step s = std::move(p.steps[std::size_t(from)]);
    p.steps.erase(p.steps.begin() + from);
    p.steps.insert(p.steps.begin() + to, std::move(s));
}
void MoveStep::redo() {
    onStream();
    doc_->mutate([&](Project& p) { moveIn(p, from_, to_); });
    doc_->setSelectedStep(to_);
}
void MoveStep::undo() {
    onStream();
    doc_->mutate([&](Project& p) { moveIn(p, to_, from_); });
    doc_->setSelectedStep(from_);
}

EditStepField::EditStepField(ProjectDocument* doc, int index, Step after, const QString& fieldName)
    : StepCommand(doc), index_(index), before_(stepAt(doc, index)),
      after_(std::move(after)) {
    setText(QStringLiteral("Edit %1 of %2").arg(fieldName, qs(before_.id)));
}
void EditStepField::redo() {
    onStream();
    doc_->mutate([&](Project& p) { p.steps[std::size_t(index_)] = after_; });
    doc_->setSelectedStep(index_);
}
void EditStepField::undo() {
    onStream();
    doc_->mutate([&](Project& p) { p.steps[std::size_t(index_)] = before_; });
    doc_->setSelectedStep(index_);
}

EditProjectSettings::EditProjectSettings(ProjectDocument* doc, Project after, const QString& what)
    : StepCommand(doc), before_(doc->project()), after_(std::move(after)) {
    setText(what);
}
void EditProjectSettings::redo() {
    onStream();
    doc_->setProject(after_);
}
void EditProjectSettings::undo() {
    onStream();
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
