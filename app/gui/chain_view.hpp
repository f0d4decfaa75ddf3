#pragma once
// The canvas: the sequence as a chain of cards on a zoomable, scrollable
// QGraphicsView — the start-state card, then one card per step joined by
// arrows. A worksheet of several streams shows one lane per stream, each its
// own chain under a header naming the stream; the current stream's lane is
// marked, and a click on another lane's card makes that stream current. Each card shows the kind pictogram, the name, the typed inputs and
// the result at a glance (end T, P, phase, Q or W) and flags warnings and
// errors. The view only asks for edits (signals); the main window turns the
// requests into undo commands.
#include <QGraphicsView>
#include <QMenu>
#include <functional>
#include <vector>

#include "document.hpp"

namespace heatchain::gui {

class StepCard;

// What a card shows of its step's messages: warnings and errors mark the
// border and take the card's last line in bold; a note takes it quietly.
struct CardEmphasis {
    enum class Level { None, Note, Warning, Error } level = Level::None;
    QColor border;
    double borderWidth = 1.0;
    QString line;        // the card's last line, empty when there is nothing to say
    QColor lineColour;
    bool bold = false;
};
class ConnectorLayer;
class InsertHandle;
class LaneItem;

class ChainView : public QGraphicsView {
    Q_OBJECT
public:
    explicit ChainView(ProjectDocument* doc, QWidget* parent = nullptr);
    // The scene deletes the items; the lanes forget them first (the view
    // still scrolls while the scene goes).
    ~ChainView() override;

    void zoomBy(double factor);
    void resetZoom();
    double zoom() const { return zoom_; }
    // Cards of the current stream's lane (its steps).
    int cardCount() const;
    // Scene position of a step's card of the current stream (for tests and
    // the drag logic); −1: the Start card.
    QRectF cardRect(int index) const;
    QRectF cardRect(int lane, int index) const;
    // Lanes: one per stream (one stream: one lane without a header).
    int laneCount() const;
    int laneCardCount(int lane) const;
    // The lane's header text (empty for a worksheet of one stream).
    QString laneLabel(int lane) const;
    bool laneMarkedCurrent(int lane) const;
    // The colour a step keeps for its life (the document's).
    QColor stepColourOf(int lane, int index) const { return doc_->stepColour(lane, index); }
    QColor cardColour(int index) const;
    // How a card (−1: the Start card) shows its messages.
    CardEmphasis cardEmphasis(int index) const;
    // Where a card dropped with its centre at `scenePos` goes (final index).
    int dropIndex(int from, QPointF scenePos) const;

    // Called by the items.
    void cardPressed(int lane, int index);
    void lanePressed(int lane, int step);
    void cardDragged(int lane, int index, QPointF centre);
    void cardDropped(int lane, int index, QPointF centre);
    void showAddMenu(int insertIndex, QPoint screenPos);
    void showCardMenu(int index, QPoint screenPos);
    void showLaneMenu(int lane, QPoint screenPos);

signals:
    void addRequested(int index, StepKind kind);
    void removeRequested(int index);
    void duplicateRequested(int index);
    void moveRequested(int from, int to);
    void settingsRequested();
    void editorFocusRequested();
    // Streams (the lane's menu, the card's "Copy to stream").
    void addStreamRequested();
    void removeStreamRequested(int stream);
    void renameStreamRequested(int stream);
    void moveStreamRequested(int from, int to);
    void copyStepRequested(int step, int toStream);

public slots:
    void rebuild();
    void updateSelection();

protected:
    void keyPressEvent(QKeyEvent* e) override;
    void wheelEvent(QWheelEvent* e) override;
    void resizeEvent(QResizeEvent* e) override;
    void contextMenuEvent(QContextMenuEvent* e) override;
    void scrollContentsBy(int dx, int dy) override;

private:
    struct Lane {
        LaneItem* item = nullptr;  // header and band; none for a worksheet of one stream
        StepCard* start = nullptr;
        std::vector<StepCard*> cards;
        std::vector<InsertHandle*> handles;
        double top = 0;  // scene y of the lane
    };
    void layoutCards();
    void placeLaneText();
    bool hasLanes() const;
    int wrapColumns() const;  // cards per row: the view's width, or one row a lane
    QPointF slotPos(int slot) const;  // of the current lane
    QPointF slotPos(int lane, int slot) const;
    int columns() const;
    Lane& currentLane();
    const Lane& currentLane() const;
    void removeLane(Lane& lane);
    void later(std::function<void()> f);
    void addStepKinds(QMenu* menu, int insertIndex);

    ProjectDocument* doc_;
    QGraphicsScene scene_;
    std::vector<Lane> lanes_;
    ConnectorLayer* connectors_ = nullptr;
    QGraphicsRectItem* dropMarker_ = nullptr;
    double zoom_ = 1.0;
    int cols_ = 1;
};

}  // namespace heatchain::gui
