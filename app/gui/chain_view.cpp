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

#include "heatchain_view/format.hpp"
#include "heatchain_view/palette.hpp"
#include "heatchain_view/step_icons.hpp"

namespace heatchain::gui {

using namespace heatchain::view;

namespace {
constexpr double kCardW = 212, kCardH = 146, kGapX = 44, kGapY = 46, kMargin = 20;
QString qs(const std::string& s) { return QString::fromStdString(s); }
}  // namespace

// ---------------------------------------------------------------------------
// One card. Holds ready-made strings so painting stays cheap on big sheets.
class StepCard : public QGraphicsItem {
public:
    StepCard(ChainView* view, int index) : view_(view), index_(index) {
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
        title_ = qs(p.substance.name.empty() ? p.substanceId : p.substance.name);
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
        colour_ = view_->stepColourOf(i);
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
                const double scale = std::max({std::fabs(sr.Q), std::fabs(sr.W), std::fabs(sr.dH), 1e-30});
                if (std::fabs(sr.Q) > 1e-9 * scale || !isPressureChangeKind(s.kind))
                    qw << QStringLiteral("Q %1").arg(formatWithUnit(sr.Q, eD, u, ctx, 4));
                if (std::fabs(sr.W) > 1e-9 * scale || isPressureChangeKind(s.kind))
                    qw << QStringLiteral("W %1").arg(formatWithUnit(sr.W, eD, u, ctx, 4));
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
        view_->cardPressed(index_);
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
            view_->cardDropped(index_, sceneBoundingRect().center());
        else
            setPos(pressPos_);
    }
    void mouseDoubleClickEvent(QGraphicsSceneMouseEvent*) override {
        if (index_ < 0) emit view_->settingsRequested();
        else emit view_->editorFocusRequested();
    }
    QVariant itemChange(GraphicsItemChange change, const QVariant& value) override {
        if (change == ItemPositionHasChanged && isUnderMouse() && index_ >= 0 && zValue() > 0)
            view_->cardDragged(index_, sceneBoundingRect().center());
        return QGraphicsItem::itemChange(change, value);
    }
    void contextMenuEvent(QGraphicsSceneContextMenuEvent* e) override {
        view_->cardPressed(index_);
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
    InsertHandle(ChainView* view, int insertIndex) : view_(view), index_(insertIndex) {
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
        view_->showAddMenu(index_, e->screenPos());
        e->accept();
    }

private:
    ChainView* view_;
    int index_;
    bool hover_ = false;
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

int ChainView::columns() const {
    const double width = viewport()->width() / zoom_ - 2 * kMargin + kGapX;
    return std::max(1, int(width / (kCardW + kGapX)));
}

QPointF ChainView::slotPos(int slot) const {
    const int row = slot / cols_, col = slot % cols_;
    return {kMargin + col * (kCardW + kGapX), kMargin + row * (kCardH + kGapY)};
}

void ChainView::rebuild() {
    const Project& p = doc_->project();
    const SequenceResult& r = doc_->result();
    if (!startCard_) {
        startCard_ = new StepCard(this, -1);
        scene_.addItem(startCard_);
    }
    startCard_->setStart(p, r);
    const int n = int(p.steps.size());
    // Reuse cards: an edit on a big sheet repaints, it does not rebuild.
    while (int(cards_.size()) > n) {
        delete cards_.back();
        cards_.pop_back();
        delete handles_.back();
        handles_.pop_back();
    }
    while (int(cards_.size()) < n) {
        auto* c = new StepCard(this, int(cards_.size()));
        scene_.addItem(c);
        cards_.push_back(c);
        auto* h = new InsertHandle(this, int(handles_.size()));
        scene_.addItem(h);
        handles_.push_back(h);
    }
    for (int i = 0; i < n; ++i) cards_[std::size_t(i)]->setStep(p, r, i);
    layoutCards();
    updateSelection();
}

void ChainView::layoutCards() {
    cols_ = columns();
    startCard_->setPos(slotPos(0));
    std::vector<QPolygonF> paths;
    for (std::size_t i = 0; i < cards_.size(); ++i) {
        const int slot = int(i) + 1;
        cards_[i]->setPos(slotPos(slot));
        const QPointF from = slotPos(slot - 1), to = slotPos(slot);
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
        handles_[i]->setPos(mid);
        handles_[i]->setInsertIndex(int(i));
    }
    connectors_->setPaths(std::move(paths));
    const QPointF last = slotPos(int(cards_.size()));
    const double rows = std::ceil(double(cards_.size() + 1) / cols_);
    scene_.setSceneRect(0, 0, std::max(kMargin * 2 + cols_ * (kCardW + kGapX), last.x() + kCardW + kMargin),
                        kMargin * 2 + rows * (kCardH + kGapY));
}

void ChainView::updateSelection() {
    const int sel = doc_->selectedStep();
    for (std::size_t i = 0; i < cards_.size(); ++i) cards_[i]->setSelectedCard(int(i) == sel);
    // No step selected: the Start card is what the step panel edits.
    startCard_->setSelectedCard(sel < 0);
    if (sel >= 0 && sel < int(cards_.size())) ensureVisible(cards_[std::size_t(sel)], 20, 20);
}

CardEmphasis ChainView::cardEmphasis(int index) const {
    if (index == -1 && startCard_) return startCard_->emphasis();
    if (index < 0 || index >= int(cards_.size())) return {};
    return cards_[std::size_t(index)]->emphasis();
}

QColor ChainView::cardColour(int index) const {
    if (index < 0 || index >= int(cards_.size())) return {};
    return cards_[std::size_t(index)]->colour();
}

QRectF ChainView::cardRect(int index) const {
    if (index == -1 && startCard_) return startCard_->sceneBoundingRect();
    if (index < 0 || index >= int(cards_.size())) return {};
    return cards_[std::size_t(index)]->sceneBoundingRect();
}

int ChainView::dropIndex(int from, QPointF c) const {
    const int n = int(cards_.size());
    const int row = std::max(0, int(std::floor((c.y() - kMargin + kGapY / 2) / (kCardH + kGapY))));
    const int col = std::clamp(int(std::floor((c.x() - kMargin + kGapX / 2 + kCardW / 2) / (kCardW + kGapX))), 0, cols_);
    // The card goes before this slot; slot 0 is the start card.
    const int slot = row * cols_ + col;
    const int before = std::clamp(slot - 1, 0, n);
    const int to = before > from ? before - 1 : before;
    return std::clamp(to, 0, n - 1);
}

void ChainView::cardPressed(int index) {
    setFocus();
    doc_->setSelectedStep(index);
}

void ChainView::cardDragged(int index, QPointF centre) {
    const int to = dropIndex(index, centre);
    const int slot = (to > index ? to + 1 : to) + 1;  // card slot the marker stands before
    const QPointF pos = slotPos(std::min(slot, int(cards_.size()) + 1));
    dropMarker_->setRect(QRectF(pos.x() - kGapX / 2 - 2, pos.y(), 4, kCardH));
    dropMarker_->setVisible(to != index);
}

void ChainView::cardDropped(int index, QPointF centre) {
    dropMarker_->hide();
    const int to = dropIndex(index, centre);
    if (to != index) emit moveRequested(index, to);
    else layoutCards();
}

// Menu choices act once the menu and the item that opened it are done with
// their events: the edit may delete that very item.
void ChainView::showAddMenu(int insertIndex, QPoint screenPos) {
    QMenu menu(this);
    menu.addSection(tr("Insert step %1").arg(insertIndex + 1));
    for (StepKind k : allStepKinds()) {
        QAction* a = menu.addAction(stepIcon(k), stepKindTitle(k));
        connect(a, &QAction::triggered, this, [this, insertIndex, k] { QTimer::singleShot(0, this, [=, this] { emit addRequested(insertIndex, k); }); });
    }
    menu.exec(screenPos);
}

void ChainView::showCardMenu(int index, QPoint screenPos) {
    QMenu menu(this);
    QMenu* before = menu.addMenu(tr("Insert before"));
    QMenu* after = menu.addMenu(tr("Insert after"));
    for (StepKind k : allStepKinds()) {
        connect(before->addAction(stepIcon(k), stepKindTitle(k)), &QAction::triggered, this,
                [this, index, k] { QTimer::singleShot(0, this, [=, this] { emit addRequested(index, k); }); });
        connect(after->addAction(stepIcon(k), stepKindTitle(k)), &QAction::triggered, this,
                [this, index, k] { QTimer::singleShot(0, this, [=, this] { emit addRequested(index + 1, k); }); });
    }
    menu.addSeparator();
    connect(menu.addAction(tr("Duplicate")), &QAction::triggered, this, [this, index] { QTimer::singleShot(0, this, [=, this] { emit duplicateRequested(index); }); });
    QAction* earlier = menu.addAction(tr("Move earlier"));
    earlier->setEnabled(index > 0);
    connect(earlier, &QAction::triggered, this, [this, index] { QTimer::singleShot(0, this, [=, this] { emit moveRequested(index, index - 1); }); });
    QAction* later = menu.addAction(tr("Move later"));
    later->setEnabled(index + 1 < int(cards_.size()));
    connect(later, &QAction::triggered, this, [this, index] { QTimer::singleShot(0, this, [=, this] { emit moveRequested(index, index + 1); }); });
    menu.addSeparator();
    connect(menu.addAction(tr("Delete")), &QAction::triggered, this, [this, index] { QTimer::singleShot(0, this, [=, this] { emit removeRequested(index); }); });
    menu.exec(screenPos);
}

void ChainView::contextMenuEvent(QContextMenuEvent* e) {
    if (itemAt(e->pos())) {
        QGraphicsView::contextMenuEvent(e);
        return;
    }
    showAddMenu(int(cards_.size()), e->globalPos());
}

void ChainView::keyPressEvent(QKeyEvent* e) {
    const int n = int(cards_.size());
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
        doc_->setSelectedStep(std::min(n - 1, sel + cols_));
        return;
    case Qt::Key_Up:
        doc_->setSelectedStep(std::max(0, sel - cols_));
        return;
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
