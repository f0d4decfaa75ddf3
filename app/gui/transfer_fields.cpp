#include "transfer_fields.hpp"

#include "project_edit.hpp"

namespace heatchain::gui {

namespace {

QString typed(const std::optional<Quantity>& q) { return q ? QString::fromStdString(q->text) : QString(); }

// A per-zone U as one line: "liquid 450 W/(m2 K), two-phase 900 W/(m2 K)".
QString zoneText(const HeatTransferSpec& t) {
    QStringList parts;
    for (const auto& [zone, q] : t.zoneU) parts << QStringLiteral("%1 %2").arg(QString::fromStdString(zone), QString::fromStdString(q.text));
    return parts.join(QStringLiteral(", "));
}

}  // namespace

TransferFields::TransferFields(ProjectDocument* doc, QWidget* form, QFormLayout* layout, Apply apply)
    : QObject(form), doc_(doc), layout_(layout) {
    U_ = new QuantityField(form);
    U_->setObjectName(QStringLiteral("transferU"));
    U_->setPlaceholder(tr("none (no area or time)"));
    U_->setToolTip(tr("Overall coefficient U, e.g. 450 W/(m2 K). A different U per zone is written in the file."));
    area_ = new QuantityField(form);
    area_->setObjectName(QStringLiteral("transferArea"));
    area_->setPlaceholder(tr("found from U (steady flow)"));
    UA_ = new QuantityField(form);
    UA_->setObjectName(QStringLiteral("transferUA"));
    UA_->setPlaceholder(tr("or U and area"));
    duration_ = new QuantityField(form);
    duration_->setObjectName(QStringLiteral("duration"));
    layout->addRow(tr("Overall coefficient U"), U_);
    layout->addRow(tr("Area"), area_);
    layout->addRow(tr("UA"), UA_);
    layout->addRow(tr("Duration"), duration_);
    auto check = [this](Dimension d) {
        return [this, d](const QString& t) -> QString {
            if (t.isEmpty()) return {};
            auto q = parseTypedQuantity(t.toStdString(), d, doc_->project());
            if (!q) return QString::fromStdString(q.error().message);
            if (!(q->si > 0)) return tr("must be greater than zero");
            return {};
        };
    };
    U_->setCheck(check(Dimension::HeatTransferCoefficient));
    area_->setCheck(check(Dimension::Area));
    UA_->setCheck(check(Dimension::ThermalConductance));
    duration_->setCheck(check(Dimension::Time));
    // U and area, or UA instead of both: typing one side clears the other.
    auto commit = [this, apply](QuantityField* f, const QString& name, Dimension d,
                                std::function<void(HeatTransferSpec&, std::optional<Quantity>)> set) {
        connect(f, &QuantityField::committed, this, [this, apply, name, d, set](const QString& t) {
            apply(name, [&](Step& s) {
                std::optional<Quantity> q;
                if (!t.isEmpty()) {
                    auto parsed = parseTypedQuantity(t.toStdString(), d, doc_->project());
                    if (!parsed) return;
                    q = *parsed;
                }
                if (!s.transfer) s.transfer = HeatTransferSpec{};
                set(*s.transfer, q);
                const auto& spec = *s.transfer;
                if (!spec.U && spec.zoneU.empty() && !spec.area && !spec.UA) s.transfer.reset();
            });
        });
    };
    commit(U_, tr("overall coefficient"), Dimension::HeatTransferCoefficient, [](HeatTransferSpec& t, auto q) {
        t.U = q;
        t.zoneU.clear();
        if (q) t.UA.reset();
    });
    commit(area_, tr("area"), Dimension::Area, [](HeatTransferSpec& t, auto q) {
        t.area = q;
        if (q) t.UA.reset();
    });
    commit(UA_, tr("UA"), Dimension::ThermalConductance, [](HeatTransferSpec& t, auto q) {
        t.UA = q;
        if (q) {
            t.U.reset();
            t.zoneU.clear();
            t.area.reset();
        }
    });
    connect(duration_, &QuantityField::committed, this, [this, apply](const QString& t) {
        apply(tr("duration"), [&](Step& s) {
            auto q = parseTypedQuantity(t.toStdString(), Dimension::Time, doc_->project());
            if (q) s.duration = *q;
        });
    });
}

void TransferFields::refresh(const Step& s) {
    const bool exchanges = s.kind == StepKind::Heat || s.kind == StepKind::Cool || isPhaseChangeKind(s.kind);
    const bool hold = s.kind == StepKind::Hold;
    for (QuantityField* f : {U_, area_, UA_}) layout_->setRowVisible(f, exchanges);
    layout_->setRowVisible(duration_, hold);
    const HeatTransferSpec none;
    const HeatTransferSpec& t = s.transfer ? *s.transfer : none;
    U_->showValue(t.U ? typed(t.U) : zoneText(t));
    area_->showValue(typed(t.area));
    UA_->showValue(typed(t.UA));
    duration_->showValue(typed(s.duration));
}

QuantityField* TransferFields::field(const QString& name) const {
    if (name == QLatin1String("transferU")) return U_;
    if (name == QLatin1String("transferArea")) return area_;
    if (name == QLatin1String("transferUA")) return UA_;
    if (name == QLatin1String("duration")) return duration_;
    return nullptr;
}

}  // namespace heatchain::gui
