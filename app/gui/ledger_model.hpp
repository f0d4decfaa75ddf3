#pragma once
// The ledger: every step and, indented under it, its segments when it has
// more than one (a heating step that crosses boiling), then the totals and
// the heating and cooling duties. Display units in the headers, numbers
// right-aligned. Rows keep the sequence order: sorting is deliberately not
// offered, because the order of the steps is the process itself. It shows
// the current stream, or every stream of the worksheet one after another,
// each under a heading row with its own totals.
#include <QAbstractTableModel>
#include <set>
#include <string>
#include <vector>

#include "document.hpp"

namespace heatchain::gui {

class LedgerModel : public QAbstractTableModel {
    Q_OBJECT
public:
    enum Column {
        ColStep, ColWhat, ColTin, ColTout, ColUTout, ColPin, ColPout, ColPhase,
        ColQ, ColUQ, ColW, ColUW, ColdH, ColdU, ColdS, ColSgen, ColExd, ColArea, ColTime, ColumnCount
    };
    enum class RowKind { Start, Step, Segment, Total, HeatingDuty, CoolingDuty, Stream };
    // Qt::UserRole gives the SI value of a numeric cell (the core's number),
    // RowStepRole the step index of a row (−1 for start and totals).
    static constexpr int SiRole = Qt::UserRole;
    static constexpr int RowStepRole = Qt::UserRole + 1;
    static constexpr int RowKindRole = Qt::UserRole + 2;
    static constexpr int RowStreamRole = Qt::UserRole + 3;  // the stream of a row (its index)

    explicit LedgerModel(ProjectDocument* doc, QObject* parent = nullptr);

    int rowCount(const QModelIndex& parent = {}) const override;
    int columnCount(const QModelIndex& parent = {}) const override;
    // The ± columns (standard uncertainty of T out, Q and W) hold values only
    // while the document shows uncertainty; the view hides them otherwise.
    static bool isUncertaintyColumn(int column) { return column == ColUTout || column == ColUQ || column == ColUW; }
    bool showsUncertainty() const { return doc_->uncertainty() != nullptr; }
    // Area (an exchanger's, or the jacket's a batch step goes through) and a
    // batch step's time hold values only when some step has them; the view
    // hides a column that would be empty.
    bool showsArea() const;
    bool showsTime() const;
    QVariant data(const QModelIndex& index, int role) const override;
    QVariant headerData(int section, Qt::Orientation o, int role) const override;

    // Every stream at once, or the current one. All streams share the
    // ledger's columns, so it takes streams of one kind of system (all steady
    // flow, or all batches: their energies are in W or in J); otherwise, and
    // with one stream, it shows the current stream.
    bool canShowAllStreams() const;
    bool showsAllStreams() const { return allStreams_ && canShowAllStreams(); }
    void setAllStreams(bool all);

    // The row of step `index` of the current stream (−1 if none).
    int rowOfStep(int stepIndex) const;
    // A step's segments (the parts of a heat step that crosses a phase line)
    // are folded under its row until opened, so later steps stay in view.
    // The step keeps its state by name across edits.
    // `stream` −1 is the current stream.
    bool hasSegments(int stepIndex, int stream = -1) const;
    bool segmentsShown(int stepIndex, int stream = -1) const;
    void setSegmentsShown(int stepIndex, bool shown, int stream = -1);
    // The whole ledger as tab-separated text: a header line with units, then
    // one line per row; numbers in display units with full precision.
    QString toTabSeparated() const;

public slots:
    void refresh();

private:
    struct Row {
        RowKind kind;
        int step = -1;
        int segment = -1;
        int stream = 0;
    };
    const SequenceResult& resultOf(const Row& r) const;
    const Project& projectOf(const Row& r) const;
    int streamOr(int stream) const { return stream < 0 ? doc_->currentStream() : stream; }
    std::string openedKey(int stream, const std::string& stepId) const;
    QVariant siValue(const Row& r, int column) const;
    QString text(const Row& r, int column) const;
    Dimension dimensionOf(int column) const;

    ProjectDocument* doc_;
    std::vector<Row> rows_;
    std::set<std::string> opened_;  // stream and step ids of the steps whose segments are shown
    bool allStreams_ = false;
    // Decimals of each numeric column, from its largest value, so a column
    // reads with one number of decimals from top to bottom.
    std::vector<int> decimals_;
    QStringList headings_;  // as last told to the header
};

}  // namespace heatchain::gui
