#include "heat_recovery_view.hpp"

#include <QHBoxLayout>
#include <QPainter>
#include <QScrollArea>
#include <QSplitter>
#include <QTabWidget>
#include <QVBoxLayout>
#include <algorithm>
#include <cmath>
#include <functional>

#include "heatchain_view/format.hpp"

namespace heatchain::gui {

using namespace heatchain::view;

namespace {
using heatchain::view::qs;
// The slider moves in half kelvins.
constexpr double kSliderStepK = 0.5;
constexpr int kSweepPoints = 41;
}  // namespace

// A white area that one of the view library's recovery charts paints.
class RecoveryChartArea : public QWidget {
public:
    RecoveryChartArea(std::function<void(QPainter&, const QRectF&)> paint, QWidget* parent)
        : QWidget(parent), paint_(std::move(paint)) {
        setMinimumHeight(170);
        setSizePolicy(QSizePolicy::Expanding, QSizePolicy::Expanding);
    }

protected:
    void paintEvent(QPaintEvent*) override {
        QPainter p(this);
        p.fillRect(rect(), Qt::white);
        paint_(p, QRectF(rect()).adjusted(2, 2, -2, -2));
    }

private:
    std::function<void(QPainter&, const QRectF&)> paint_;
};

HeatRecoveryView::HeatRecoveryView(ProjectDocument* doc, QWidget* parent) : QWidget(parent), doc_(doc) {
    auto* layout = new QVBoxLayout(this);
    layout->setContentsMargins(6, 6, 6, 6);
    layout->setSpacing(4);

    auto* row = new QHBoxLayout;
    auto* title = new QLabel(tr("ΔT<sub>min</sub>"), this);
    title->setToolTip(tr("The minimum temperature difference between a hot and a cold stream at which the targets "
                         "are worked out; it starts at the worksheet's required minimum approach."));
    slider_ = new QSlider(Qt::Horizontal, this);
    slider_->setObjectName(QStringLiteral("dTminSlider"));
    slider_->setSingleStep(1);
    slider_->setPageStep(10);
    slider_->setToolTip(title->toolTip());
    dTminLabel_ = new QLabel(this);
    dTminLabel_->setMinimumWidth(dTminLabel_->fontMetrics().horizontalAdvance(QStringLiteral("188.8 °F")) + 6);
    resetButton_ = new QPushButton(tr("Worksheet's"), this);
    resetButton_->setToolTip(tr("Back to the worksheet's required minimum approach"));
    row->addWidget(title);
    row->addWidget(slider_, 1);
    row->addWidget(dTminLabel_);
    row->addWidget(resetButton_);
    layout->addLayout(row);

    table_ = new QLabel(this);
    table_->setObjectName(QStringLiteral("recoveryTargets"));
    table_->setTextFormat(Qt::RichText);
    table_->setTextInteractionFlags(Qt::TextSelectableByMouse);
    layout->addWidget(table_);
    notes_ = new QLabel(this);
    notes_->setObjectName(QStringLiteral("recoveryNotes"));
    notes_->setTextFormat(Qt::RichText);
    notes_->setWordWrap(true);
    notes_->setTextInteractionFlags(Qt::TextSelectableByMouse);
    layout->addWidget(notes_);

    // The composite curves above; the grand composite curve and the sweep
    // share the space below, one at a time.
    auto* charts = new QSplitter(Qt::Vertical, this);
    composite_ = new RecoveryChartArea([this](QPainter& p, const QRectF& r) {
        catchUp();
        compositeChart_.paint(p, r);
    }, charts);
    auto* lower = new QTabWidget(charts);
    lower->setDocumentMode(true);
    grand_ = new RecoveryChartArea([this](QPainter& p, const QRectF& r) {
        catchUp();
        grandChart_.paint(p, r);
    }, lower);
    sweepChart_ = new RecoveryChartArea([this](QPainter& p, const QRectF& r) {
        catchUp();
        sweepPlot_.paint(p, r);
    }, lower);
    lower->addTab(grand_, tr("Grand composite curve"));
    lower->addTab(sweepChart_, tr("Targets against ΔTmin"));
    charts->addWidget(composite_);
    charts->addWidget(lower);
    charts->setStretchFactor(0, 5);
    charts->setStretchFactor(1, 4);
    layout->addWidget(charts, 1);

    connect(slider_, &QSlider::valueChanged, this, [this](int v) {
        const double d = v * kSliderStepK;
        if (std::fabs(d - dTmin_) < 1e-9) return;
        dTmin_ = d;
        recomputeTargets();
        showTargets();
    });
    connect(resetButton_, &QPushButton::clicked, this, [this] {
        if (worksheetDTmin_) setDTmin(*worksheetDTmin_);
    });
    connect(doc_, &ProjectDocument::changed, this, &HeatRecoveryView::documentChanged);
    documentChanged();
}

void HeatRecoveryView::setDTmin(double kelvin) {
    kelvin = std::max(0.0, kelvin);
    if (kelvin / kSliderStepK > slider_->maximum()) slider_->setMaximum(int(std::ceil(kelvin / kSliderStepK)));
    dTmin_ = kelvin;
    {
        const QSignalBlocker block(slider_);
        slider_->setValue(int(std::lround(kelvin / kSliderStepK)));
    }
    recomputeTargets();
    showTargets();
}

void HeatRecoveryView::documentChanged() {
    // A new required minimum approach (another worksheet, or an edit of it)
    // moves the slider to it; otherwise the user's ΔTmin stays.
    const double worksheet = doc_->streams().shared.minApproachK();
    const double top = std::max(40.0, 2 * worksheet);
    const QSignalBlocker block(slider_);
    slider_->setRange(0, int(std::ceil(top / kSliderStepK)));
    if (!worksheetDTmin_ || std::fabs(*worksheetDTmin_ - worksheet) > 1e-9) {
        worksheetDTmin_ = worksheet;
        dTmin_ = worksheet;
    }
    slider_->setValue(int(std::lround(dTmin_ / kSliderStepK)));
    stale_ = true;
    // Behind another tab the view computes nothing on an edit; it catches up
    // when it is shown or painted.
    if (isVisible() && !visibleRegion().isEmpty()) refresh();
}

void HeatRecoveryView::showEvent(QShowEvent* e) {
    QWidget::showEvent(e);
    if (stale_) refresh();
}

void HeatRecoveryView::refresh() {
    stale_ = false;
    const double top = slider_->maximum() * kSliderStepK;
    auto sweep = worksheetDTminSweep(doc_->streams(), doc_->results(), 0.0, top, kSweepPoints);
    sweep_ = sweep ? std::move(*sweep) : std::vector<TargetsAtDTmin>{};
    recomputeTargets();
    showTargets();
}

void HeatRecoveryView::recomputeTargets() {
    auto r = worksheetRecovery(doc_->streams(), doc_->results(), dTmin_);
    if (r) {
        recovery_ = std::move(*r);
        error_.clear();
    } else {
        recovery_.reset();
        error_ = qs(r.error().text());
    }
}

void HeatRecoveryView::showTargets() {
    const Project& shared = doc_->streams().shared;
    const UnitSystem u = shared.displayUnits;
    const UnitContext ctx = displayContext(shared);
    dTminLabel_->setText(formatWithUnit(dTmin_, Dimension::TemperatureDifference, u, ctx, 3));
    resetButton_->setEnabled(worksheetDTmin_ && std::fabs(*worksheetDTmin_ - dTmin_) > 1e-9);
    if (!recovery_) {
        table_->setText(QStringLiteral("<span style='color:#b42318'>%1</span>").arg(error_.toHtmlEscaped()));
        notes_->clear();
        compositeChart_.setData(Recovery{}, u, ctx);
        grandChart_.setData(Recovery{}, u, ctx);
    } else {
        const Recovery& r = *recovery_;
        const Targets& t = r.targets;
        auto Q = [&](double W) { return formatWithUnit(W, Dimension::Power, u, ctx, 4); };
        auto T = [&](double K) { return formatWithUnit(K, Dimension::Temperature, u, ctx, 4); };
        QString html = QStringLiteral(
            "<table cellspacing='0' cellpadding='3' style='margin:0'>"
            "<tr style='color:#6b727a'><td></td><td align='right'>&nbsp;%1</td><td align='right'>&nbsp;%2</td>"
            "<td align='right'>&nbsp;%3</td></tr>")
                           .arg(tr("minimum"), tr("today"), tr("recoverable"));
        html += QStringLiteral("<tr><td><b>%1</b></td><td align='right'><b>%2</b></td><td align='right'>%3</td>"
                               "<td align='right'><b>%4</b></td></tr>")
                    .arg(tr("hot utility"), Q(t.hotUtilityMin), Q(r.hotUtilityNow), Q(r.recoverableHot()));
        html += QStringLiteral("<tr><td><b>%1</b></td><td align='right'><b>%2</b></td><td align='right'>%3</td>"
                               "<td align='right'>%4</td></tr>")
                    .arg(tr("cold utility"), Q(t.coldUtilityMin), Q(r.coldUtilityNow), Q(r.recoverableCold()));
        QString pinch;
        for (std::size_t i = 0; i < t.pinchHot.size(); ++i)
            pinch += (i ? QStringLiteral("; ") : QString()) +
                     tr("%1 hot side, %2 cold side").arg(T(t.pinchHot[i]), T(t.pinchCold[i]));
        if (pinch.isEmpty())
            pinch = t.hotUtilityMin <= 0 || t.coldUtilityMin <= 0 ? tr("none (one utility alone is needed)") : tr("none");
        html += QStringLiteral("<tr><td><b>%1</b></td><td colspan='3'>%2</td></tr></table>").arg(tr("pinch"), pinch);
        // The sentence an engineer quotes.
        QString sentence = tr("Recoverable <b>%1</b>").arg(Q(r.recoverableHot()));
        if (auto s = r.recoverableHotShare()) sentence += tr(", %1 % of today's hot utility").arg(formatNumber(100 * *s, 3));
        html += QStringLiteral("<p style='margin-top:4px'>%1, at ΔT<sub>min</sub> %2.</p>")
                    .arg(sentence, formatWithUnit(t.dTmin, Dimension::TemperatureDifference, u, ctx, 3));
        table_->setText(html);

        QStringList notes;
        if (!r.utilities.levels.empty()) {
            QStringList levels;
            for (const UtilityPlacement& p : r.utilities.levels)
                levels << tr("%1 at %2: %3").arg(qs(p.id), T(p.T), Q(p.duty));
            notes << tr("<b>Utility levels</b> against the grand composite curve: %1.").arg(levels.join(QStringLiteral(", ")));
            if (hotFallsShort(r.utilities, t))
                notes << tr("No hot level is hot enough for %1.").arg(Q(r.utilities.hotUnmet));
            if (coldFallsShort(r.utilities, t))
                notes << tr("No cold level is cold enough for %1.").arg(Q(r.utilities.coldUnmet));
        }
        if (!r.timeAveraged.empty()) {
            QStringList ids;
            for (const std::string& id : r.timeAveraged) ids << QStringLiteral("<b>%1</b>").arg(qs(id).toHtmlEscaped());
            notes << tr("<span style='color:#8a5a00'>Batch streams %1 enter time-averaged: each batch's heat over its "
                        "cycle time. This overstates what can be recovered between batches, which meet only when the "
                        "schedule (or a heat store) makes them.</span>")
                         .arg(ids.join(QStringLiteral(", ")));
        }
        for (const Excluded& e : r.excluded)
            notes << tr("Stream <b>%1</b> is left out: %2").arg(qs(e.stream).toHtmlEscaped(), qs(e.reason).toHtmlEscaped());
        notes_->setText(notes.join(QStringLiteral("<br>")));
        notes_->setVisible(!notes.isEmpty());
        compositeChart_.setData(r, u, ctx);
        grandChart_.setData(r, u, ctx);
    }
    sweepPlot_.setData(sweep_, dTmin_, u, ctx);
    composite_->update();
    grand_->update();
    sweepChart_->update();
}

QString HeatRecoveryView::targetsText() {
    catchUp();
    return table_->text();
}
QString HeatRecoveryView::notesText() {
    catchUp();
    return notes_->text();
}

}  // namespace heatchain::gui
