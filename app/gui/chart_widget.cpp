#include "chart_widget.hpp"

#include <QMouseEvent>
#include <QPainter>

#include "heatchain_view/format.hpp"
#include "heatchain_view/palette.hpp"

namespace heatchain::gui {

ChartWidget::ChartWidget(ProjectDocument* doc, view::ProcessChart::Kind kind, QWidget* parent)
    : QWidget(parent), doc_(doc), chart_(kind) {
    setMouseTracking(true);
    // paintEvent fills every pixel: no need to paint the dock beneath first.
    setAttribute(Qt::WA_OpaquePaintEvent);
    title_ = kind == view::ProcessChart::Kind::TemperatureEntropy
                 ? tr("Temperature – entropy")
                 : tr("Temperature – cumulative duty");
    connect(doc_, &ProjectDocument::changed, this, &ChartWidget::refresh);
    connect(doc_, &ProjectDocument::selectionChanged, this, [this](int i) {
        chart_.setSelectedStep(i);
        update();
    });
    refresh();
}

void ChartWidget::refresh() {
    chart_.setStepColours(doc_->stepColours());
    chart_.setUncertainty(doc_->uncertainty());
    chart_.setData(doc_->project(), doc_->result(), doc_->dome());
    chart_.setSelectedStep(doc_->selectedStep());
    hover_.reset();
    update();
}

QRectF ChartWidget::chartRect() const { return QRectF(rect()).adjusted(0, 22, 0, 0); }

void ChartWidget::paintEvent(QPaintEvent*) {
    QPainter p(this);
    QString note;
    QColor noteColour = view::ink::muted();
    if (chart_.kind() == view::ProcessChart::Kind::TemperatureDuty) {
        if (auto a = chart_.smallestApproach()) {
            if (a->belowMinimum) noteColour = view::ink::error();
            const auto& steps = doc_->project().steps;
            const QString id = a->step >= 0 && a->step < int(steps.size())
                                   ? QString::fromStdString(steps[std::size_t(a->step)].id) : QString();
            note = tr("closest approach %1 %2 at %3")
                       .arg(view::formatNumber(a->dT, 4, 1),
                            view::unitSymbol(Dimension::TemperatureDifference, doc_->project().displayUnits), id);
        }
    }
    paintPanelHeading(p, *this, title_, note, noteColour);
    chart_.paint(p, chartRect());
    if (hover_) {
        p.setRenderHint(QPainter::Antialiasing, true);
        p.setPen(QPen(view::ink::text(), 1.2));
        p.setBrush(Qt::NoBrush);
        p.drawEllipse(hover_->at, 6, 6);
        const QFontMetricsF fm(font());
        const QStringList lines = hover_->text.split(QLatin1Char('\n'));
        double w = 0;
        for (const QString& l : lines) w = std::max(w, fm.horizontalAdvance(l));
        QRectF box(0, 0, w + 14, lines.size() * fm.height() + 10);
        box.moveTopLeft(hover_->at + QPointF(12, 12));
        if (box.right() > width() - 4) box.moveRight(hover_->at.x() - 12);
        if (box.bottom() > height() - 4) box.moveBottom(hover_->at.y() - 12);
        p.setPen(QPen(QColor(0xb0, 0xb6, 0xbd), 1));
        p.setBrush(QColor(255, 255, 250, 240));
        p.drawRoundedRect(box, 4, 4);
        p.setPen(view::ink::text());
        double y = box.top() + 5;
        for (const QString& l : lines) {
            p.drawText(QRectF(box.left() + 7, y, w + 2, fm.height()), Qt::AlignLeft | Qt::AlignVCenter, l);
            y += fm.height();
        }
    }
}

void ChartWidget::mouseMoveEvent(QMouseEvent* e) {
    hover_ = chart_.hoverAt(e->position(), chartRect());
    update();
}

void ChartWidget::mousePressEvent(QMouseEvent* e) {
    if (auto h = chart_.hoverAt(e->position(), chartRect())) doc_->setSelectedStep(h->step);
}

void ChartWidget::leaveEvent(QEvent*) {
    hover_.reset();
    update();
}

void paintPanelHeading(QPainter& p, const QWidget& w, const QString& title, const QString& note,
                       const QColor& noteColour) {
    p.fillRect(w.rect(), Qt::white);
    const QRectF line(8, 2, w.width() - 16, 20);
    QFont f = w.font();
    f.setBold(true);
    p.setFont(f);
    p.setPen(view::ink::text());
    p.drawText(line, Qt::AlignVCenter, title);
    p.setFont(w.font());
    if (note.isEmpty()) return;
    p.setPen(noteColour);
    p.drawText(line, Qt::AlignVCenter | Qt::AlignRight, note);
}

}  // namespace heatchain::gui
