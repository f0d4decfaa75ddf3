#include "sweep_dialog.hpp"

#include <QFormLayout>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QPainter>
#include <QPushButton>
#include <QSplitter>
#include <QVBoxLayout>
#include <cmath>

#include "heatchain_view/format.hpp"
#include "heatchain_view/palette.hpp"
#include "project_edit.hpp"

namespace heatchain::gui {

using namespace heatchain::view;

namespace {
using heatchain::view::qs;

struct InputChoice {
    const char* key;
    const char* label;
};
// The inputs a step of this kind can be swept by (core's sweep paths).
std::vector<InputChoice> inputsFor(StepKind k) {
    switch (k) {
    case StepKind::Heat:
    case StepKind::Cool:
        return {{"to.T", "target temperature"}, {"to.duty", "duty"}, {"to.quality", "target quality x"},
                {"source.T", "source temperature"}, {"sink.T", "sink temperature"}};
    case StepKind::Compress:
    case StepKind::Expand:
        return {{"to.P", "end pressure"}, {"to.ratio", "pressure ratio"}, {"efficiency", "isentropic efficiency"},
                {"n", "polytropic exponent n"}, {"source.T", "source temperature"}, {"sink.T", "sink temperature"}};
    case StepKind::Throttle:
        return {{"to.P", "end pressure"}};
    default:
        return {{"fraction", "fraction changed"}, {"source.T", "source temperature"}, {"sink.T", "sink temperature"}};
    }
}
}  // namespace

void SweepPlotWidget::paintEvent(QPaintEvent*) {
    QPainter p(this);
    plot_.paint(p, QRectF(rect()).adjusted(4, 4, -4, -4));
}

SweepDialog::SweepDialog(const Project& project, int selectedStep, QWidget* parent)
    : QDialog(parent), project_(project) {
    setWindowTitle(tr("Sweep"));
    auto* outer = new QHBoxLayout(this);
    auto* left = new QWidget(this);
    auto* ll = new QVBoxLayout(left);
    ll->setContentsMargins(0, 0, 0, 0);
    auto* form = new QFormLayout;
    step_ = new QComboBox(left);
    step_->addItem(tr("start state"), QStringLiteral("start"));
    for (const Step& s : project.steps)
        step_->addItem(QStringLiteral("%1 · %2").arg(qs(s.id), stepKindTitle(s.kind).toLower()), qs(s.id));
    step_->setCurrentIndex(std::clamp(selectedStep + 1, 0, step_->count() - 1));
    input_ = new QComboBox(left);
    from_ = new QuantityField(left);
    to_ = new QuantityField(left);
    points_ = new QSpinBox(left);
    points_->setRange(2, 1000);
    points_->setValue(11);
    form->addRow(tr("Vary, in"), step_);
    form->addRow(tr("Input"), input_);
    form->addRow(tr("From"), from_);
    form->addRow(tr("To"), to_);
    form->addRow(tr("Points"), points_);
    ll->addLayout(form);
    ll->addWidget(new QLabel(tr("Results to plot:"), left));
    outputs_ = new QListWidget(left);
    for (const SweepOutput& o : sweepOutputKeys(project)) {
        auto* it = new QListWidgetItem(qs(o.label), outputs_);
        it->setData(Qt::UserRole, qs(o.key));
        it->setToolTip(qs(o.key));
        it->setFlags(it->flags() | Qt::ItemIsUserCheckable);
        it->setCheckState(Qt::Unchecked);
    }
    ll->addWidget(outputs_, 1);
    auto* runButton = new QPushButton(tr("Run sweep"), left);
    runButton->setDefault(true);
    ll->addWidget(runButton);
    problem_ = new QLabel(left);
    problem_->setWordWrap(true);
    problem_->setStyleSheet(QStringLiteral("color: #b42318;"));
    problem_->hide();
    ll->addWidget(problem_);
    auto* close = new QPushButton(tr("Close"), left);
    connect(close, &QPushButton::clicked, this, &QDialog::accept);
    ll->addWidget(close);
    left->setMinimumWidth(300);
    left->setMaximumWidth(380);
    outer->addWidget(left);

    auto* right = new QSplitter(Qt::Vertical, this);
    plot_ = new SweepPlotWidget(right);
    table_ = new QTableWidget(right);
    table_->verticalHeader()->hide();
    table_->verticalHeader()->setDefaultSectionSize(20);
    table_->setEditTriggers(QAbstractItemView::NoEditTriggers);
    table_->setAlternatingRowColors(true);
    failures_ = new QPlainTextEdit(right);
    failures_->setReadOnly(true);
    failures_->setPlaceholderText(tr("Points that could not be computed are listed here."));
    failures_->setStyleSheet(QStringLiteral("color: #b42318;"));
    right->addWidget(plot_);
    right->addWidget(table_);
    right->addWidget(failures_);
    right->setStretchFactor(0, 5);
    right->setStretchFactor(1, 3);
    right->setStretchFactor(2, 1);
    outer->addWidget(right, 1);

    auto check = [this](const QString& t) -> QString {
        if (t.trimmed().isEmpty()) return tr("a value is needed here");
        return {};  // core reads it as the file would and names any problem on Run
    };
    from_->setCheck(check);
    to_->setCheck(check);
    connect(step_, &QComboBox::currentIndexChanged, this, [this] { fillInputs(); });
    connect(input_, &QComboBox::currentIndexChanged, this, [this] { prefillRange(); });
    connect(runButton, &QPushButton::clicked, this, [this] { run(); });
    fillInputs();
    // Default results: the totals that matter most and each utility's use.
    chooseOutputs({"total.Q", "total.W", "total.exergyDestroyed"});
    resize(1200, 760);
}

void SweepDialog::chooseOutputs(const std::vector<std::string>& keys) {
    for (int i = 0; i < outputs_->count(); ++i) {
        QListWidgetItem* it = outputs_->item(i);
        const std::string k = it->data(Qt::UserRole).toString().toStdString();
        it->setCheckState(std::find(keys.begin(), keys.end(), k) != keys.end() ? Qt::Checked : Qt::Unchecked);
    }
}

void SweepDialog::fillInputs() {
    const QString id = step_->currentData().toString();
    QSignalBlocker block(input_);
    input_->clear();
    if (id == QLatin1String("start")) {
        input_->addItem(tr("start temperature"), QStringLiteral("T"));
        input_->addItem(tr("start pressure"), QStringLiteral("P"));
        input_->addItem(tr("start quality x"), QStringLiteral("quality"));
        input_->addItem(tr("start melt fraction"), QStringLiteral("meltFraction"));
    } else if (const Step* s = project_.findStep(id.toStdString())) {
        for (const InputChoice& c : inputsFor(s->kind)) input_->addItem(tr(c.label), QString::fromLatin1(c.key));
        // Preselect what the step already has: its target, then its efficiency.
        QString have;
        if (s->efficiency) have = QStringLiteral("efficiency");
        else if (s->to.T) have = QStringLiteral("to.T");
        else if (s->to.P) have = QStringLiteral("to.P");
        else if (s->to.duty) have = QStringLiteral("to.duty");
        else if (s->to.quality) have = QStringLiteral("to.quality");
        else if (s->to.ratio) have = QStringLiteral("to.ratio");
        else if (s->fraction) have = QStringLiteral("fraction");
        if (int i = input_->findData(have); i >= 0) input_->setCurrentIndex(i);
    }
    prefillRange();
}

void SweepDialog::prefillRange() {
    // A starting range around the present value, for the user to adjust.
    const QString id = step_->currentData().toString();
    const std::string in = input_->currentData().toString().toStdString();
    const Step* s = project_.findStep(id.toStdString());
    const bool start = id == QLatin1String("start");
    std::optional<Quantity> q;
    std::optional<Number> n;
    Dimension d = Dimension::Temperature;
    if (start) {
        if (in == "T") q = project_.start.T;
        if (in == "P") { q = project_.start.P; d = Dimension::Pressure; }
        if (in == "quality") n = project_.start.quality;
        if (in == "meltFraction") n = project_.start.meltFraction;
    } else if (s) {
        if (in == "to.T") q = s->to.T;
        if (in == "to.P") { q = s->to.P; d = Dimension::Pressure; }
        if (in == "to.duty") { q = s->to.duty; d = dutyDimension(project_); }
        if (in == "source.T" && s->source) q = s->source->T;
        if (in == "sink.T" && s->sink) q = s->sink->T;
        if (in == "efficiency") n = s->efficiency;
        if (in == "fraction") n = s->fraction;
        if (in == "n") n = s->n;
        if (in == "to.quality") n = s->to.quality;
        if (in == "to.ratio") n = s->to.ratio;
    }
    const bool unitFraction = in == "efficiency" || in == "fraction" || in == "quality" ||
                              in == "to.quality" || in == "meltFraction";
    auto num = [](double v) { return QString::number(v, 'g', 4); };
    if (unitFraction) {
        const double v = n ? n->value : 0.75;
        from_->showValue(num(std::max(0.05, std::round((v - 0.15) * 20) / 20)));
        to_->showValue(num(std::min(1.0, std::round((v + 0.15) * 20) / 20)));
        if (in == "efficiency" && n && v >= 0.55 && v <= 0.95) {
            from_->showValue(QStringLiteral("0.6"));
            to_->showValue(QStringLiteral("0.9"));
        }
    } else if (in == "to.ratio" || in == "n") {
        const double v = n ? n->value : (in == "n" ? 1.3 : 2.0);
        from_->showValue(num(in == "n" ? std::max(1.0, v - 0.2) : std::max(1.1, v * 0.5)));
        to_->showValue(num(in == "n" ? v + 0.2 : v * 1.5));
    } else if (q) {
        const UnitSystem us = project_.displayUnits;
        const UnitContext ctx = displayContext(project_);
        const std::string unit(displayUnit(d, us));
        const double v = toDisplay(q->si, d, us, ctx);
        double lo = v, hi = v;
        if (d == Dimension::Temperature) {
            const double span = us == UnitSystem::USCustomary ? 36 : 20;
            lo = v - span;
            hi = v + span;
        } else {
            lo = v * 0.5;
            hi = v * 1.5;
        }
        from_->showValue(QStringLiteral("%1 %2").arg(num(lo), qs(unit)));
        to_->showValue(QStringLiteral("%1 %2").arg(num(hi), qs(unit)));
    } else {
        from_->showValue(QString());
        to_->showValue(QString());
    }
}

SweepSpec SweepDialog::spec() const {
    SweepSpec sp;
    sp.step = step_->currentData().toString().toStdString();
    sp.input = input_->currentData().toString().toStdString();
    sp.from = from_->text().trimmed().toStdString();
    sp.to = to_->text().trimmed().toStdString();
    sp.points = points_->value();
    for (int i = 0; i < outputs_->count(); ++i)
        if (outputs_->item(i)->checkState() == Qt::Checked)
            sp.outputs.push_back(outputs_->item(i)->data(Qt::UserRole).toString().toStdString());
    return sp;
}

QString SweepDialog::run() {
    problem_->hide();
    const SweepSpec sp = spec();
    QString reason;
    if (sp.outputs.empty()) reason = tr("Choose at least one result to plot.");
    else if (sp.from.empty() || sp.to.empty()) reason = tr("Give the range: from and to.");
    if (reason.isEmpty()) {
        auto r = sweep(project_, sp, SolveOptions{8});
        if (!r) reason = qs(r.error().text());
        else result_ = std::move(r.value());
    }
    if (!reason.isEmpty()) {
        problem_->setText(reason);
        problem_->show();
        return reason;
    }
    showResult();
    return {};
}

void SweepDialog::showResult() {
    const SweepResult& r = *result_;
    const UnitSystem us = project_.displayUnits;
    const UnitContext ctx = displayContext(project_);
    std::vector<int> all;
    for (std::size_t i = 0; i < r.outputs.size(); ++i) all.push_back(int(i));
    plot_->plot().setData(r, all, us, ctx);
    plot_->update();

    table_->clear();
    table_->setColumnCount(int(r.outputs.size()) + 2);
    QStringList headers;
    const QString inUnit = r.inputDimension == Dimension::Dimensionless ? QString() : unitSymbol(r.inputDimension, us);
    headers << (inUnit.isEmpty() ? qs(r.spec.input) : QStringLiteral("%1 [%2]").arg(qs(r.spec.input), inUnit));
    for (const SweepOutput& o : r.outputs) {
        const QString u = o.dimension == Dimension::Dimensionless ? QString() : unitSymbol(o.dimension, us);
        headers << (u.isEmpty() ? qs(o.label) : QStringLiteral("%1 [%2]").arg(qs(o.label), u));
    }
    headers << tr("status");
    table_->setHorizontalHeaderLabels(headers);
    table_->setRowCount(int(r.points.size()));
    QStringList failed;
    for (std::size_t i = 0; i < r.points.size(); ++i) {
        const SweepPoint& pt = r.points[i];
        auto put = [&](int c, const QString& t) {
            auto* it = new QTableWidgetItem(t);
            it->setTextAlignment(Qt::AlignRight | Qt::AlignVCenter);
            table_->setItem(int(i), c, it);
            return it;
        };
        put(0, formatDisplay(pt.x, r.inputDimension, us, ctx, 5));
        for (std::size_t k = 0; k < r.outputs.size(); ++k) {
            const auto& v = pt.values[k];
            put(int(k) + 1, v ? formatDisplay(*v, r.outputs[k].dimension, us, ctx, 5) : QStringLiteral("–"));
        }
        auto* status = put(int(r.outputs.size()) + 1,
                           pt.error ? tr("not computed") : pt.warnings.empty() ? tr("ok") : tr("%n warning(s)", nullptr, int(pt.warnings.size())));
        status->setTextAlignment(Qt::AlignLeft | Qt::AlignVCenter);
        if (pt.error) {
            status->setForeground(ink::error());
            status->setToolTip(qs(pt.error->text()));
            failed << tr("%1 = %2: %3").arg(qs(r.spec.input), formatWithUnit(pt.x, r.inputDimension, us, ctx, 5),
                                             qs(pt.error->message));
        } else if (!pt.warnings.empty()) {
            status->setForeground(ink::warning());
            QStringList w;
            for (const std::string& s : pt.warnings) w << qs(s);
            status->setToolTip(w.join(QLatin1Char('\n')));
        }
    }
    table_->resizeColumnsToContents();
    failures_->setPlainText(failed.isEmpty() ? QString()
                                             : tr("%n point(s) not computed:\n", nullptr, int(failed.size())) +
                                                   failed.join(QLatin1Char('\n')));
}

}  // namespace heatchain::gui
