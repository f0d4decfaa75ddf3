#include "start_editor.hpp"

#include <QFormLayout>
#include <QHBoxLayout>
#include <QVBoxLayout>

#include "commands.hpp"
#include "heatchain/project_file.hpp"
#include "heatchain/substance.hpp"
#include "heatchain_view/format.hpp"
#include "project_edit.hpp"

namespace heatchain::gui {

using namespace heatchain::view;

namespace {
using heatchain::view::qs;
const QString kCustom = QStringLiteral("\x01custom");
}  // namespace

StartEditor::StartEditor(ProjectDocument* doc, QWidget* parent) : QWidget(parent), doc_(doc) {
    auto* outer = new QVBoxLayout(this);
    outer->setContentsMargins(8, 6, 8, 6);
    lead_ = new QLabel(this);
    lead_->setWordWrap(true);
    lead_->setTextFormat(Qt::RichText);
    outer->addWidget(lead_);

    auto* form = new QFormLayout;
    form->setContentsMargins(0, 0, 0, 0);
    form->setLabelAlignment(Qt::AlignRight);
    form->setFieldGrowthPolicy(QFormLayout::AllNonFixedFieldsGrow);
    substance_ = new QComboBox(this);
    substance_->setObjectName(QStringLiteral("substance"));
    for (const Substance& s : SubstanceLibrary::builtin().all())
        substance_->addItem(QStringLiteral("%1  (%2)").arg(qs(s.name), qs(s.formula)), qs(s.id));
    // Long substance names must not widen the panel beyond its dock.
    substance_->setSizeAdjustPolicy(QComboBox::AdjustToMinimumContentsLengthWithIcon);
    substance_->setMinimumContentsLength(14);
    model_ = new QComboBox(this);
    model_->setObjectName(QStringLiteral("model"));
    for (ModelKind m : {ModelKind::ConstantCp, ModelKind::TemperatureDependentCp, ModelKind::RealFluid,
                        ModelKind::Reference})
        model_->addItem(modelTitle(m), int(m));
    model_->setToolTip(tr("Reference: the best equation the substance has (IAPWS-IF97 for water, "
                          "Tillner-Roth for ammonia, otherwise Peng–Robinson)."));
    T_ = new QuantityField(this);
    P_ = new QuantityField(this);
    quality_ = new QuantityField(this);
    melt_ = new QuantityField(this);
    T_->setPlaceholder(tr("e.g. 20 degC"));
    P_->setPlaceholder(tr("e.g. 1 atm, 6 barg"));
    quality_->setPlaceholder(tr("only on the saturation line, 0–1 or %"));
    melt_->setPlaceholder(tr("only on the melting line, 0–1 or %"));
    basisKind_ = new QComboBox(this);
    basisKind_->addItem(tr("mass flow"), int(Basis::Kind::MassFlow));
    basisKind_->addItem(tr("molar flow"), int(Basis::Kind::MolarFlow));
    basisKind_->addItem(tr("mass"), int(Basis::Kind::Mass));
    basisKind_->addItem(tr("amount"), int(Basis::Kind::Amount));
    basis_ = new QuantityField(this);
    auto* basisRow = new QWidget(this);
    auto* bl = new QHBoxLayout(basisRow);
    bl->setContentsMargins(0, 0, 0, 0);
    bl->addWidget(basisKind_);
    bl->addWidget(basis_, 1);
    form->addRow(tr("Substance"), substance_);
    form->addRow(tr("Property model"), model_);
    form->addRow(tr("Temperature"), T_);
    form->addRow(tr("Pressure"), P_);
    form->addRow(tr("Quality x"), quality_);
    form->addRow(tr("Liquid fraction"), melt_);
    form->addRow(tr("Basis"), basisRow);
    outer->addLayout(form);
    problem_ = new QLabel(this);
    problem_->setWordWrap(true);
    problem_->setStyleSheet(QStringLiteral("color: #b42318;"));
    problem_->hide();
    outer->addWidget(problem_);
    state_ = new QLabel(this);
    state_->setWordWrap(true);
    state_->setTextFormat(Qt::RichText);
    state_->setStyleSheet(QStringLiteral("color: #3b4350;"));
    outer->addWidget(state_);
    auto* more = new QLabel(tr("System, surroundings and atmosphere: File ▸ Worksheet settings (Ctrl+,)."), this);
    more->setWordWrap(true);
    more->setStyleSheet(QStringLiteral("color: #6b727a;"));
    outer->addWidget(more);

    // Typed fields: core's parser says whether the text reads as the
    // quantity; the whole worksheet is checked again on commit.
    auto quantityCheck = [this](Dimension d) {
        return [this, d](const QString& t) -> QString {
            if (t.isEmpty()) return {};
            auto q = parseTypedQuantity(t.toStdString(), d, doc_->project());
            return q ? QString() : qs(q.error().message);
        };
    };
    T_->setCheck(quantityCheck(Dimension::Temperature));
    P_->setCheck(quantityCheck(Dimension::Pressure));
    auto fractionCheck = [](BoundedField field, const char* what) {
        return [field, what](const QString& t) -> QString {
            if (t.isEmpty()) return {};
            auto n = parseTypedNumber(t.toStdString(), field, what);
            return n ? QString() : qs(n.error().message);
        };
    };
    quality_->setCheck(fractionCheck(BoundedField::Quality, "the quality"));
    melt_->setCheck(fractionCheck(BoundedField::MeltFraction, "the liquid fraction"));
    basis_->setCheck([this](const QString& t) -> QString {
        if (t.isEmpty()) return tr("the basis needs an amount");
        auto q = parseTypedQuantity(t.toStdString(), basisDimension(Basis::Kind(basisKind_->currentData().toInt())),
                                    doc_->project());
        return q ? QString() : qs(q.error().message);
    });

    auto typedQuantity = [](const QString& t) -> std::optional<Quantity> {
        if (t.isEmpty()) return std::nullopt;
        return Quantity{t.toStdString(), 0};
    };
    auto typedFraction = [](const QString& t, BoundedField field) -> std::optional<Number> {
        if (t.isEmpty()) return std::nullopt;
        auto n = parseTypedNumber(t.toStdString(), field, "value");
        return n ? std::optional<Number>(*n) : std::nullopt;
    };
    connect(T_, &QuantityField::committed, this, [=, this](const QString& t) {
        apply(tr("start temperature"), [&](Project& p) { p.start.T = typedQuantity(t); });
    });
    connect(P_, &QuantityField::committed, this, [=, this](const QString& t) {
        apply(tr("start pressure"), [&](Project& p) { p.start.P = typedQuantity(t); });
    });
    connect(quality_, &QuantityField::committed, this, [=, this](const QString& t) {
        apply(tr("start quality"), [&](Project& p) { p.start.quality = typedFraction(t, BoundedField::Quality); });
    });
    connect(melt_, &QuantityField::committed, this, [=, this](const QString& t) {
        apply(tr("start liquid fraction"), [&](Project& p) { p.start.meltFraction = typedFraction(t, BoundedField::MeltFraction); });
    });
    connect(basis_, &QuantityField::committed, this, [this](const QString& t) {
        apply(tr("basis"), [&](Project& p) {
            p.basis.kind = Basis::Kind(basisKind_->currentData().toInt());
            p.basis.amount.text = t.toStdString();
        });
    });
    connect(basisKind_, &QComboBox::activated, this, [this] { basis_->commit(); });
    connect(substance_, &QComboBox::activated, this, [this] {
        const QString id = substance_->currentData().toString();
        if (id == kCustom) return;
        const Substance* s = SubstanceLibrary::builtin().find(id.toStdString());
        if (!s) return;
        apply(tr("substance"), [&](Project& p) {
            p.substance = *s;  // a library substance: no definition of its own
        });
    });
    connect(model_, &QComboBox::activated, this, [this] {
        const auto m = ModelKind(model_->currentData().toInt());
        apply(tr("property model"), [&](Project& p) { p.model = m; });
    });
    const std::pair<QuantityField*, QString> named[] = {
        {T_, tr("temperature")}, {P_, tr("pressure")}, {quality_, tr("quality")},
        {melt_, tr("liquid fraction")}, {basis_, tr("basis")}};
    for (const auto& [f, label] : named) {
        connect(f, &QuantityField::rejected, this, [this, label](const QString& text, const QString& reason) {
            emit rejected(tr("Start %1 “%2” not applied: %3").arg(label, text, reason));
        });
    }
    connect(doc_, &ProjectDocument::changed, this, &StartEditor::refresh);
    refresh();
}

QuantityField* StartEditor::field(const QString& name) const {
    if (name == QStringLiteral("T")) return T_;
    if (name == QStringLiteral("P")) return P_;
    if (name == QStringLiteral("quality")) return quality_;
    if (name == QStringLiteral("meltFraction")) return melt_;
    if (name == QStringLiteral("basis")) return basis_;
    return nullptr;
}

QString StartEditor::apply(const QString& what, const std::function<void(Project&)>& change) {
    if (filling_) return {};
    Project p = doc_->project();
    change(p);
    auto checked = resolveProject(p);
    if (!checked) {
        const QString reason = qs(checked.error().text());
        problem_->setText(tr("Not applied (%1): %2").arg(what, reason));
        problem_->show();
        emit rejected(tr("Start %1 not applied: %2").arg(what, reason));
        refresh();
        return reason;
    }
    problem_->hide();
    doc_->undoStack()->push(new EditProjectSettings(doc_, std::move(checked.value()), tr("Edit start: %1").arg(what)));
    return {};
}

void StartEditor::refresh() {
    filling_ = true;
    const Project& p = doc_->project();
    const SequenceResult& r = doc_->result();
    lead_->setText(p.steps.empty()
                       ? tr("<b>Start: choose the material and where it starts.</b><br>"
                            "<span style='color:#3b4350'>Then add steps with the toolbar, the + between "
                            "cards, or the quick-add line (“heat to 180 degC”).</span>")
                       : tr("<b>Start</b> &nbsp;·&nbsp; the material and where it starts"));
    if (p.substance.definition) {
        if (substance_->findData(kCustom) < 0)
            substance_->addItem(tr("%1 (defined in this worksheet)").arg(qs(p.substance.name)), kCustom);
        substance_->setCurrentIndex(substance_->findData(kCustom));
    } else {
        if (const int c = substance_->findData(kCustom); c >= 0) substance_->removeItem(c);
        substance_->setCurrentIndex(substance_->findData(qs(p.substance.id)));
    }
    model_->setCurrentIndex(model_->findData(int(p.model)));
    T_->showValue(p.start.T ? qs(p.start.T->text) : QString());
    P_->showValue(p.start.P ? qs(p.start.P->text) : QString());
    quality_->showValue(p.start.quality ? qs(p.start.quality->typed()) : QString());
    melt_->showValue(p.start.meltFraction ? qs(p.start.meltFraction->typed()) : QString());
    basisKind_->setCurrentIndex(basisKind_->findData(int(p.basis.kind)));
    basis_->showValue(qs(p.basis.amount.text));
    const UnitSystem u = p.displayUnits;
    const UnitContext ctx = displayContext(p);
    if (r.startError) {
        state_->setText(tr("<span style='color:#b42318'><b>Error:</b> %1</span>")
                            .arg(qs(r.startError->text()).toHtmlEscaped()));
    } else {
        state_->setText(tr("Starts as %1 at %2 and %3.%4")
                            .arg(phaseText(r.start), formatWithUnit(r.start.T, Dimension::Temperature, u, ctx),
                                 formatWithUnit(r.start.P, Dimension::Pressure, u, ctx),
                                 r.model ? tr("<br>Equations: %1").arg(qs(std::string(r.model->name())).toHtmlEscaped())
                                         : QString()));
    }
    filling_ = false;
}

}  // namespace heatchain::gui
