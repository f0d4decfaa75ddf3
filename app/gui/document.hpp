#pragma once
// The open worksheet: the Project (the document), the undo stack of the edits
// made to it, and the SequenceResult core computed from it. Every change goes
// through a QUndoCommand that calls setProject()/mutate(); the document then
// re-solves the whole sequence and emits one signal, changed(). Views redraw
// from project() and result() and never talk to each other.
#include <QByteArray>
#include <QDateTime>
#include <QObject>
#include <QString>
#include <QColor>
#include <QUndoStack>
#include <functional>
#include <memory>
#include <string>

#include "heatchain/project.hpp"
#include "heatchain/result.hpp"
#include "heatchain/solver.hpp"
#include "heatchain/uncertainty.hpp"

namespace heatchain::gui {

// What the worksheet's file looked like when it was last read or written:
// enough to tell whether someone else has changed it since.
struct DiskStamp {
    bool exists = false;
    qint64 size = -1;
    QDateTime modified;
    QByteArray sha256;  // of the bytes
    bool operator==(const DiskStamp& o) const { return exists == o.exists && sha256 == o.sha256; }
    // The current state of `path` (hash read from the file).
    static DiskStamp of(const QString& path);
    static DiskStamp ofBytes(const QByteArray& bytes, const QString& path);
};

class ProjectDocument : public QObject {
    Q_OBJECT
public:
    explicit ProjectDocument(QObject* parent = nullptr);
    // Quiet on the way out: the undo stack's last cleanChanged must not reach
    // views that outlive the document by a few instructions.
    ~ProjectDocument() override;

    const Project& project() const { return project_; }
    const SequenceResult& result() const { return result_; }
    // Saturation dome of the current model, or null when it has none.
    const DomeCurve* dome() const { return dome_.liquidSide.empty() ? nullptr : &dome_; }
    QUndoStack* undoStack() { return &undo_; }

    // The step selected on the canvas (index into project().steps), −1: none.
    int selectedStep() const { return selected_; }
    void setSelectedStep(int index);
    int indexOf(std::string_view stepId) const;

    // File: replacing the worksheet clears the undo history.
    QString filePath() const { return filePath_; }
    bool isModified() const { return dirty_ || !undo_.isClean(); }
    // Marks the worksheet as differing from its file although the undo stack
    // is clean (a recovered autosave). Cleared by the next save.
    void markModified();
    // Opens `path`; on error the current worksheet stays exactly as it was.
    Status open(const QString& path);
    Status saveAs(const QString& path);
    void reset(Project project, const QString& path = {});

    // The file as this worksheet last read or wrote it, and whether the file
    // now differs from that (changed, replaced or removed by someone else).
    const DiskStamp& diskStamp() const { return stamp_; }
    bool fileChangedOnDisk() const;
    // After the user has seen a change and chose to keep their version.
    void acceptDiskState() { stamp_ = DiskStamp::of(filePath_); }

    // For undo commands only: replace the whole project, or change it in place.
    void setProject(Project project);
    void mutate(const std::function<void(Project&)>& change);

    // The colour of a step on the cards and charts: its own for its life,
    // kept when other steps are inserted, removed or moved.
    QColor stepColour(int index) const;
    std::vector<QColor> stepColours() const;

    // How sure the results are: the first-order propagation of the
    // worksheet's tolerances (core's), recomputed with the result while shown.
    // Null when hidden, when nothing carries a tolerance, or when it failed
    // (uncertaintyError() then says why).
    const UncertaintyResult* uncertainty() const { return uncertainty_ ? &*uncertainty_ : nullptr; }
    QString uncertaintyError() const { return uncertaintyError_; }
    bool uncertaintyShown() const { return uncertaintyShown_; }
    void setUncertaintyShown(bool shown);
    // Whether any input carries a tolerance (or the worksheet asks for the
    // models' stated uncertainty).
    bool hasUncertainInputs() const { return hasUncertainInputs_; }

    // Time the last solve took, ms.
    double lastSolveMs() const { return lastSolveMs_; }

signals:
    void changed();                // the project changed and result() is fresh
    void selectionChanged(int index);
    void fileStateChanged();       // path or modified flag changed

private:
    void recompute();
    std::vector<std::string> stepIds() const;
    void keepColours(const std::vector<std::string>& before);

    Project project_;
    SequenceResult result_;
    std::optional<UncertaintyResult> uncertainty_;
    QString uncertaintyError_;
    bool uncertaintyShown_ = true;
    bool hasUncertainInputs_ = false;
    DomeCurve dome_;
    std::shared_ptr<const PropertyModel> model_;
    std::string modelKey_;  // model kind + substance; the model is rebuilt only when it changes
    QUndoStack undo_;
    QString filePath_;
    DiskStamp stamp_;
    bool dirty_ = false;
    int selected_ = -1;
    std::vector<int> colours_;  // palette slot of each step
    double lastSolveMs_ = 0;
};

}  // namespace heatchain::gui
