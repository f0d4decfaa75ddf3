#pragma once
// Step-kind pictograms drawn with QPainter (our own design): a thermometer
// for sensible heat, a block and a drop for melting, bubbles for boiling,
// arrows at a bar for pressure changes, a narrowed pipe for throttling.
#include <QIcon>
#include <QPainter>

#include "heatchain/project.hpp"

namespace heatchain::view {

// Draws the pictogram of `kind` filling `box` (square works best) in `ink`.
void drawStepIcon(QPainter& p, const QRectF& box, StepKind kind, const QColor& ink);
// The pictogram as an icon for menus and toolbars (several sizes).
QIcon stepIcon(StepKind kind);
// Heatchain's application mark: a chain of three linked states on a rising line.
void drawAppMark(QPainter& p, const QRectF& box);
QIcon appIcon();

}  // namespace heatchain::view
