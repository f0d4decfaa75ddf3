#pragma once
// Heatchain's own colours: one per step in charts, one accent per family of
// step kinds on cards, and the few chart inks. Chosen here for contrast on a
// white page and for telling neighbouring steps apart, also in print.
#include <QColor>

#include "heatchain/project.hpp"

namespace heatchain::view {

// Colour of the step at `index` in the sequence (cycles through 10 hues).
// The application gives each step a slot of its own instead (kept when
// steps are inserted or moved), and passes the slots' colours to the charts.
QColor stepColour(int index);
constexpr int kStepColourCount = 10;

enum class KindFamily { Heating, Cooling, Pressure };
KindFamily kindFamily(StepKind k);
QColor familyAccent(KindFamily f);

namespace ink {
inline QColor text() { return QColor(0x22, 0x26, 0x2b); }
inline QColor muted() { return QColor(0x6b, 0x72, 0x7a); }
inline QColor grid() { return QColor(0xe3, 0xe6, 0xea); }
inline QColor axis() { return QColor(0x55, 0x5b, 0x63); }
inline QColor dome() { return QColor(0x4d, 0x55, 0x60); }
inline QColor warning() { return QColor(0xc9, 0x8a, 0x00); }
inline QColor error() { return QColor(0xc0, 0x2b, 0x2b); }
inline QColor selection() { return QColor(0x1f, 0x5f, 0xa8); }
inline QColor cardFace() { return QColor(0xfb, 0xfb, 0xf8); }
}  // namespace ink

}  // namespace heatchain::view
