#include "chain_view.hpp"

#include <QContextMenuEvent>
#include <QGraphicsItem>
#include <QGraphicsSceneMouseEvent>
#include <QKeyEvent>
#include <QMenu>
#include <QPainter>
#include <QPainterPath>
#include <QScrollBar>
#include <QStyleOptionGraphicsItem>
#include <QTimer>
#include <QWheelEvent>
#include <cmath>

#include "heatchain/rules.hpp"
#include "heatchain_view/format.hpp"
#include "heatchain_view/palette.hpp"
#include "heatchain_view/step_icons.hpp"

namespace heatchain::gui {

using namespace heatchain::view;

namespace {
constexpr double kCardW = 212, kCardH = 146, kGapX = 44, kGapY = 46, kMargin = 20;
// Several streams: each lane starts with a header strip naming its stream.
constexpr double kLaneHeaderH = 30;
using heatchain::view::qs;
}  // namespace

// ---------------------------------------------------------------------------
// One card. Holds ready-made strings so painting stays cheap on big sheets.
class StepCard : public QGraphicsItem {
public:
    StepCard(ChainView* view, int lane, int index) : view_(view), lane_(lane), index_(index) {
        setFlag(ItemIsMovable, index >= 0);
        setFlag(ItemSendsGeometryChanges, index >= 0);
        setAcceptHoverEvents(true);
        setCursor(index >= 0 ? Qt::OpenHandCursor : Qt::ArrowCursor);
        // A card is drawn once into a pixmap and blitted until its text
        // changes: an edit on a long sheet re-renders only the cards it moved.
        setCacheMode(DeviceCoordinateCache);
    }
    QRectF boundingRect() const override { return {-2, -2, kCardW + 4, kCardH + 4}; }

    int index() const { return index_; }
    int lane() const { return lane_; }
    QColor colour() const { return colour_; }
    void setSelectedCard(bool on) {
        if (selected_ != on) {
            selected_ = on;
            update();
        }
    }

    void setStart(const Project& p, const SequenceResult& r) {
        kind_.reset();
        colour_ = QColor();
        accent_ = QColor(0x4d, 0x55, 0x60);
        heading_ = p.steps.empty() ? QStringLiteral("Start · click to choose") : QStringLiteral("Start");
        title_ = qs(p.substance.displayName());
        const QString model = modelTitle(p.model);
        spec_ = QStringLiteral("%1 · %2").arg(model, p.system == SystemKind::Closed
                                                         ? QStringLiteral("closed batch")
                                                         : QStringLiteral("steady flow"));
        const UnitContext ctx = displayContext(p);
        const Dimension basisDim = p.basis.kind == Basis::Kind::Mass ? Dimension::Mass
                                 : p.basis.kind == Basis::Kind::Amount ? Dimension::Amount
                                 : p.basis.kind == Basis::Kind::MassFlow ? Dimension::MassFlow
                                                                         : Dimension::MolarFlow;
        if (r.startError) {
            line1_ = QStringLiteral("start state not computed");
            line2_.clear();
            line3_ = QStringLiteral("basis %1").arg(qs(p.basis.amount.text));
            error_ = qs(r.startError->message);
        } else {
            line1_ = QStringLiteral("%1   %2").arg(
                formatWithUnit(r.start.T, Dimension::Temperature, p.displayUnits, ctx),
                formatWithUnit(r.start.P, Dimension::Pressure, p.displayUnits, ctx));
            line2_ = phaseText(r.start);
            line3_ = QStringLiteral("basis %1").arg(
                formatWithUnit(p.basis.amount.si, basisDim, p.displayUnits, ctx));
            error_.clear();
        }
        warnings_.clear();
        for (const std::string& w : r.warnings) warnings_ << qs(w);
        notes_.clear();
        for (const std::string& n : notesOf(r)) notes_ << qs(n);
        finish();
    }

    void setStep(const Project& p, const SequenceResult& r, int i) {
        const Step& s = p.steps[std::size_t(i)];
        kind_ = s.kind;
        colour_ = view_->stepColourOf(lane_, i);
        accent_ = familyAccent(kindFamily(s.kind));
        heading_ = QStringLiteral("%1  ·  %2").arg(i + 1).arg(stepKindTitle(s.kind));
        title_ = qs(s.id);
        spec_ = stepSpecSummary(s, p.system);
        if (spec_.isEmpty()) spec_ = isPhaseChangeKind(s.kind) ? QStringLiteral("whole change")
                                                               : QStringLiteral("(no target)");
        error_.clear();
        warnings_.clear();
        notes_.clear();
        line1_.clear(); line2_.clear(); line3_.clear();
        if (i < int(r.steps.size())) {
            const StepResult& sr = r.steps[std::size_t(i)];
            const UnitContext ctx = displayContext(p);
            const UnitSystem u = p.displayUnits;
            if (sr.computed) {
                line1_ = QStringLiteral("→ %1   %2").arg(
                    formatWithUnit(sr.end.T, Dimension::Temperature, u, ctx),
                    formatWithUnit(sr.end.P, Dimension::Pressure, u, ctx));
                line2_ = phaseText(sr.end);
                const Dimension eD = energyDimension(r.system);
                QStringList qw;
                const double scale = energyScale(sr);
                if (!showsAsZero(sr.Q, scale) || !isPressureChangeKind(s.kind))
                    qw << QStringLiteral("Q %1").arg(formatWithUnit(forDisplay(sr.Q, scale), eD, u, ctx, 4));
                if (!showsAsZero(sr.W, scale) || isPressureChangeKind(s.kind))
                    qw << QStringLiteral("W %1").arg(formatWithUnit(forDisplay(sr.W, scale), eD, u, ctx, 4));
                // Heat transfer: a batch step's time, or the area a flowing step needs.
                if (sr.batch)
                    qw << QStringLiteral("t %1 min").arg(QString::number(sr.batch->duration / 60.0, 'f', 1));
                else if (sr.transfer && sr.transfer->area)
                    qw << QStringLiteral("A %1").arg(formatWithUnit(*sr.transfer->area, Dimension::Area, u, ctx, 3));
                line3_ = qw.join(QStringLiteral("   "));
            } else if (!sr.error) {
                line1_ = QStringLiteral("not computed (an earlier step failed)");
            }
            if (sr.error) error_ = qs(sr.error->message);
            for (const std::string& w : sr.warnings) warnings_ << qs(w);
            for (const std::string& n : notesOf(sr)) notes_ << qs(n);
        }
        finish();
    }

    void paint(QPainter* p, const QStyleOptionGraphicsItem*, QWidget*) override {
        p->setRenderHint(QPainter::Antialiasing, true);
        const QRectF r(0, 0, kCardW, kCardH);
        const CardEmphasis em = emphasis();
        QColor border = em.border;
        double bw = em.borderWidth;
        if (selected_) { border = ink::selection(); bw = 2.6; }
        p->setPen(Qt::NoPen);
        p->setBrush(QColor(0, 0, 0, 18));
        p->drawRoundedRect(r.translated(1.5, 2), 6, 6);
        p->setBrush(selected_ ? QColor(0xf3, 0xf7, 0xfd) : ink::cardFace());
        p->setPen(QPen(border, bw));
        p->drawRoundedRect(r, 6, 6);
        // Family accent down the left edge.
        QPainterPath bar;
        bar.addRoundedRect(QRectF(0, 0, 6, kCardH), 3, 3);
        p->fillPath(bar, accent_);

        const double x = 14, w = kCardW - x - 8;
        QFont f = p->font();
        QFont small = f;
        small.setPointSizeF(f.pointSizeF() * 0.86);
        QFont bold = f;
        bold.setBold(true);

        if (kind_) drawStepIcon(*p, QRectF(x, 7, 20, 20), *kind_, accent_.darker(120));
        p->setFont(small);
        p->setPen(ink::muted());
        p->drawText(QRectF(x + (kind_ ? 26 : 0), 8, w - 50, 18), Qt::AlignVCenter, heading_);
        // The step's colour on the charts, so card and curve can be matched.
        if (colour_.isValid()) {
            p->setPen(Qt::NoPen);
            p->setBrush(colour_);
            p->drawRoundedRect(QRectF(kCardW - 30, 12, 20, 8), 3, 3);
        }
        if (em.level == CardEmphasis::Level::Warning) {
            QPolygonF tri;
            tri << QPointF(kCardW - 44, 22) << QPointF(kCardW - 37, 9) << QPointF(kCardW - 30 - 0, 22);
            tri.translate(-6, 0);
            p->setPen(QPen(ink::warning().darker(110), 1));
            p->setBrush(ink::warning());
            p->drawPolygon(tri);
            p->setPen(Qt::white);
            p->setFont(small);
            p->drawText(QRectF(kCardW - 50, 12, 14, 10), Qt::AlignCenter, QStringLiteral("!"));
        }

        p->setFont(bold);
        p->setPen(ink::text());
        const QFontMetricsF fmB(bold);
        p->drawText(QRectF(x, 30, w, 18), Qt::AlignVCenter,
                    fmB.elidedText(title_, Qt::ElideRight, w));
        p->setFont(small);
        p->setPen(ink::muted());
        const QFontMetricsF fmS(small);
        p->drawText(QRectF(x, 48, w, 16), Qt::AlignVCenter, fmS.elidedText(spec_, Qt::ElideRight, w));
        p->setPen(QPen(ink::grid(), 1));
        p->drawLine(QPointF(x, 68), QPointF(kCardW - 8, 68));

        p->setFont(f);
        p->setPen(ink::text());
        const QFontMetricsF fm(f);
        p->drawText(QRectF(x, 72, w, 18), Qt::AlignVCenter, fm.elidedText(line1_, Qt::ElideRight, w));
        p->setPen(QColor(0x2b, 0x55, 0x7d));
        p->drawText(QRectF(x, 90, w, 18), Qt::AlignVCenter, fm.elidedText(line2_, Qt::ElideRight, w));
        p->setPen(ink::text());
        p->drawText(QRectF(x, 108, w, 18), Qt::AlignVCenter, fm.elidedText(line3_, Qt::ElideRight, w));

        if (!em.line.isEmpty()) {
            QFont lineFont = small;
            lineFont.setBold(em.bold);
            p->setFont(lineFont);
            p->setPen(em.lineColour);
            p->drawText(QRectF(x, 126, w, 16), Qt::AlignVCenter,
                        QFontMetricsF(lineFont).elidedText(em.line, Qt::ElideRight, w));
        }
    }

    // How the card shows its messages, decided once for painting and tests:
    // an error or a warning marks the border and takes the last line in
    // bold; notes are ordinary facts, one quiet line, the rest in the tooltip.
    CardEmphasis emphasis() const {
        CardEmphasis e;
        e.border = QColor(0xc4, 0xc9, 0xd0);
        if (!error_.isEmpty()) {
            e.level = CardEmphasis::Level::Error;
            e.border = ink::error();
            e.borderWidth = 1.6;
            e.line = QStringLiteral("✖ ") + error_;
            e.lineColour = ink::error();
        } else if (!warnings_.isEmpty()) {
            e.level = CardEmphasis::Level::Warning;
            e.border = ink::warning();
            e.borderWidth = 1.6;
            e.line = QStringLiteral("⚠ ") + warnings_.front() +
                     (warnings_.size() > 1 ? QStringLiteral(" (+%1)").arg(warnings_.size() - 1) : QString());
            e.lineColour = ink::warning().darker(140);
            e.bold = true;
        } else if (!notes_.isEmpty()) {
            e.level = CardEmphasis::Level::Note;
            // U+2139, not a circled i: DejaVu Sans, the usual fallback, has it.
            e.line = QStringLiteral("ℹ ") + notes_.front();
            e.lineColour = ink::muted();
        }
        return e;
    }

protected:
    void mousePressEvent(QGraphicsSceneMouseEvent* e) override {
        view_->cardPressed(lane_, index_);
        pressPos_ = pos();
        if (index_ >= 0) setCursor(Qt::ClosedHandCursor);
        setZValue(10);
        QGraphicsItem::mousePressEvent(e);
    }
    void mouseReleaseEvent(QGraphicsSceneMouseEvent* e) override {
        QGraphicsItem::mouseReleaseEvent(e);
        setZValue(0);
        if (index_ < 0) return;
        setCursor(Qt::OpenHandCursor);
        if ((pos() - pressPos_).manhattanLength() > 12)
            view_->cardDropped(lane_, index_, sceneBoundingRect().center());
        else
            setPos(pressPos_);
    }
    void mouseDoubleClickEvent(QGraphicsSceneMouseEvent*) override {
        if (index_ < 0) emit view_->settingsRequested();
        else emit view_->editorFocusRequested();
    }
    QVariant itemChange(GraphicsItemChange change, const QVariant& value) override {
        if (change == ItemPositionHasChanged && isUnderMouse() && index_ >= 0 && zValue() > 0)
            view_->cardDragged(lane_, index_, sceneBoundingRect().center());
        return QGraphicsItem::itemChange(change, value);
    }
    void contextMenuEvent(QGraphicsSceneContextMenuEvent* e) override {
        view_->cardPressed(lane_, index_);
        if (index_ >= 0) view_->showCardMenu(index_, e->screenPos());
        else view_->showAddMenu(0, e->screenPos());
        e->accept();
    }

private:
    void finish() {
        const QString key = heading_ + QChar(1) + title_ + QChar(1) + spec_ + QChar(1) + line1_ +
                            QChar(1) + line2_ + QChar(1) + line3_ + QChar(1) + error_ + QChar(1) +
                            warnings_.join(QChar(2)) + QChar(1) + notes_.join(QChar(2)) + QChar(1) + colour_.name();
        if (key == key_) return;
        key_ = key;
        QStringList tip;
        tip << QStringLiteral("<b>%1</b> — %2").arg(title_.toHtmlEscaped(), heading_.toHtmlEscaped());
        tip << spec_.toHtmlEscaped();
        if (!line1_.isEmpty()) tip << QStringLiteral("%1<br>%2<br>%3").arg(line1_, line2_, line3_);
        if (!error_.isEmpty()) tip << QStringLiteral("<span style='color:#b42318'>Error: %1</span>").arg(error_.toHtmlEscaped());
        for (const QString& w : warnings_)
            tip << QStringLiteral("<span style='color:#8a5a00'><b>Warning:</b> %1</span>").arg(w.toHtmlEscaped());
        for (const QString& n : notes_)
            tip << QStringLiteral("<span style='color:#6b727a'>Note: %1</span>").arg(n.toHtmlEscaped());
        setToolTip(tip.join(QStringLiteral("<br>")));
        update();
    }

    ChainView* view_;
    int lane_;
    int index_;
    bool selected_ = false;
    QPointF pressPos_;
    std::optional<StepKind> kind_;
    QColor colour_, accent_;
    QString heading_, title_, spec_, line1_, line2_, line3_, error_, key_;
    QStringList warnings_, notes_;
};

// ---------------------------------------------------------------------------
// All arrows between cards in one item (one paint call for the whole chain).
class ConnectorLayer : public QGraphicsItem {
public:
    QRectF boundingRect() const override { return bounds_; }
    void setPaths(std::vector<QPolygonF> paths) {
        // The layer spans the whole chain: updating it repaints the whole
        // viewport, so only when an arrow actually moved.
        if (paths == paths_) return;
        prepareGeometryChange();
        paths_ = std::move(paths);
        QRectF b;
        for (const QPolygonF& poly : paths_) b |= poly.boundingRect();
        bounds_ = b.adjusted(-8, -8, 8, 8);
        update();
    }
    void paint(QPainter* p, const QStyleOptionGraphicsItem*, QWidget*) override {
        p->setRenderHint(QPainter::Antialiasing, true);
        const QColor c(0x8a, 0x92, 0x9c);
        for (const QPolygonF& poly : paths_) {
            if (poly.size() < 2) continue;
            p->setPen(QPen(c, 1.6, Qt::SolidLine, Qt::RoundCap, Qt::RoundJoin));
            p->setBrush(Qt::NoBrush);
            p->drawPolyline(poly);
            const QPointF tip = poly.back();
            QPointF dir = tip - poly[poly.size() - 2];
            const double len = std::hypot(dir.x(), dir.y());
            if (len < 1e-6) continue;
            dir /= len;
            const QPointF n(-dir.y(), dir.x());
            QPolygonF head;
            head << tip << tip - dir * 9 + n * 4.5 << tip - dir * 9 - n * 4.5;
            p->setPen(Qt::NoPen);
            p->setBrush(c);
            p->drawPolygon(head);
        }
    }

private:
    std::vector<QPolygonF> paths_;
    QRectF bounds_;
};

// A small "+" on each arrow: click to insert a step there.
class InsertHandle : public QGraphicsItem {
public:
    InsertHandle(ChainView* view, int lane, int insertIndex) : view_(view), lane_(lane), index_(insertIndex) {
        setAcceptHoverEvents(true);
        setCursor(Qt::PointingHandCursor);
        setToolTip(QStringLiteral("Insert a step here"));
        setZValue(2);
    }
    void setInsertIndex(int i) { index_ = i; }
    QRectF boundingRect() const override { return {-9, -9, 18, 18}; }
    void paint(QPainter* p, const QStyleOptionGraphicsItem*, QWidget*) override {
        p->setRenderHint(QPainter::Antialiasing, true);
        p->setPen(QPen(hover_ ? ink::selection() : QColor(0xa0, 0xa7, 0xb0), 1.2));
        p->setBrush(hover_ ? QColor(0xe6, 0xef, 0xfb) : Qt::white);
        p->drawEllipse(QPointF(0, 0), 7.5, 7.5);
        p->drawLine(QPointF(-3.5, 0), QPointF(3.5, 0));
        p->drawLine(QPointF(0, -3.5), QPointF(0, 3.5));
    }

protected:
    void hoverEnterEvent(QGraphicsSceneHoverEvent*) override { hover_ = true; update(); }
    void hoverLeaveEvent(QGraphicsSceneHoverEvent*) override { hover_ = false; update(); }
    void mousePressEvent(QGraphicsSceneMouseEvent* e) override {
        view_->lanePressed(lane_, index_ - 1);
        view_->showAddMenu(index_, e->screenPos());
        e->accept();
    }

private:
    ChainView* view_;
    int lane_;
    int index_;
    bool hover_ = false;
};

// A stream's lane, behind its cards: a header strip with the stream's id,
// name and material, and a band that marks the current stream.
class LaneItem : public QGraphicsItem {
public:
    LaneItem(ChainView* view, int lane) : view_(view), lane_(lane) {
        setZValue(-1);
        setCacheMode(DeviceCoordinateCache);
    }
    QRectF boundingRect() const override { return rect_.adjusted(-2, -2, 2, 2); }
    void setGeometry(const QRectF& r) {
        if (r == rect_) return;
        prepareGeometryChange();
        rect_ = r;
        update();
    }
    void setText(const QString& id, const QString& rest, const QString& tip) {
        if (id == id_ && rest == rest_) return;
        id_ = id;
        rest_ = rest;
        setToolTip(tip);
        update();
    }
    void setCurrent(bool on) {
        if (on == current_) return;
        current_ = on;
        update();
    }
    // The header's text starts at the left edge of what the view shows, so
    // the stream stays named while its row is scrolled sideways.
    void setTextLeft(double sceneX) {
        const double x = std::max(0.0, sceneX - rect_.left());
        if (std::fabs(x - textLeft_) < 0.5) return;
        textLeft_ = x;
        update();
    }
    QString label() const { return rest_.isEmpty() ? id_ : id_ + QStringLiteral(" — ") + rest_; }
    bool isCurrent() const { return current_; }
    void paint(QPainter* p, const QStyleOptionGraphicsItem*, QWidget*) override {
        p->setRenderHint(QPainter::Antialiasing, true);
        p->setPen(QPen(current_ ? QColor(0x9d, 0xb7, 0xd8) : QColor(0xd6, 0xda, 0xdf), current_ ? 1.4 : 1));
        p->setBrush(current_ ? QColor(0xe6, 0xee, 0xf8) : QColor(0xf6, 0xf7, 0xf8));
        p->drawRoundedRect(rect_, 8, 8);
        const double shift = std::min(textLeft_, std::max(0.0, rect_.width() - 200));
        const QRectF strip(rect_.left() + 12 + shift, rect_.top() + 4, rect_.width() - 24 - shift, kLaneHeaderH - 8);
        QFont f = p->font();
        QFont bold = f;
        bold.setBold(true);
        p->setFont(bold);
        p->setPen(current_ ? ink::selection().darker(130) : ink::text());
        const QFontMetricsF fb(bold);
        const QString idText = id_;
        p->drawText(strip, Qt::AlignLeft | Qt::AlignVCenter, idText);
        p->setFont(f);
        p->setPen(ink::muted());
        const double x = fb.horizontalAdvance(idText) + 12;
        p->drawText(strip.adjusted(x, 0, 0, 0), Qt::AlignLeft | Qt::AlignVCenter,
                    QFontMetricsF(f).elidedText(rest_, Qt::ElideRight, strip.width() - x));
    }

protected:
    void mousePressEvent(QGraphicsSceneMouseEvent* e) override {
        view_->lanePressed(lane_, -1);
        e->accept();
    }
    void contextMenuEvent(QGraphicsSceneContextMenuEvent* e) override {
        view_->lanePressed(lane_, -1);
        view_->showLaneMenu(lane_, e->screenPos());
        e->accept();
    }

private:
    ChainView* view_;
    int lane_;
    QRectF rect_;
    QString id_, rest_;
    bool current_ = false;
    double textLeft_ = 0;
};

// ---------------------------------------------------------------------------
ChainView::ChainView(ProjectDocument* doc, QWidget* parent) : QGraphicsView(parent), doc_(doc) {
    setScene(&scene_);
    setRenderHint(QPainter::Antialiasing, true);
    setAlignment(Qt::AlignLeft | Qt::AlignTop);
    setBackgroundBrush(QColor(0xef, 0xf1, 0xf3));
    setViewportUpdateMode(QGraphicsView::MinimalViewportUpdate);
    setFocusPolicy(Qt::StrongFocus);
    setDragMode(QGraphicsView::NoDrag);
    connectors_ = new ConnectorLayer;
    scene_.addItem(connectors_);
    dropMarker_ = scene_.addRect(QRectF(0, 0, 4, kCardH), Qt::NoPen, QColor(0x1f, 0x5f, 0xa8));
    dropMarker_->setZValue(20);
    dropMarker_->hide();
    connect(doc_, &ProjectDocument::changed, this, &ChainView::rebuild);
    connect(doc_, &ProjectDocument::selectionChanged, this, &ChainView::updateSelection);
    rebuild();
}

ChainView::~ChainView() { lanes_.clear(); }

int ChainView::columns() const {
    const double width = viewport()->width() / zoom_ - 2 * kMargin + kGapX;
    return std::max(1, int(width / (kCardW + kGapX)));
}

bool ChainView::hasLanes() const { return lanes_.size() > 1; }

QPointF ChainView::slotPos(int slot) const { return slotPos(doc_->currentStream(), slot); }

int ChainView::wrapColumns() const {
    // Several streams: each lane is one row, scrolled sideways, so the
    // streams stay one above the other.
    return hasLanes() ? (1 << 20) : cols_;
}

QPointF ChainView::slotPos(int lane, int slot) const {
    const int cols = wrapColumns();
    const int row = slot / cols, col = slot % cols;
    const double top = lane >= 0 && lane < int(lanes_.size()) ? lanes_[std::size_t(lane)].top : 0;
    const double header = hasLanes() ? kLaneHeaderH : 0;
    return {kMargin + col * (kCardW + kGapX), top + header + kMargin + row * (kCardH + kGapY)};
}

ChainView::Lane& ChainView::currentLane() { return lanes_[std::size_t(doc_->currentStream())]; }
const ChainView::Lane& ChainView::currentLane() const { return lanes_[std::size_t(doc_->currentStream())]; }

void ChainView::removeLane(Lane& lane) {
    delete lane.item;
    delete lane.start;
    for (StepCard* c : lane.cards) delete c;
    for (InsertHandle* h : lane.handles) delete h;
    lane = Lane{};
}

void ChainView::rebuild() {
    const StreamSet& set = doc_->streams();
    const std::vector<SequenceResult>& results = doc_->results();
    const int lanes = int(set.streams.size());
    while (int(lanes_.size()) > lanes) {
        removeLane(lanes_.back());
        lanes_.pop_back();
    }
    while (int(lanes_.size()) < lanes) lanes_.emplace_back();
    for (int k = 0; k < lanes; ++k) {
        Lane& lane = lanes_[std::size_t(k)];
        const Stream& stream = set.streams[std::size_t(k)];
        const Project& p = stream.project;
        const SequenceResult& r = results[std::size_t(k)];
        // One stream: the canvas is the chain alone, as it always was.
        if (lanes > 1 && !lane.item) {
            lane.item = new LaneItem(this, k);
            scene_.addItem(lane.item);
        } else if (lanes == 1 && lane.item) {
            delete lane.item;
            lane.item = nullptr;
        }
        if (lane.item) {
            const QString material = qs(p.substance.displayName());
            const QString system = p.system == SystemKind::Closed ? tr("closed batch") : tr("steady flow");
            QString rest = stream.name ? qs(*stream.name) + QStringLiteral("  ·  ") : QString();
            rest += material + QStringLiteral(" · ") + system;
            lane.item->setText(qs(stream.id), rest,
                               tr("Stream %1 (%2 of %3): %4. Click to show it in the step panel, ledger and charts; "
                                  "right-click for the stream's menu.")
                                   .arg(qs(stream.id)).arg(k + 1).arg(lanes).arg(rest.toHtmlEscaped()));
        }
        if (!lane.start) {
            lane.start = new StepCard(this, k, -1);
            scene_.addItem(lane.start);
        }
        lane.start->setStart(p, r);
        const int n = int(p.steps.size());
        // Reuse cards: an edit on a big sheet repaints, it does not rebuild.
        while (int(lane.cards.size()) > n) {
            delete lane.cards.back();
            lane.cards.pop_back();
            delete lane.handles.back();
            lane.handles.pop_back();
        }
        while (int(lane.cards.size()) < n) {
            auto* c = new StepCard(this, k, int(lane.cards.size()));
            scene_.addItem(c);
            lane.cards.push_back(c);
            auto* h = new InsertHandle(this, k, int(lane.handles.size()));
            scene_.addItem(h);
            lane.handles.push_back(h);
        }
        for (int i = 0; i < n; ++i) lane.cards[std::size_t(i)]->setStep(p, r, i);
    }
    layoutCards();
    updateSelection();
}

void ChainView::layoutCards() {
    cols_ = columns();
    std::vector<QPolygonF> paths;
    double widest = kMargin * 2 + cols_ * (kCardW + kGapX) - kGapX;
    if (hasLanes()) {
        std::size_t longest = 0;
        for (const Lane& lane : lanes_) longest = std::max(longest, lane.cards.size());
        widest = std::max(widest, kMargin * 2 + double(longest + 1) * (kCardW + kGapX) - kGapX);
    }
    double top = 0;
    for (std::size_t k = 0; k < lanes_.size(); ++k) {
        Lane& lane = lanes_[k];
        lane.top = top;
        const int lk = int(k);
        lane.start->setPos(slotPos(lk, 0));
        for (std::size_t i = 0; i < lane.cards.size(); ++i) {
            const int slot = int(i) + 1;
            lane.cards[i]->setPos(slotPos(lk, slot));
            const QPointF from = slotPos(lk, slot - 1), to = slotPos(lk, slot);
            QPolygonF poly;
            QPointF mid;
            if (std::fabs(from.y() - to.y()) < 1) {
                poly << QPointF(from.x() + kCardW, from.y() + kCardH / 2) << QPointF(to.x() - 2, to.y() + kCardH / 2);
                mid = (poly[0] + poly[1]) / 2;
            } else {
                // Down from the row's last card, back left, down into the next row.
                const double yMid = from.y() + kCardH + kGapY / 2;
                poly << QPointF(from.x() + kCardW / 2, from.y() + kCardH) << QPointF(from.x() + kCardW / 2, yMid)
                     << QPointF(to.x() + kCardW / 2, yMid) << QPointF(to.x() + kCardW / 2, to.y() - 2);
                mid = QPointF(from.x() + kCardW / 2, yMid);
            }
            paths.push_back(poly);
            lane.handles[i]->setPos(mid);
            lane.handles[i]->setInsertIndex(int(i));
        }
        const double rows = std::ceil(double(lane.cards.size() + 1) / wrapColumns());
        const QPointF last = slotPos(lk, int(lane.cards.size()));
        widest = std::max(widest, last.x() + kCardW + kMargin);
        if (lane.item) {
            const double height = kLaneHeaderH + kMargin + rows * (kCardH + kGapY) - kGapY + 14;
            lane.item->setGeometry(QRectF(kMargin / 2, top + 6, widest - kMargin, height - 6));
            top += height + 8;
        } else {
            top += kMargin * 2 + rows * (kCardH + kGapY);
        }
    }
    connectors_->setPaths(std::move(paths));
    scene_.setSceneRect(0, 0, widest, top + (hasLanes() ? kMargin : 0));
    placeLaneText();
}

void ChainView::placeLaneText() {
    const double left = mapToScene(viewport()->rect().topLeft()).x();
    for (Lane& lane : lanes_)
        if (lane.item) lane.item->setTextLeft(left);
}

void ChainView::scrollContentsBy(int dx, int dy) {
    QGraphicsView::scrollContentsBy(dx, dy);
    if (dx != 0) placeLaneText();
}

void ChainView::updateSelection() {
    const int sel = doc_->selectedStep();
    const int current = doc_->currentStream();
    for (std::size_t k = 0; k < lanes_.size(); ++k) {
        Lane& lane = lanes_[k];
        const bool here = int(k) == current;
        for (std::size_t i = 0; i < lane.cards.size(); ++i) lane.cards[i]->setSelectedCard(here && int(i) == sel);
        // No step selected: the Start card is what the step panel edits.
        lane.start->setSelectedCard(here && sel < 0);
        if (lane.item) lane.item->setCurrent(here);
    }
    if (lanes_.empty()) return;
    const Lane& lane = currentLane();
    if (sel >= 0 && sel < int(lane.cards.size())) ensureVisible(lane.cards[std::size_t(sel)], 20, 20);
    else if (hasLanes()) ensureVisible(lane.start, 20, 20);
}

int ChainView::cardCount() const { return lanes_.empty() ? 0 : int(currentLane().cards.size()); }
int ChainView::laneCount() const { return int(lanes_.size()); }
int ChainView::laneCardCount(int lane) const {
    return lane >= 0 && lane < laneCount() ? int(lanes_[std::size_t(lane)].cards.size()) : 0;
}
QString ChainView::laneLabel(int lane) const {
    if (lane < 0 || lane >= laneCount() || !lanes_[std::size_t(lane)].item) return {};
    return lanes_[std::size_t(lane)].item->label();
}
bool ChainView::laneMarkedCurrent(int lane) const {
    return lane >= 0 && lane < laneCount() && lanes_[std::size_t(lane)].item && lanes_[std::size_t(lane)].item->isCurrent();
}

CardEmphasis ChainView::cardEmphasis(int index) const {
    if (lanes_.empty()) return {};
    const Lane& lane = currentLane();
    if (index == -1) return lane.start->emphasis();
    if (index < 0 || index >= int(lane.cards.size())) return {};
    return lane.cards[std::size_t(index)]->emphasis();
}

QColor ChainView::cardColour(int index) const {
    if (lanes_.empty()) return {};
    const Lane& lane = currentLane();
    if (index < 0 || index >= int(lane.cards.size())) return {};
    return lane.cards[std::size_t(index)]->colour();
}

QRectF ChainView::cardRect(int index) const { return cardRect(doc_->currentStream(), index); }

QRectF ChainView::cardRect(int laneIndex, int index) const {
    if (laneIndex < 0 || laneIndex >= laneCount()) return {};
    const Lane& lane = lanes_[std::size_t(laneIndex)];
    if (index == -1) return lane.start->sceneBoundingRect();
    if (index < 0 || index >= int(lane.cards.size())) return {};
    return lane.cards[std::size_t(index)]->sceneBoundingRect();
}

int ChainView::dropIndex(int from, QPointF c) const {
    const int n = cardCount();
    const QPointF origin = slotPos(0) - QPointF(kMargin, kMargin);  // the current lane's first row
    const double y = c.y() - origin.y();
    const int row = std::max(0, int(std::floor((y - kMargin + kGapY / 2) / (kCardH + kGapY))));
    const int cols = hasLanes() ? n + 1 : cols_;
    const int col = std::clamp(int(std::floor((c.x() - kMargin + kGapX / 2 + kCardW / 2) / (kCardW + kGapX))), 0, cols);
    // The card goes before this slot; slot 0 is the start card.
    const int slot = (hasLanes() ? 0 : row) * cols + col;
    const int before = std::clamp(slot - 1, 0, n);
    const int to = before > from ? before - 1 : before;
    return std::clamp(to, 0, n - 1);
}

void ChainView::cardPressed(int lane, int index) {
    setFocus();
    doc_->setCurrentStream(lane, index);
}

void ChainView::lanePressed(int lane, int step) {
    if (lane != doc_->currentStream()) doc_->setCurrentStream(lane, step);
}

void ChainView::cardDragged(int lane, int index, QPointF centre) {
    if (lane != doc_->currentStream()) return;
    const int to = dropIndex(index, centre);
    const int slot = (to > index ? to + 1 : to) + 1;  // card slot the marker stands before
    const QPointF pos = slotPos(std::min(slot, cardCount() + 1));
    dropMarker_->setRect(QRectF(pos.x() - kGapX / 2 - 2, pos.y(), 4, kCardH));
    dropMarker_->setVisible(to != index);
}

void ChainView::cardDropped(int lane, int index, QPointF centre) {
    dropMarker_->hide();
    const int to = lane == doc_->currentStream() ? dropIndex(index, centre) : index;
    if (to != index) emit moveRequested(index, to);
    else layoutCards();
}

// Menu choices act once the menu and the item that opened it are done with
// their events: the edit may delete that very item.
void ChainView::later(std::function<void()> f) { QTimer::singleShot(0, this, std::move(f)); }

void ChainView::addStepKinds(QMenu* menu, int insertIndex) {
    for (StepKind k : allStepKinds()) {
        QAction* a = menu->addAction(stepIcon(k), stepKindTitle(k));
        connect(a, &QAction::triggered, this, [this, insertIndex, k] { later([=, this] { emit addRequested(insertIndex, k); }); });
    }
}

void ChainView::showAddMenu(int insertIndex, QPoint screenPos) {
    QMenu menu(this);
    menu.addSection(tr("Insert step %1").arg(insertIndex + 1));
    addStepKinds(&menu, insertIndex);
    menu.exec(screenPos);
}

void ChainView::showLaneMenu(int lane, QPoint screenPos) {
    QMenu menu(this);
    const int n = laneCount();
    const QString id = qs(doc_->streams().streams[std::size_t(lane)].id);
    menu.addSection(tr("Stream %1").arg(id));
    addStepKinds(menu.addMenu(tr("Add step at the end")), laneCardCount(lane));
    menu.addSeparator();
    connect(menu.addAction(tr("Rename stream…")), &QAction::triggered, this,
            [this, lane] { later([=, this] { emit renameStreamRequested(lane); }); });
    QAction* up = menu.addAction(tr("Move stream up"));
    up->setEnabled(lane > 0);
    connect(up, &QAction::triggered, this, [this, lane] { later([=, this] { emit moveStreamRequested(lane, lane - 1); }); });
    QAction* down = menu.addAction(tr("Move stream down"));
    down->setEnabled(lane + 1 < n);
    connect(down, &QAction::triggered, this, [this, lane] { later([=, this] { emit moveStreamRequested(lane, lane + 1); }); });
    menu.addSeparator();
    connect(menu.addAction(tr("Add stream…")), &QAction::triggered, this, [this] { later([this] { emit addStreamRequested(); }); });
    QAction* remove = menu.addAction(tr("Remove stream %1").arg(id));
    remove->setEnabled(n > 1);
    connect(remove, &QAction::triggered, this, [this, lane] { later([=, this] { emit removeStreamRequested(lane); }); });
    menu.exec(screenPos);
}

void ChainView::showCardMenu(int index, QPoint screenPos) {
    QMenu menu(this);
    QMenu* before = menu.addMenu(tr("Insert before"));
    QMenu* after = menu.addMenu(tr("Insert after"));
    addStepKinds(before, index);
    addStepKinds(after, index + 1);
    menu.addSeparator();
    connect(menu.addAction(tr("Duplicate")), &QAction::triggered, this, [this, index] { later([=, this] { emit duplicateRequested(index); }); });
    // Copy to another stream of the worksheet (the same step, added at its end).
    if (laneCount() > 1) {
        QMenu* copyTo = menu.addMenu(tr("Copy to stream"));
        const StreamSet& set = doc_->streams();
        for (int k = 0; k < laneCount(); ++k) {
            if (k == doc_->currentStream()) continue;
            const Stream& s = set.streams[std::size_t(k)];
            QString label = qs(s.id);
            if (s.name) label += QStringLiteral(" — ") + qs(*s.name);
            connect(copyTo->addAction(label), &QAction::triggered, this,
                    [this, index, k] { later([=, this] { emit copyStepRequested(index, k); }); });
        }
    }
    QAction* earlier = menu.addAction(tr("Move earlier"));
    earlier->setEnabled(index > 0);
    connect(earlier, &QAction::triggered, this, [this, index] { later([=, this] { emit moveRequested(index, index - 1); }); });
    QAction* laterAction = menu.addAction(tr("Move later"));
    laterAction->setEnabled(index + 1 < cardCount());
    connect(laterAction, &QAction::triggered, this, [this, index] { later([=, this] { emit moveRequested(index, index + 1); }); });
    menu.addSeparator();
    connect(menu.addAction(tr("Delete")), &QAction::triggered, this, [this, index] { later([=, this] { emit removeRequested(index); }); });
    menu.exec(screenPos);
}

void ChainView::contextMenuEvent(QContextMenuEvent* e) {
    if (itemAt(e->pos())) {
        QGraphicsView::contextMenuEvent(e);
        return;
    }
    showAddMenu(cardCount(), e->globalPos());
}

void ChainView::keyPressEvent(QKeyEvent* e) {
    const int n = cardCount();
    const int sel = doc_->selectedStep();
    const bool alt = e->modifiers() & Qt::AltModifier;
    switch (e->key()) {
    case Qt::Key_Right:
        if (alt) { if (sel >= 0 && sel + 1 < n) emit moveRequested(sel, sel + 1); }
        else doc_->setSelectedStep(std::min(n - 1, sel + 1));
        return;
    case Qt::Key_Left:
        if (alt) { if (sel > 0) emit moveRequested(sel, sel - 1); }
        else doc_->setSelectedStep(std::max(sel < 0 ? -1 : 0, sel - 1));
        return;
    case Qt::Key_Down:
    case Qt::Key_Up:
        if (hasLanes()) {
            // The stream below or above, at the same place in its chain.
            const int to = doc_->currentStream() + (e->key() == Qt::Key_Up ? -1 : 1);
            if (to >= 0 && to < laneCount()) doc_->setCurrentStream(to, std::min(sel, laneCardCount(to) - 1));
        } else if (e->key() == Qt::Key_Down) {
            doc_->setSelectedStep(std::min(n - 1, sel + cols_));
        } else {
            doc_->setSelectedStep(std::max(0, sel - cols_));
        }
        return;
    case Qt::Key_PageUp:
    case Qt::Key_PageDown: {
        // The previous or next stream, at its Start card.
        const int to = doc_->currentStream() + (e->key() == Qt::Key_PageUp ? -1 : 1);
        if (to >= 0 && to < laneCount()) doc_->setCurrentStream(to, -1);
        return;
    }
    case Qt::Key_Home: doc_->setSelectedStep(n > 0 ? 0 : -1); return;
    case Qt::Key_End: doc_->setSelectedStep(n - 1); return;
    case Qt::Key_Delete:
    case Qt::Key_Backspace:
        if (sel >= 0) emit removeRequested(sel);
        return;
    case Qt::Key_Return:
    case Qt::Key_Enter:
        if (sel >= 0) emit editorFocusRequested();
        return;
    default:
        break;
    }
    QGraphicsView::keyPressEvent(e);
}

void ChainView::wheelEvent(QWheelEvent* e) {
    if (e->modifiers() & Qt::ControlModifier) {
        zoomBy(e->angleDelta().y() > 0 ? 1.15 : 1 / 1.15);
        e->accept();
        return;
    }
    QGraphicsView::wheelEvent(e);
}

void ChainView::zoomBy(double factor) {
    const double z = std::clamp(zoom_ * factor, 0.3, 2.5);
    setTransform(QTransform::fromScale(z, z));
    zoom_ = z;
    layoutCards();
}

void ChainView::resetZoom() {
    zoom_ = 1.0;
    setTransform(QTransform());
    layoutCards();
}

void ChainView::resizeEvent(QResizeEvent* e) {
    QGraphicsView::resizeEvent(e);
    if (columns() != cols_) {
        layoutCards();
        updateSelection();
    }
}

}  // namespace heatchain::gui
