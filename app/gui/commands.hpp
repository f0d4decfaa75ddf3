#pragma once
// One QUndoCommand per user action on the worksheet. Each keeps exactly what
// it needs to undo itself and selects the step it touched.
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
    Project before_, after_;
};

}  // namespace heatchain::gui
