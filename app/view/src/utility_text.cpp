#include "heatchain_view/utility_text.hpp"

#include "heatchain_view/format.hpp"

namespace heatchain::view {

QString utilityKindText(UtilityKind k) {
    switch (k) {
    case UtilityKind::Steam: return QStringLiteral("steam");
    case UtilityKind::Sensible: return QStringLiteral("sensible");
    case UtilityKind::Fixed: return QStringLiteral("fixed T");
    }
    return {};
}

QString utilityMassText(UtilityKind kind, double mass, SystemKind system, UnitSystem units,
                        const UnitContext& ctx) {
    if (kind == UtilityKind::Fixed) return QStringLiteral("–");
    const Dimension d = system == SystemKind::Closed ? Dimension::Mass : Dimension::MassFlow;
    return formatWithUnit(mass, d, units, ctx, 4);
}

QString utilityUseText(UtilityKind kind, double mass, const std::optional<double>& volume,
                       SystemKind system, UnitSystem units, const UnitContext& ctx) {
    if (kind == UtilityKind::Fixed) return QStringLiteral("–");
    if (volume) {
        const Dimension d = system == SystemKind::Closed ? Dimension::Volume : Dimension::VolumeFlow;
        return formatWithUnit(*volume, d, units, ctx, 4);
    }
    return utilityMassText(kind, mass, system, units, ctx);
}

QString approachWhereText(const StepResult& step) {
    if (!step.utility) return {};
    const StepUtility& u = *step.utility;
    QString where = QString::fromStdString(u.position);
    if (u.segment < step.segments.size() && !step.segments[u.segment].label.empty())
        where += QStringLiteral(" of %1").arg(QString::fromStdString(step.segments[u.segment].label));
    return where;
}

QString utilityTemperaturesText(const UtilityProfile& p, UnitSystem units, const UnitContext& ctx) {
    switch (p.kind) {
    case UtilityKind::Steam:
        return QStringLiteral("%1 at %2").arg(formatWithUnit(p.Tin, Dimension::Temperature, units, ctx, 4),
                                              formatWithUnit(p.P, Dimension::Pressure, units, ctx, 4));
    case UtilityKind::Sensible:
        return QStringLiteral("%1 → %2").arg(formatDisplay(p.Tin, Dimension::Temperature, units, ctx, 4),
                                             formatWithUnit(p.Tout, Dimension::Temperature, units, ctx, 4));
    case UtilityKind::Fixed:
        return formatWithUnit(p.Tin, Dimension::Temperature, units, ctx, 4);
    }
    return {};
}

QString efficiencyText(const std::optional<double>& eta) {
    if (!eta) return QStringLiteral("–");
    // 0–100 % with one decimal: a throttle's η_II is zero up to round-off,
    // which significant-figure formatting would print as 2.5e−09 %.
    return QStringLiteral("%1 %").arg(QString::number(100.0 * *eta, 'f', 1));
}

}  // namespace heatchain::view
