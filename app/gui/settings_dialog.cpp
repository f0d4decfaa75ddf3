#include "settings_dialog.hpp"

#include <QDialogButtonBox>
#include <QFormLayout>
#include <QGroupBox>
#include <QHBoxLayout>
#include <QVBoxLayout>

#include "heatchain/substance.hpp"
#include "heatchain_view/format.hpp"
#include "project_edit.hpp"

namespace heatchain::gui {

namespace {
using heatchain::view::qs;
QString numText(const std::optional<Number>& n) { return n ? qs(n->typed()) : QString(); }
}  // namespace

ProjectSettingsDialog::ProjectSettingsDialog(const Project& project, QWidget* parent)
    : WorksheetDialog(project, parent) {
    setWindowTitle(tr("Worksheet settings"));
    auto* outer = new QVBoxLayout(this);
    auto* columns = new QHBoxLayout;
    outer->addLayout(columns);

    auto* about = new QGroupBox(tr("Description"), this);
    auto* af = new QFormLayout(about);
    title_ = new QLineEdit(qs(project.meta.title), about);
    author_ = new QLineEdit(qs(project.meta.author), about);
    revision_ = new QLineEdit(qs(project.meta.revision), about);
    notes_ = new QPlainTextEdit(qs(project.meta.notes), about);
    notes_->setMinimumHeight(90);
    af->addRow(tr("Title"), title_);
    af->addRow(tr("Author"), author_);
    af->addRow(tr("Revision"), revision_);
    af->addRow(tr("Notes"), notes_);
    units_ = new QComboBox(about);
    for (UnitSystem u : {UnitSystem::SI, UnitSystem::MetricEngineering, UnitSystem::USCustomary})
        units_->addItem(u == UnitSystem::SI ? tr("SI (K, kPa, kJ)")
                        : u == UnitSystem::MetricEngineering ? tr("Metric engineering (°C, bar)")
                                                             : tr("US customary (°F, psia)"),
                        int(u));
    units_->setCurrentIndex(units_->findData(int(project.displayUnits)));
    af->addRow(tr("Display units"), units_);
    columns->addWidget(about, 1);

    auto* material = new QGroupBox(tr("Material and process"), this);
    auto* mf = new QFormLayout(material);
    substance_ = new QComboBox(material);
    for (const Substance& s : SubstanceLibrary::builtin().all())
        substance_->addItem(QStringLiteral("%1  (%2)").arg(qs(s.name), qs(s.formula)), qs(s.id));
    if (project.substance.definition)
        substance_->addItem(tr("%1 (defined in this file)").arg(qs(project.substance.name)), QStringLiteral("\x01custom"));
    {
        const int i = project.substance.definition ? substance_->count() - 1
                                                   : substance_->findData(qs(project.substance.id));
        substance_->setCurrentIndex(std::max(0, i));
    }
    model_ = new QComboBox(material);
    for (ModelKind m : {ModelKind::ConstantCp, ModelKind::TemperatureDependentCp, ModelKind::RealFluid,
                        ModelKind::Reference})
        model_->addItem(view::modelTitle(m), int(m));
    model_->setCurrentIndex(model_->findData(int(project.model)));
    system_ = new QComboBox(material);
    system_->addItem(tr("steady flow"), int(SystemKind::SteadyFlow));
    system_->addItem(tr("closed batch"), int(SystemKind::Closed));
    system_->setCurrentIndex(system_->findData(int(project.system)));
    basisKind_ = new QComboBox(material);
    basisKind_->addItem(tr("mass flow"), int(Basis::Kind::MassFlow));
    basisKind_->addItem(tr("molar flow"), int(Basis::Kind::MolarFlow));
    basisKind_->addItem(tr("mass"), int(Basis::Kind::Mass));
    basisKind_->addItem(tr("amount"), int(Basis::Kind::Amount));
    basisKind_->setCurrentIndex(basisKind_->findData(int(project.basis.kind)));
    basis_ = new QuantityField(material);
    basis_->showValue(qs(project.basis.amount.text));
    auto* basisRow = new QWidget(material);
    auto* bl = new QHBoxLayout(basisRow);
    bl->setContentsMargins(0, 0, 0, 0);
    bl->addWidget(basisKind_);
    bl->addWidget(basis_, 1);
    mf->addRow(tr("Substance"), substance_);
    mf->addRow(tr("Property model"), model_);
    mf->addRow(tr("System"), system_);
    mf->addRow(tr("Basis"), basisRow);

    auto quantity = [this](QWidget* parent, const std::optional<Quantity>& q, Dimension d, bool optional) {
        auto* f = new QuantityField(parent);
        f->showValue(q ? qs(q->text) : QString());
        f->setCheck([this, d, optional](const QString& t) -> QString {
            if (t.isEmpty()) return optional ? QString() : tr("a value is needed here");
            auto r = parseTypedQuantity(t.toStdString(), d, base_);
            return r ? QString() : qs(r.error().message);
        });
        return f;
    };
    auto number = [](QWidget* parent, const std::optional<Number>& n, BoundedField field, const char* what) {
        auto* f = new QuantityField(parent);
        f->showValue(numText(n));
        f->setCheck([field, what](const QString& t) -> QString {
            if (t.isEmpty()) return {};
            auto r = parseTypedNumber(t.toStdString(), field, what);
            return r ? QString() : qs(r.error().message);
        });
        return f;
    };
    startT_ = quantity(material, project.start.T, Dimension::Temperature, true);
    startP_ = quantity(material, project.start.P, Dimension::Pressure, true);
    startX_ = number(material, project.start.quality, BoundedField::Quality, "the quality");
    startMelt_ = number(material, project.start.meltFraction, BoundedField::MeltFraction, "the liquid fraction");
    startX_->setPlaceholder(tr("only on the saturation line"));
    startMelt_->setPlaceholder(tr("only on the melting line"));
    mf->addRow(tr("Start T"), startT_);
    mf->addRow(tr("Start P"), startP_);
    mf->addRow(tr("Start quality x"), startX_);
    mf->addRow(tr("Start liquid fraction"), startMelt_);
    const Surroundings& surroundings = project.surroundingsOrDefault();
    surrT_ = quantity(material, std::optional<Quantity>(surroundings.T), Dimension::Temperature, false);
    surrP_ = quantity(material, std::optional<Quantity>(surroundings.P), Dimension::Pressure, false);
    atm_ = quantity(material, std::optional<Quantity>(project.atmosphereOrDefault()), Dimension::Pressure, false);
    mf->addRow(tr("Surroundings T₀"), surrT_);
    mf->addRow(tr("Surroundings P₀"), surrP_);
    mf->addRow(tr("Atmosphere (gauge zero)"), atm_);
    columns->addWidget(material, 1);

    basis_->setCheck([this](const QString& t) -> QString {
        auto r = parseTypedQuantity(t.toStdString(), heatchain::basisDimension(Basis::Kind(basisKind_->currentData().toInt())), base_);
        return r ? QString() : qs(r.error().message);
    });

    finishLayout(outer);
}

QString ProjectSettingsDialog::build(Project& p) {
    for (QuantityField* f : {basis_, startT_, startP_, startX_, startMelt_, surrT_, surrP_, atm_}) {
        f->commit();
        if (f->hasError()) return tr("Correct the marked field: %1").arg(f->errorText());
    }
    p.meta.title = title_->text().toStdString();
    p.meta.author = author_->text().toStdString();
    p.meta.revision = revision_->text().toStdString();
    p.meta.notes = notes_->toPlainText().toStdString();
    p.displayUnits = UnitSystem(units_->currentData().toInt());
    p.model = ModelKind(model_->currentData().toInt());
    p.system = SystemKind(system_->currentData().toInt());
    const QString sub = substance_->currentData().toString();
    if (sub != QStringLiteral("\x01custom")) {
        const Substance* s = SubstanceLibrary::builtin().find(sub.toStdString());
        if (!s) return tr("unknown substance %1").arg(sub);
        p.substance = *s;  // a library substance: no definition of its own
    }
    p.basis.kind = Basis::Kind(basisKind_->currentData().toInt());
    p.basis.amount.text = basis_->text().toStdString();
    auto typed = [](QuantityField* f) -> std::optional<Quantity> {
        if (f->text().isEmpty()) return std::nullopt;
        return Quantity{f->text().toStdString(), 0};
    };
    p.start.T = typed(startT_);
    p.start.P = typed(startP_);
    auto num = [](QuantityField* f, BoundedField field) -> std::optional<Number> {
        if (f->text().isEmpty()) return std::nullopt;
        auto n = parseTypedNumber(f->text().toStdString(), field, "value");
        return n ? std::optional<Number>(*n) : std::nullopt;
    };
    p.start.quality = num(startX_, BoundedField::Quality);
    p.start.meltFraction = num(startMelt_, BoundedField::MeltFraction);
    // Written only when the file gave them or the user changed them.
    const Surroundings& was = base_.surroundingsOrDefault();
    if (base_.surroundings || surrT_->text().toStdString() != was.T.text ||
        surrP_->text().toStdString() != was.P.text) {
        Surroundings s = was;
        s.T.text = surrT_->text().toStdString();
        s.P.text = surrP_->text().toStdString();
        p.surroundings = std::move(s);
    }
    if (base_.atmosphere || atm_->text().toStdString() != base_.atmosphereOrDefault().text) {
        Quantity a = base_.atmosphereOrDefault();
        a.text = atm_->text().toStdString();
        p.atmosphere = std::move(a);
    }
    return {};
}

}  // namespace heatchain::gui
