#include "heatchain_view/caution_text.hpp"

#include "heatchain_view/format.hpp"

namespace heatchain::view {

QStringList processCautionText(const Project& project, const ProcessCautions& cautions) {
    const UnitSystem us = project.displayUnits;
    const UnitContext ctx = displayContext(project);
    QStringList lines;
    for (const std::string& s : processCautionSentences(cautions, [&](double si, Dimension d, bool gauge) {
             UnitContext c = ctx;
             if (d == Dimension::Pressure) c.gaugeDisplay = gauge;
             return formatWithUnit(si, d, us, c).toStdString();
         }))
        lines << qs(s);
    return lines;
}

}  // namespace heatchain::view
