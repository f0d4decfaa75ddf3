#pragma once
// One QUndoCommand per user action on the worksheet. Each keeps exactly what
// it needs to undo itself and selects the step it touched. A step command
// belongs to the stream that was current when it was made: undone or redone,
// it makes that stream current again before it changes it.
#include <QUndoCommand>

#include "document.hpp"

namespace heatchain::gui {

// A command on one step of the stream that was current when it was made.
class StepCommand : public QUndoCommand {
protected:
    explicit StepCommand(ProjectDocument* doc) : doc_(doc), stream_(doc->currentStream()) {}
    // Makes the command's stream current again (undo and redo act on it).
    void onStream() const;
    ProjectDocument* doc_;
    int stream_;
};

// Adding, removing and duplicating a step are one change run one way or the
// other: a step at `index` that redo puts in (or takes out) and undo takes
// out (or puts back), with the step selected afterwards on either side.
class StepInOrOut : public StepCommand {
public:
    void redo() override { insertOnRedo_ ? insert() : erase(); }
    void undo() override { insertOnRedo_ ? erase() : insert(); }

protected:
    StepInOrOut(ProjectDocument* doc, int index, Step step, bool insertOnRedo, int selectAfterErase);

private:
    void insert();
    void erase();
    int index_;
    Step step_;
    bool insertOnRedo_;
    int selectAfterErase_;  // the step selected once it is out (clamped to the sequence)
};

class AddStep : public StepInOrOut {
public:
    AddStep(ProjectDocument* doc, int index, Step step);
};

class RemoveStep : public StepInOrOut {
public:
    RemoveStep(ProjectDocument* doc, int index);
};

// A copy of the step at `index`, with a new id, just after it.
class DuplicateStep : public StepInOrOut {
public:
    DuplicateStep(ProjectDocument* doc, int index);
};

class MoveStep : public StepCommand {
public:
    MoveStep(ProjectDocument* doc, int from, int to);
    void redo() override;
    void undo() override;
private:
    int from_, to_;
};

// A change of one field of one step (the whole step before and after is kept,
// which also covers a change of kind that resets the kind's options).
class EditStepField : public StepCommand {
public:
    EditStepField(ProjectDocument* doc, int index, Step after, const QString& fieldName);
    void redo() override;
    void undo() override;
private:
    int index_;
    Step before_, after_;
};

// Title, substance, model, start state, units …: the project before and after.
class EditProjectSettings : public StepCommand {
public:
    EditProjectSettings(ProjectDocument* doc, Project after, const QString& what);
    void redo() override;
    void undo() override;
private:
    Project before_, after_;
};

// A change of the streams themselves (add, remove, rename, reorder, copy a
// step to another stream): the whole set before and after, with which
// stream is current and which step is selected on either side.
class EditStreams : public QUndoCommand {
public:
    EditStreams(ProjectDocument* doc, StreamSet after, int currentAfter, int selectedAfter, const QString& what);
    void redo() override;
    void undo() override;
private:
    ProjectDocument* doc_;
    StreamSet before_, after_;
    int currentBefore_, selectedBefore_, currentAfter_, selectedAfter_;
};

}  // namespace heatchain::gui
