#include "contribution_widget.hpp"

#include <QPainter>

#include "chart_widget.hpp"

#include "heatchain_view/palette.hpp"

namespace heatchain::gui {

ContributionWidget::ContributionWidget(ProjectDocument* doc, QWidget* parent) : QWidget(parent), doc_(doc) {
    connect(doc_, &ProjectDocument::changed, this, &ContributionWidget::refresh);
    refresh();
}

void ContributionWidget::refresh() {
    if (const UncertaintyResult* u = doc_->uncertainty()) chart_.setData(*u);
    else chart_.clear();
    updateGeometry();
    update();
}

void ContributionWidget::paintEvent(QPaintEvent*) {
    QPainter p(this);
    paintPanelHeading(p, *this, tr("Contributions to the uncertainty"));
    if (!doc_->uncertaintyShown()) {
        p.setPen(view::ink::muted());
        p.drawText(QRectF(rect()).adjusted(8, 24, -8, -4), Qt::AlignCenter, tr("View ▸ Uncertainty (±) is off."));
        return;
    }
    if (!doc_->uncertaintyError().isEmpty() && !doc_->uncertainty()) {
        p.setPen(view::ink::error());
        p.drawText(QRectF(rect()).adjusted(8, 24, -8, -4), Qt::AlignCenter | Qt::TextWordWrap, doc_->uncertaintyError());
        return;
    }
    chart_.paint(p, QRectF(rect()).adjusted(4, 24, -6, -2));
}

}  // namespace heatchain::gui
