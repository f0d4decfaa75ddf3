#include "heatchain_view/contribution_chart.hpp"

#include <QFontMetricsF>
#include <algorithm>

#include "heatchain_view/palette.hpp"

namespace heatchain::view {

void ContributionChart::setData(const UncertaintyResult& result) {
    bars_.clear();
    of_ = QString::fromStdString(result.contributionsOf);
    for (const Contribution& c : result.contributions) {
        Bar b;
        b.input = QString::fromStdString(c.input);
        b.share = c.share;
        for (const UncertainInput& in : result.inputs)
            if (in.path == c.input) b.typed = QString::fromStdString(in.text);
        bars_.push_back(b);
    }
}

void ContributionChart::paint(QPainter& p, const QRectF& rect) const {
    p.save();
    p.setRenderHint(QPainter::Antialiasing, true);
    p.fillRect(rect, Qt::white);
    const QFontMetricsF fm(p.font());
    if (bars_.empty()) {
        p.setPen(ink::muted());
        p.drawText(rect, Qt::AlignCenter | Qt::TextWordWrap,
                   QStringLiteral("No tolerances: type one after a value, e.g. 80 degC ± 2 K."));
        p.restore();
        return;
    }
    double labelW = 0;
    for (const Bar& b : bars_) labelW = std::max(labelW, fm.horizontalAdvance(b.input));
    labelW = std::min(labelW + 10, rect.width() * 0.38);
    const double valueRoom = fm.horizontalAdvance(QStringLiteral("100.0 %")) + 10;
    const QRectF plot(rect.left() + labelW + 6, rect.top() + 6, std::max(30.0, rect.width() - labelW - 6 - valueRoom),
                      rect.height() - 6 - fm.height() - 6);
    const double row = std::min(24.0, plot.height() / double(bars_.size()));
    p.setPen(QPen(ink::axis(), 1));
    p.drawLine(plot.topLeft(), QPointF(plot.left(), plot.top() + row * double(bars_.size())));
    for (std::size_t i = 0; i < bars_.size(); ++i) {
        const Bar& b = bars_[i];
        const double y = plot.top() + row * double(i);
        p.setPen(ink::text());
        p.drawText(QRectF(rect.left(), y, labelW, row), Qt::AlignRight | Qt::AlignVCenter,
                   fm.elidedText(b.input, Qt::ElideMiddle, labelW - 4));
        const double w = plot.width() * std::clamp(b.share, 0.0, 1.0);
        const QRectF bar(plot.left(), y + row * 0.18, std::max(1.0, w), row * 0.64);
        p.setPen(Qt::NoPen);
        p.setBrush(i == 0 ? ink::selection() : ink::selection().lighter(150));
        p.drawRect(bar);
        p.setPen(ink::text());
        p.drawText(QRectF(bar.right() + 4, y, valueRoom + plot.width() - w, row), Qt::AlignLeft | Qt::AlignVCenter,
                   QString::number(100.0 * b.share, 'f', 1) + QStringLiteral(" %"));
    }
    p.setPen(ink::muted());
    p.drawText(QRectF(rect.left(), rect.bottom() - fm.height() - 2, rect.width(), fm.height()), Qt::AlignCenter,
               QStringLiteral("share of the variance of the %1 (first-order method)").arg(uncertaintyOutputTitle(of_)));
    p.restore();
}

QString uncertaintyOutputTitle(const QString& path) {
    static const std::pair<const char*, const char*> totals[] = {
        {"totals.heatingDuty", "heating duty"}, {"totals.coolingDuty", "cooling duty"}, {"totals.W", "total work"},
        {"totals.Q", "total duty"}, {"totals.exergyDestroyed", "total exergy destroyed"}};
    for (const auto& [key, words] : totals)
        if (path == QLatin1String(key)) return QString::fromLatin1(words);
    if (path.startsWith(QStringLiteral("steps."))) {
        const int dot = path.indexOf(QLatin1Char('.'), 6);
        const QString id = path.mid(6, dot - 6), what = path.mid(dot + 1);
        const QString w = what == QStringLiteral("Q")         ? QStringLiteral("duty")
                          : what == QStringLiteral("W")       ? QStringLiteral("work")
                          : what == QStringLiteral("end.T_K") ? QStringLiteral("end temperature")
                                                              : what;
        return QStringLiteral("%1 of %2").arg(w, id);
    }
    return path;
}

}  // namespace heatchain::view
