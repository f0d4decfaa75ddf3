#pragma once
// One QUndoCommand per user action on the worksheet. Each keeps exactly what
// it needs to undo itself and selects the step it touched. A step command
// belongs to the stream that was current when it was made: undone or redone,
// it makes that stream current again before it changes it.
#include <QUndoCommand>

#include "document.hpp"

namespace heatchain::gui {

class AddStep : public QUndoCommand {
public:
    AddStep(ProjectDocument* doc, int index, Step step);
    void redo() override;
    void undo() override;
private:
    ProjectDocument* doc_;
    int stream_;
    int index_;
    Step step_;
};

class RemoveStep : public QUndoCommand {
public:
    RemoveStep(ProjectDocument* doc, int index);
    void redo() override;
    void undo() override;
private:
    ProjectDocument* doc_;
    int stream_;
    int index_;
    Step step_;
};

class DuplicateStep : public QUndoCommand {
public:
    DuplicateStep(ProjectDocument* doc, int index);
    void redo() override;
    void undo() override;
private:
    ProjectDocument* doc_;
    int stream_;
    int index_;
    Step copy_;
};

class MoveStep : public QUndoCommand {
public:
    MoveStep(ProjectDocument* doc, int from, int to);
    void redo() override;
    void undo() override;
private:
    ProjectDocument* doc_;
    int stream_;
    int from_, to_;
};

// A change of one field of one step (the whole step before and after is kept,
// which also covers a change of kind that resets the kind's options).
class EditStepField : public QUndoCommand {
public:
    EditStepField(ProjectDocument* doc, int index, Step after, const QString& fieldName);
    void redo() override;
    void undo() override;
private:
    ProjectDocument* doc_;
    int stream_;
    int index_;
    Step before_, after_;
};

// Title, substance, model, start state, units …: the project before and after.
class EditProjectSettings : public QUndoCommand {
public:
    EditProjectSettings(ProjectDocument* doc, Project after, const QString& what);
    void redo() override;
    void undo() override;
private:
    ProjectDocument* doc_;
    int stream_;
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
