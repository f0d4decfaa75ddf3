#include "exergy_widget.hpp"

#include <QMouseEvent>
#include <QPainter>

#include "chart_widget.hpp"

#include "heatchain_view/format.hpp"
#include "heatchain_view/palette.hpp"
#include "heatchain_view/utility_text.hpp"

namespace heatchain::gui {

ExergyWidget::ExergyWidget(ProjectDocument* doc, QWidget* parent) : QWidget(parent), doc_(doc) {
    // paintEvent fills every pixel (paintPanelHeading): the dock, tab and
    // splitter beneath need not paint first.
    setAttribute(Qt::WA_OpaquePaintEvent);
    connect(doc_, &ProjectDocument::changed, this, &ExergyWidget::refresh);
    connect(doc_, &ProjectDocument::selectionChanged, this, [this](int i) {
        chart_.setSelectedStep(i);
        update();
    });
    refresh();
}

void ExergyWidget::refresh() {
    chart_.setStepColours(doc_->stepColours());
    chart_.setData(doc_->project(), doc_->result());
    chart_.setSelectedStep(doc_->selectedStep());
    // Only a new number of bars (up to a dozen) changes the room asked for.
    // Asking again on every edit relaid the charts' dock, and with it
    // repainted the whole window.
    if (const QSize wanted = minimumSizeHint(); wanted != askedFor_) {
        askedFor_ = wanted;
        updateGeometry();
    }
    update();
}

QRectF ExergyWidget::chartRect() const { return QRectF(rect()).adjusted(4, 24, -6, -2); }

void ExergyWidget::paintEvent(QPaintEvent*) {
    QPainter p(this);
    const SequenceResult& r = doc_->result();
    paintPanelHeading(p, *this, tr("Exergy destroyed by step"),
                      r.exergyAvailable ? tr("sequence η_II %1").arg(view::efficiencyText(r.totals.secondLawEfficiency))
                                        : QString());
    chart_.paint(p, chartRect());
}

void ExergyWidget::mousePressEvent(QMouseEvent* e) {
    const int step = chart_.stepAt(e->position(), chartRect(), font());
    if (step >= 0) doc_->setSelectedStep(step);
}

}  // namespace heatchain::gui
