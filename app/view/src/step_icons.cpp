#include "heatchain_view/step_icons.hpp"

#include <QPainterPath>
#include <QPixmap>

#include "heatchain_view/palette.hpp"

namespace heatchain::view {
namespace {

// All pictograms are drawn on a 24 × 24 grid and scaled to the box.
void thermometer(QPainter& p, bool up) {
    QPainterPath tube;
    tube.addRoundedRect(QRectF(5, 2, 5, 14), 2.5, 2.5);
    p.drawPath(tube);
    p.drawEllipse(QPointF(7.5, 18.5), 3.6, 3.6);
    p.save();
    p.setBrush(p.pen().color());
    p.drawEllipse(QPointF(7.5, 18.5), 2.0, 2.0);
    p.drawRect(QRectF(6.7, up ? 6 : 11, 1.6, up ? 11 : 6));
    p.restore();
    // Chevron: which way the temperature goes.
    QPainterPath arrow;
    if (up) {
        arrow.moveTo(14, 12); arrow.lineTo(18, 7); arrow.lineTo(22, 12);
        arrow.moveTo(18, 7); arrow.lineTo(18, 19);
    } else {
        arrow.moveTo(14, 14); arrow.lineTo(18, 19); arrow.lineTo(22, 14);
        arrow.moveTo(18, 19); arrow.lineTo(18, 7);
    }
    p.drawPath(arrow);
}

void block(QPainter& p, QPointF c) { p.drawRect(QRectF(c.x() - 4, c.y() - 4, 8, 8)); }

void drop(QPainter& p, QPointF c) {
    QPainterPath d;
    d.moveTo(c.x(), c.y() - 6);
    d.cubicTo(c.x() + 1, c.y() - 3, c.x() + 4.5, c.y() - 0.5, c.x() + 4.5, c.y() + 2);
    d.arcTo(QRectF(c.x() - 4.5, c.y() - 2.5, 9, 9), 0, -180);
    d.cubicTo(c.x() - 4.5, c.y() - 0.5, c.x() - 1, c.y() - 3, c.x(), c.y() - 6);
    p.drawPath(d);
}

void bubbles(QPainter& p, QPointF c) {
    p.drawEllipse(QPointF(c.x() - 2.5, c.y() + 2.5), 2.2, 2.2);
    p.drawEllipse(QPointF(c.x() + 2.8, c.y() - 0.5), 1.7, 1.7);
    p.drawEllipse(QPointF(c.x() - 0.5, c.y() - 4.5), 1.4, 1.4);
}

void rightArrow(QPainter& p, double y) {
    QPainterPath a;
    a.moveTo(9.5, y); a.lineTo(14.5, y);
    a.moveTo(12.5, y - 2); a.lineTo(14.5, y); a.lineTo(12.5, y + 2);
    p.drawPath(a);
}

// A bar with two arrows: pressing on it from both sides (compress) or
// leaving it outwards (expand).
void pressureArrows(QPainter& p, bool inward) {
    p.drawLine(QPointF(12, 4), QPointF(12, 20));
    QPainterPath a;
    // From x0 to the head at x1 on the centre line.
    auto arrow = [&a](double x0, double x1) {
        const double back = x1 > x0 ? -2.5 : 2.5;
        a.moveTo(x0, 12); a.lineTo(x1, 12);
        a.moveTo(x1 + back, 9.5); a.lineTo(x1, 12); a.lineTo(x1 + back, 14.5);
    };
    if (inward) {
        arrow(2, 9);
        arrow(22, 15);
    } else {
        arrow(9.5, 2);
        arrow(14.5, 22);
    }
    p.drawPath(a);
}

}  // namespace

void drawStepIcon(QPainter& p, const QRectF& box, StepKind kind, const QColor& ink) {
    p.save();
    p.setRenderHint(QPainter::Antialiasing, true);
    p.translate(box.topLeft());
    const double s = std::min(box.width(), box.height()) / 24.0;
    p.scale(s, s);
    QPen pen(ink, 1.6);
    pen.setCapStyle(Qt::RoundCap);
    pen.setJoinStyle(Qt::RoundJoin);
    p.setPen(pen);
    p.setBrush(Qt::NoBrush);
    const QPointF left(5, 12), right(19.5, 12);
    switch (kind) {
    case StepKind::Heat: thermometer(p, true); break;
    case StepKind::Cool: thermometer(p, false); break;
    case StepKind::Melt: block(p, left); rightArrow(p, 12); drop(p, right); break;
    case StepKind::Freeze: drop(p, left); rightArrow(p, 12); block(p, right); break;
    case StepKind::Boil: drop(p, left); rightArrow(p, 12); bubbles(p, right); break;
    case StepKind::Condense: bubbles(p, left); rightArrow(p, 12); drop(p, right); break;
    case StepKind::Sublimate: block(p, left); rightArrow(p, 12); bubbles(p, right); break;
    case StepKind::Deposit: bubbles(p, left); rightArrow(p, 12); block(p, right); break;
    case StepKind::Compress: pressureArrows(p, true); break;
    case StepKind::Expand: pressureArrows(p, false); break;
    case StepKind::Hold:
        // A clock face: the batch stays put for a time.
        p.drawEllipse(QPointF(12, 12), 8.5, 8.5);
        p.drawLine(QPointF(12, 12), QPointF(12, 6.5));
        p.drawLine(QPointF(12, 12), QPointF(16, 14));
        break;
    case StepKind::Throttle: {
        // A pipe pinched in the middle; the wide outlet side shows the drop.
        QPainterPath pipe;
        pipe.moveTo(2, 8); pipe.lineTo(9, 8); pipe.quadTo(12, 11.5, 15, 6); pipe.lineTo(22, 6);
        pipe.moveTo(2, 16); pipe.lineTo(9, 16); pipe.quadTo(12, 12.5, 15, 18); pipe.lineTo(22, 18);
        p.drawPath(pipe);
        p.save();
        p.setPen(QPen(ink, 1.0, Qt::DotLine));
        p.drawLine(QPointF(16, 12), QPointF(21, 12));
        p.restore();
        break;
    }
    }
    p.restore();
}

QIcon stepIcon(StepKind kind) {
    QIcon icon;
    const QColor ink = familyAccent(kindFamily(kind)).darker(115);
    for (int size : {16, 24, 32, 48}) {
        QPixmap pm(size, size);
        pm.fill(Qt::transparent);
        QPainter p(&pm);
        drawStepIcon(p, QRectF(0, 0, size, size), kind, ink);
        p.end();
        icon.addPixmap(pm);
    }
    return icon;
}

void drawAppMark(QPainter& p, const QRectF& box) {
    p.save();
    p.setRenderHint(QPainter::Antialiasing, true);
    p.translate(box.topLeft());
    const double s = std::min(box.width(), box.height()) / 24.0;
    p.scale(s, s);
    p.setPen(Qt::NoPen);
    p.setBrush(QColor(0x26, 0x2d, 0x36));
    p.drawRoundedRect(QRectF(0.5, 0.5, 23, 23), 4.5, 4.5);
    // Three states joined on a rising line: cool → warm → hot.
    const QPointF a(5, 18), b(12, 12.5), c(19, 6);
    p.setPen(QPen(QColor(0xe8, 0xe8, 0xe2), 1.6, Qt::SolidLine, Qt::RoundCap));
    p.drawLine(a, b);
    p.drawLine(b, c);
    p.setPen(Qt::NoPen);
    p.setBrush(QColor(0x4c, 0x9b, 0xd6)); p.drawEllipse(a, 2.8, 2.8);
    p.setBrush(QColor(0xe0, 0xa0, 0x30)); p.drawEllipse(b, 2.8, 2.8);
    p.setBrush(QColor(0xd8, 0x50, 0x28)); p.drawEllipse(c, 2.8, 2.8);
    p.restore();
}

QIcon appIcon() {
    QIcon icon;
    for (int size : {16, 32, 48, 64, 128, 256}) {
        QPixmap pm(size, size);
        pm.fill(Qt::transparent);
        QPainter p(&pm);
        drawAppMark(p, QRectF(0, 0, size, size));
        p.end();
        icon.addPixmap(pm);
    }
    return icon;
}

}  // namespace heatchain::view
