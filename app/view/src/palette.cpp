#include "heatchain_view/palette.hpp"

#include <array>

namespace heatchain::view {

QColor stepColour(int index) {
    // Ten hues of our own, alternating warm and cool so that adjacent steps
    // never share a family of colour.
    static const std::array<QColor, 10> hues = {
        QColor(0xb8, 0x4a, 0x1f),  // brick
        QColor(0x1d, 0x74, 0x8a),  // deep teal
        QColor(0xa8, 0x7d, 0x0c),  // mustard
        QColor(0x5b, 0x4a, 0xa6),  // indigo
        QColor(0x3a, 0x8a, 0x3e),  // leaf
        QColor(0xa3, 0x3a, 0x6e),  // plum
        QColor(0x2e, 0x5c, 0xb0),  // cobalt
        QColor(0x8c, 0x5a, 0x32),  // walnut
        QColor(0x17, 0x9c, 0x8a),  // jade
        QColor(0x6e, 0x6e, 0x2a),  // olive
    };
    if (index < 0) index = 0;
    return hues[std::size_t(index) % hues.size()];
}

KindFamily kindFamily(StepKind k) {
    switch (k) {
    case StepKind::Heat:
    case StepKind::Melt:
    case StepKind::Boil:
    case StepKind::Sublimate:
        return KindFamily::Heating;
    case StepKind::Cool:
    case StepKind::Freeze:
    case StepKind::Condense:
    case StepKind::Deposit:
        return KindFamily::Cooling;
    default:
        return KindFamily::Pressure;
    }
}

QColor familyAccent(KindFamily f) {
    switch (f) {
    case KindFamily::Heating: return QColor(0xd0, 0x6a, 0x24);
    case KindFamily::Cooling: return QColor(0x2f, 0x78, 0xb7);
    case KindFamily::Pressure: return QColor(0x6a, 0x5f, 0x8f);
    }
    return Qt::gray;
}

}  // namespace heatchain::view
