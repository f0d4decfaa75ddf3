#pragma once
// Where the losses are, at a glance: one horizontal bar per computed step,
// length = exergy destroyed (T0 · S_gen, from core), in sequence order, in the
// step's own colour and labelled with its value and its share of the
// sequence total. Drawn with QPainter for the window and the PDF report.
#include <QColor>
#include <QFont>
#include <QPainter>
#include <QStaticText>
#include <QString>
#include <vector>

#include "heatchain/project.hpp"
#include "heatchain/solver.hpp"

namespace heatchain::view {

class ExergyBarChart {
public:
    struct Bar {
        int step = -1;        // index into SequenceResult::steps
        QString id;
        double value = 0;     // exergy destroyed, SI (W or J)
        double display = 0;   // the same in display units
        double share = 0;     // of the sequence total, 0–1 (core's)
        QColor colour;
        bool noSource = false;  // heat with no source or sink named: nothing to charge
    };

    void setData(const Project& project, const SequenceResult& result);
    // Colours of the steps by index, used by setData (else by index).
    void setStepColours(std::vector<QColor> colours) { colours_ = std::move(colours); }
    void setSelectedStep(int index) { selected_ = index; }
    const std::vector<Bar>& bars() const { return bars_; }
    QString unit() const { return unit_; }
    // Height the chart wants at `width` (bars of a readable thickness).
    double preferredHeight(int barCount) const { return 40.0 + 24.0 * std::max(1, barCount); }
    void paint(QPainter& p, const QRectF& rect) const;
    // The bar under `pos`, −1 for none.
    int stepAt(QPointF pos, const QRectF& rect, const QFont& font) const;

private:
    struct Layout {
        QRectF plot;
        double labelWidth = 0, max = 1, rowHeight = 20;
    };
    Layout layout(const QRectF& rect, const QFontMetricsF& fm) const;
    // The step names laid out once and kept between paints on screen: an
    // edit rarely renames a step, and laying out a hundred names on every
    // paint was most of the chart's time on a long sheet.
    const std::vector<QStaticText>& nameTexts(const QFont& font, double width) const;
    struct NameCache {
        QFont font;
        double width = -1;
        std::vector<QString> ids;
        std::vector<QStaticText> texts;
    };
    mutable NameCache names_;

    std::vector<Bar> bars_;
    std::vector<QColor> colours_;
    UnitSystem units_ = UnitSystem::SI;
    SystemKind system_ = SystemKind::SteadyFlow;
    QString unit_;
    double total_ = 0;
    bool available_ = false;
    int selected_ = -1;
};

}  // namespace heatchain::view
