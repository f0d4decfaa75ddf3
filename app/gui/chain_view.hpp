#pragma once
// The canvas: the sequence as a chain of cards on a zoomable, scrollable
// QGraphicsView — the start-state card, then one card per step joined by
// arrows. Each card shows the kind pictogram, the name, the typed inputs and
// the result at a glance (end T, P, phase, Q or W) and flags warnings and
// errors. The view only asks for edits (signals); the main window turns the
// requests into undo commands.
#include <QGraphicsView>
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

class ChainView : public QGraphicsView {
    Q_OBJECT
public:
    explicit ChainView(ProjectDocument* doc, QWidget* parent = nullptr);

    void zoomBy(double factor);
    void resetZoom();
    double zoom() const { return zoom_; }
    int cardCount() const { return int(cards_.size()); }
    // Scene position of a step's card (for tests and the drag logic); −1: the
    // Start card.
    QRectF cardRect(int index) const;
    // The colour a step keeps for its life (the document's).
    QColor stepColourOf(int index) const { return doc_->stepColour(index); }
    QColor cardColour(int index) const;
    // How a card (−1: the Start card) shows its messages.
    CardEmphasis cardEmphasis(int index) const;
    // Where a card dropped with its centre at `scenePos` goes (final index).
    int dropIndex(int from, QPointF scenePos) const;

    // Called by the items.
    void cardPressed(int index);
    void cardDragged(int index, QPointF centre);
    void cardDropped(int index, QPointF centre);
    void showAddMenu(int insertIndex, QPoint screenPos);
    void showCardMenu(int index, QPoint screenPos);

signals:
    void addRequested(int index, StepKind kind);
    void removeRequested(int index);
    void duplicateRequested(int index);
    void moveRequested(int from, int to);
    void settingsRequested();
    void editorFocusRequested();

public slots:
    void rebuild();
    void updateSelection();

protected:
    void keyPressEvent(QKeyEvent* e) override;
    void wheelEvent(QWheelEvent* e) override;
    void resizeEvent(QResizeEvent* e) override;
    void contextMenuEvent(QContextMenuEvent* e) override;

private:
    void layoutCards();
    QPointF slotPos(int slot) const;
    int columns() const;

    ProjectDocument* doc_;
    QGraphicsScene scene_;
    StepCard* startCard_ = nullptr;
    std::vector<StepCard*> cards_;
    std::vector<InsertHandle*> handles_;
    ConnectorLayer* connectors_ = nullptr;
    QGraphicsRectItem* dropMarker_ = nullptr;
    double zoom_ = 1.0;
    int cols_ = 1;
};

}  // namespace heatchain::gui
