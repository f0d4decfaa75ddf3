#include "transfer_fields.hpp"

#include <algorithm>

#include "heatchain/transfer.hpp"
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

// The zone keys of a per-zone U (project format), and the row labels.
struct ZoneRow {
    const char* key;
    const char* label;
};
constexpr ZoneRow kZones[] = {
    {"solid", QT_TRANSLATE_NOOP("TransferFields", "U solid")},
    {"solid-liquid", QT_TRANSLATE_NOOP("TransferFields", "U solid-liquid")},
    {"liquid", QT_TRANSLATE_NOOP("TransferFields", "U liquid")},
    {"two-phase", QT_TRANSLATE_NOOP("TransferFields", "U two-phase")},
    {"vapour", QT_TRANSLATE_NOOP("TransferFields", "U vapour")},
    {"solid-vapour", QT_TRANSLATE_NOOP("TransferFields", "U solid-vapour")},
};

const Quantity* zoneValue(const HeatTransferSpec& t, const std::string& key) {
    for (const auto& [zone, q] : t.zoneU)
        if (zone == key) return &q;
    return nullptr;
}

}  // namespace

TransferFields::TransferFields(ProjectDocument* doc, QWidget* form, QFormLayout* layout, Apply apply)
    : QObject(form), doc_(doc), layout_(layout) {
    U_ = new QuantityField(form);
    U_->setObjectName(QStringLiteral("transferU"));
    U_->setPlaceholder(tr("none (no area or time)"));
    U_->setToolTip(tr("Overall coefficient U, e.g. 450 W/(m2 K), for every zone; or give one U per zone in the "
                      "rows below, shown when the step passes through more than one zone."));
    area_ = new QuantityField(form);
    area_->setObjectName(QStringLiteral("transferArea"));
    area_->setPlaceholder(tr("found from U (steady flow)"));
    UA_ = new QuantityField(form);
    UA_->setObjectName(QStringLiteral("transferUA"));
    UA_->setPlaceholder(tr("or U and area"));
    duration_ = new QuantityField(form);
    duration_->setObjectName(QStringLiteral("duration"));
    layout->addRow(tr("Overall coefficient U"), U_);
    for (const ZoneRow& z : kZones) {
        auto* f = new QuantityField(form);
        f->setObjectName(QStringLiteral("transferU.%1").arg(QLatin1String(z.key)));
        f->setPlaceholder(tr("the overall U"));
        f->setToolTip(tr("U while the step is in this zone (two-phase: boiling or condensing), e.g. 900 W/(m2 K)"));
        layout->addRow(tr(z.label), f);
        zoneFields_.emplace_back(z.key, f);
    }
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
    for (auto& [key, f] : zoneFields_) f->setCheck(check(Dimension::HeatTransferCoefficient));
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
    // A zone's own U. A single U given so far becomes every shown zone's U
    // first (the file takes one U or one per zone, not both); an emptied
    // zone falls back to nothing, which the solver names if the step needs it.
    for (auto& [key, f] : zoneFields_) {
        const std::string zone = key;
        commit(f, tr("U of the %1 zone").arg(QString::fromStdString(zone)), Dimension::HeatTransferCoefficient,
               [this, zone](HeatTransferSpec& t, auto q) {
                   if (t.U) {
                       for (const std::string& z : zonesShown_)
                           if (!zoneValue(t, z)) t.zoneU.emplace_back(z, *t.U);
                       t.U.reset();
                   }
                   auto it = std::find_if(t.zoneU.begin(), t.zoneU.end(), [&](const auto& e) { return e.first == zone; });
                   if (q && it != t.zoneU.end()) it->second = *q;
                   else if (q) t.zoneU.emplace_back(zone, *q);
                   else if (it != t.zoneU.end()) t.zoneU.erase(it);
                   if (q) t.UA.reset();
               });
    }
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
    // The zones the step passes through, from its result (also when the
    // result is an error about a zone's U), and those the spec gives.
    zonesShown_.clear();
    for (const StepResult& sr : doc_->result().steps) {
        if (sr.id != s.id) continue;
        for (const SegmentResult& g : sr.segments)
            if (g.Q != 0) zonesShown_.push_back(zoneKeyOf(g.start.phase, g.end.phase));
    }
    for (const auto& [zone, q] : t.zoneU) zonesShown_.push_back(zone);
    // In the order a heat-up meets them (the rows' order), each once.
    auto rank = [](const std::string& key) {
        for (std::size_t i = 0; i < std::size(kZones); ++i)
            if (key == kZones[i].key) return i;
        return std::size(kZones);
    };
    std::sort(zonesShown_.begin(), zonesShown_.end(),
              [&](const std::string& a, const std::string& b) { return rank(a) < rank(b); });
    zonesShown_.erase(std::unique(zonesShown_.begin(), zonesShown_.end()), zonesShown_.end());
    const bool byZone = exchanges && (zonesShown_.size() > 1 || !t.zoneU.empty());
    for (auto& [key, f] : zoneFields_) {
        const bool shown = byZone && std::count(zonesShown_.begin(), zonesShown_.end(), key) > 0;
        layout_->setRowVisible(f, shown);
        const Quantity* q = zoneValue(t, key);
        f->showValue(q ? QString::fromStdString(q->text) : QString());
        f->setPlaceholder(t.U ? tr("%1 (the overall U)").arg(typed(t.U)) : tr("none given"));
    }
    U_->setPlaceholder(t.zoneU.empty() ? tr("none (no area or time)") : tr("by zone, below"));
    U_->showValue(t.U ? typed(t.U) : (byZone ? QString() : zoneText(t)));
    area_->showValue(typed(t.area));
    UA_->showValue(typed(t.UA));
    duration_->showValue(typed(s.duration));
}

QuantityField* TransferFields::field(const QString& name) const {
    if (name == QLatin1String("transferU")) return U_;
    if (name == QLatin1String("transferArea")) return area_;
    if (name == QLatin1String("transferUA")) return UA_;
    if (name == QLatin1String("duration")) return duration_;
    for (const auto& [key, f] : zoneFields_)
        if (name == QStringLiteral("transferU.%1").arg(QString::fromStdString(key))) return f;
    return nullptr;
}

}  // namespace heatchain::gui
