#pragma once
// The open worksheet: its streams (a StreamSet; a version-1 file is one
// stream), the undo stack of the edits made to it, and the SequenceResult
// core computed for each stream. One stream is current: project() and
// result() are that stream's, so the step panel, ledger and charts follow it.
// Every change goes through a QUndoCommand that calls setProject()/mutate()
// (the current stream) or setStreams() (the whole set); the document then
// re-solves and emits one signal, changed(). Views redraw from project() and
// result() (and streams()/results() for all of them) and never talk to each
// other.
#include <QByteArray>
#include <QDateTime>
#include <QObject>
#include <QString>
#include <QColor>
#include <QUndoStack>
#include <functional>
#include <memory>
#include <string>
#include <unordered_map>
#include <vector>

#include "heatchain/project.hpp"
#include "heatchain/result.hpp"
#include "heatchain/solver.hpp"
#include "heatchain/streams.hpp"
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

    // The current stream's project (with the worksheet's shared fields) and result.
    const Project& project() const { return set_.streams[std::size_t(current_)].project; }
    const SequenceResult& result() const { return results_[std::size_t(current_)]; }
    // Every stream and its result, in order.
    const StreamSet& streams() const { return set_; }
    const std::vector<SequenceResult>& results() const { return results_; }
    int streamCount() const { return int(set_.streams.size()); }
    // The stream the step panel, ledger and charts show.
    int currentStream() const { return current_; }
    // Makes stream `index` current with step `step` selected (−1: its Start card).
    void setCurrentStream(int index, int step = -1);
    int streamIndexOf(std::string_view streamId) const;
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
    void reset(StreamSet set, const QString& path = {});
    // The bytes Save would write (version 1 for one plain stream, else version 2).
    std::string fileText() const;

    // The file as this worksheet last read or wrote it, and whether the file
    // now differs from that (changed, replaced or removed by someone else).
    const DiskStamp& diskStamp() const { return stamp_; }
    bool fileChangedOnDisk() const;
    // After the user has seen a change and chose to keep their version.
    void acceptDiskState() { stamp_ = DiskStamp::of(filePath_); }

    // For undo commands only: replace the current stream's project, or change
    // it in place (its shared fields — title, units, utilities, … — then
    // become every stream's); or replace the whole set of streams, making
    // `current` current with `selected` selected.
    void setProject(Project project);
    void mutate(const std::function<void(Project&)>& change);
    void setStreams(StreamSet set, int current, int selected);

    // The colour of a step on the cards and charts: its own for its life,
    // kept when other steps are inserted, removed or moved.
    QColor stepColour(int index) const { return stepColour(current_, index); }
    QColor stepColour(int stream, int index) const;
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
    // Solves every stream (solveStreams) and works out what shows of the
    // current one (its saturation dome, its uncertainty).
    void recompute(bool solveStreams = true);
    // After an edit of the current stream: its shared fields become the set's.
    void adoptShared();
    Project& current() { return set_.streams[std::size_t(current_)].project; }
    std::vector<std::string> stepIds(int stream) const;
    void keepColours(int stream, const std::vector<std::string>& before);
    void freshColours();

    StreamSet set_;
    std::vector<SequenceResult> results_;
    int current_ = 0;
    std::optional<UncertaintyResult> uncertainty_;
    QString uncertaintyError_;
    bool uncertaintyShown_ = true;
    bool hasUncertainInputs_ = false;
    DomeCurve dome_;  // of the current stream's model
    std::string domeKey_;
    // Models by kind + substance: a model is built only when a stream's changes.
    std::unordered_map<std::string, std::shared_ptr<const PropertyModel>> models_;
    QUndoStack undo_;
    QString filePath_;
    DiskStamp stamp_;
    bool dirty_ = false;
    int selected_ = -1;
    std::vector<std::vector<int>> colours_;  // palette slot of each step of each stream
    double lastSolveMs_ = 0;
};

}  // namespace heatchain::gui
