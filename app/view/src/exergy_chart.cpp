#include "heatchain_view/exergy_chart.hpp"

#include <QFontMetricsF>
#include <QPaintEngine>
#include <algorithm>
#include <cmath>

#include "heatchain_view/format.hpp"
#include "heatchain_view/palette.hpp"
#include "heatchain_view/process_chart.hpp"

namespace heatchain::view {

void ExergyBarChart::setData(const Project& project, const SequenceResult& result) {
    units_ = project.displayUnits;
    system_ = result.system;
    const Dimension d = energyDimension(system_);
    unit_ = unitSymbol(d, units_);
    bars_.clear();
    total_ = toDisplay(result.totals.exergyDestroyed, d, units_, project.unitContext());
    available_ = result.exergyAvailable;
    for (std::size_t i = 0; i < result.steps.size(); ++i) {
        const StepResult& s = result.steps[i];
        if (!s.computed) continue;
        Bar b;
        b.step = int(i);
        b.id = QString::fromStdString(s.id);
        b.value = s.exergyDestroyed;
        b.display = toDisplay(s.exergyDestroyed, d, units_, project.unitContext());
        b.share = s.exergyDestroyedShare;
        b.colour = i < colours_.size() ? colours_[i] : stepColour(int(i));
        b.noSource = noSourceGiven(s);
        bars_.push_back(b);
    }
}

namespace {
bool sameIds(const std::vector<QString>& ids, const std::vector<ExergyBarChart::Bar>& bars) {
    return ids.size() == bars.size() &&
           std::equal(ids.begin(), ids.end(), bars.begin(), [](const QString& id, const ExergyBarChart::Bar& b) { return id == b.id; });
}
std::vector<QString> idsOf(const std::vector<ExergyBarChart::Bar>& bars) {
    std::vector<QString> ids;
    ids.reserve(bars.size());
    for (const ExergyBarChart::Bar& b : bars) ids.push_back(b.id);
    return ids;
}
}  // namespace

const std::vector<QStaticText>& ExergyBarChart::nameTexts(const QFont& font, double width) const {
    if (names_.width == width && names_.font == font && sameIds(names_.ids, bars_)) return names_.texts;
    const QFontMetricsF fm(font);
    names_.font = font;
    names_.width = width;
    names_.ids = idsOf(bars_);
    names_.texts.clear();
    names_.texts.reserve(bars_.size());
    for (const Bar& b : bars_) {
        QStaticText t(fm.elidedText(b.id, Qt::ElideMiddle, width - 2));
        t.setTextFormat(Qt::PlainText);
        t.prepare(QTransform(), font);
        names_.texts.push_back(std::move(t));
    }
    return names_.texts;
}

ExergyBarChart::Layout ExergyBarChart::layout(const QRectF& rect, const QFontMetricsF& fm) const {
    Layout L;
    double w = fm.horizontalAdvance(QStringLiteral("step"));
    for (const Bar& b : bars_) w = std::max(w, fm.horizontalAdvance(b.id));
    L.labelWidth = std::min(w + 10, rect.width() * 0.3);
    // Room on the right for "123.4 kW · 45.6 %".
    const double valueRoom = fm.horizontalAdvance(QStringLiteral("−88 888.8 kW · 100.0 %")) + 8;
    L.plot = QRectF(rect.left() + L.labelWidth + 6, rect.top() + 8,
                    std::max(40.0, rect.width() - L.labelWidth - 6 - valueRoom - 8),
                    std::max(20.0, rect.height() - 8 - (fm.height() * 2 + 12)));
    L.max = 0;
    for (const Bar& b : bars_) L.max = std::max(L.max, b.display);
    if (!(L.max > 0)) L.max = 1;
    L.rowHeight = bars_.empty() ? 20 : std::min(28.0, L.plot.height() / double(bars_.size()));
    return L;
}

void ExergyBarChart::paint(QPainter& p, const QRectF& rect) const {
    p.save();
    p.setRenderHint(QPainter::Antialiasing, true);
    p.fillRect(rect, Qt::white);
    const QFontMetricsF fm(p.font());
    if (bars_.empty() || !available_) {
        p.setPen(ink::muted());
        p.drawText(rect, Qt::AlignCenter,
                   bars_.empty() ? QStringLiteral("No computed steps.")
                                 : QStringLiteral("Exergy needs the dead state (surroundings) to be computable."));
        p.restore();
        return;
    }
    const Layout L = layout(rect, fm);
    const double step = niceTickStep(L.max, std::max(2, int(L.plot.width() / 90)));
    // Vertical grid and tick labels below the bars.
    const double barsBottom = L.plot.top() + L.rowHeight * double(bars_.size());
    for (double x = 0; x <= L.max * 1.0001 + step * 1e-9; x += step) {
        const double px = L.plot.left() + x / L.max * L.plot.width();
        p.setPen(QPen(ink::grid(), 1));
        p.drawLine(QPointF(px, L.plot.top()), QPointF(px, barsBottom));
        p.setPen(ink::muted());
        p.drawText(QRectF(px - 40, barsBottom + 2, 80, fm.height()), Qt::AlignHCenter,
                   formatNumber(x, 6, x == 0 || step >= 1 ? 0 : int(std::ceil(-std::log10(step)))));
    }
    p.setPen(ink::text());
    // Centred under the bars when it fits there, else across the whole
    // width (the step names' column is beside the bars), and elided only
    // when even that is too narrow.
    const QString caption = QStringLiteral("exergy destroyed [%1]   total %2 %1").arg(unit_, formatNumber(total_, 5, 2));
    const bool fitsUnderBars = fm.horizontalAdvance(caption) <= L.plot.width();
    const QRectF captionBox = fitsUnderBars ? QRectF(L.plot.left(), barsBottom + fm.height() + 4, L.plot.width(), fm.height())
                                            : QRectF(rect.left(), barsBottom + fm.height() + 4, rect.width(), fm.height());
    p.drawText(captionBox, Qt::AlignHCenter, fm.elidedText(caption, Qt::ElideRight, captionBox.width()));

    double y = L.plot.top();
    const double thick = std::max(1.0, L.rowHeight * 0.68);
    // On a long sheet the rows get thinner than a line of text: every bar
    // keeps its step's name, in a smaller type if need be (a small bar is
    // still a step someone looks for); only the bars that matter (≥ 5 % of
    // the total) and the selected one carry their value.
    const bool crowded = L.rowHeight < fm.height() * 0.95;
    const QFont normal = p.font();
    QFont nameFont = normal;
    if (crowded) nameFont.setPointSizeF(std::max(5.5, normal.pointSizeF() * L.rowHeight / (fm.height() * 0.95)));
    const QFontMetricsF nfm(nameFont);
    // On screen the names are laid out once (nameTexts); a printer or PDF
    // lays them out as it draws, as before.
    const bool onScreen = p.paintEngine() && p.paintEngine()->type() == QPaintEngine::Raster;
    const std::vector<QStaticText>* names = onScreen ? &nameTexts(nameFont, L.labelWidth) : nullptr;
    for (std::size_t k = 0; k < bars_.size(); ++k) {
        const Bar& b = bars_[k];
        const QRectF row(rect.left(), y, rect.width(), L.rowHeight);
        if (b.step == selected_) p.fillRect(row, QColor(255, 244, 200));
        const bool words = !crowded || b.share >= 0.05 || b.step == selected_;
        const QRectF textRow(rect.left(), y + L.rowHeight / 2 - fm.height() / 2, rect.width(), fm.height());
        p.setPen(ink::text());
        p.setFont(nameFont);
        if (names) {
            // Where drawText would put it: right-aligned, centred in the row.
            const QStaticText& name = (*names)[k];
            const QSizeF size = name.size();
            p.drawStaticText(QPointF(rect.left() + 2 + L.labelWidth - size.width(), y + (L.rowHeight - size.height()) / 2), name);
        } else {
            p.drawText(QRectF(rect.left() + 2, y, L.labelWidth, L.rowHeight), Qt::AlignRight | Qt::AlignVCenter,
                       nfm.elidedText(b.id, Qt::ElideMiddle, L.labelWidth - 2));
        }
        p.setFont(normal);
        const double len = std::max(0.0, b.display) / L.max * L.plot.width();
        const QRectF bar(L.plot.left(), y + (L.rowHeight - thick) / 2, len, thick);
        p.setPen(Qt::NoPen);
        p.setBrush(b.colour);
        p.drawRect(bar);
        p.setPen(ink::text());
        const QString value = b.noSource ? noSourceText()
                                         : QStringLiteral("%1 %2 · %3 %")
                                               .arg(formatNumber(b.display, 4, 2), unit_, formatNumber(100.0 * b.share, 3, 1));
        if (words)
            p.drawText(QRectF(bar.right() + 5, textRow.top(), rect.right() - bar.right() - 5, fm.height()),
                       Qt::AlignLeft | Qt::AlignVCenter, value);
        y += L.rowHeight;
    }
    p.setPen(QPen(ink::axis(), 1));
    p.drawLine(QPointF(L.plot.left(), L.plot.top()), QPointF(L.plot.left(), barsBottom));
    p.restore();
}

int ExergyBarChart::stepAt(QPointF pos, const QRectF& rect, const QFont& font) const {
    if (bars_.empty() || !rect.contains(pos)) return -1;
    const Layout L = layout(rect, QFontMetricsF(font));
    const int row = int(std::floor((pos.y() - L.plot.top()) / L.rowHeight));
    if (row < 0 || row >= int(bars_.size())) return -1;
    return bars_[std::size_t(row)].step;
}

}  // namespace heatchain::view
