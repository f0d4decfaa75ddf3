#include "heatchain_qt/format.hpp"

#include <cmath>

namespace heatchain::view {

QString prettyUnit(std::string_view coreSymbol) {
    QString u = QString::fromUtf8(coreSymbol.data(), qsizetype(coreSymbol.size()));
    u.replace(QStringLiteral("degC"), QStringLiteral("°C"));
    u.replace(QStringLiteral("degF"), QStringLiteral("°F"));
    u.replace(QStringLiteral("degR"), QStringLiteral("°R"));
    u.replace(QStringLiteral("m3"), QStringLiteral("m³"));
    u.replace(QStringLiteral("ft3"), QStringLiteral("ft³"));
    u.replace(QStringLiteral(" K)"), QStringLiteral("·K)"));
    u.replace(QStringLiteral(" R)"), QStringLiteral("·°R)"));
    return u;
}

QString unitSymbol(Dimension d, UnitSystem system) {
    return prettyUnit(displayUnit(d, system));
}

QString formatNumber(double value, int significant, int maxDecimals) {
    if (!std::isfinite(value)) return QStringLiteral("–");
    if (value == 0.0) return QStringLiteral("0");
    const double mag = std::floor(std::log10(std::fabs(value)));
    if (mag >= 9 || mag <= -5) {
        QString s = QString::number(value, 'e', std::max(0, significant - 1));
        return s.replace(QLatin1Char('-'), QChar(0x2212));
    }
    int decimals = std::clamp(significant - 1 - int(mag), 0, maxDecimals);
    QString s = QString::number(value, 'f', decimals);
    // "-0.0" after rounding reads as a sign error; show it as zero.
    bool allZero = true;
    for (QChar c : s)
        if (c.isDigit() && c != QLatin1Char('0')) allZero = false;
    if (allZero) s.remove(QLatin1Char('-'));
    return s.replace(QLatin1Char('-'), QChar(0x2212));
}

QString formatDisplay(double si, Dimension d, UnitSystem system, const UnitContext& ctx,
                      int significant) {
    const double v = toDisplay(si, d, system, ctx);
    // Temperatures read best with a fixed one or two decimals, whatever the scale.
    if (d == Dimension::Temperature || d == Dimension::TemperatureDifference)
        return formatNumber(v, 12, std::fabs(v) < 10 ? 2 : 1);
    return formatNumber(v, significant);
}

QString formatWithUnit(double si, Dimension d, UnitSystem system, const UnitContext& ctx,
                       int significant) {
    const QString unit = unitSymbol(d, system);
    const QString num = formatDisplay(si, d, system, ctx, significant);
    if (unit.startsWith(QChar(0x00B0))) return num + QChar(0x202F) + unit;  // narrow space
    return num + QLatin1Char(' ') + unit;
}

Dimension energyDimension(SystemKind system) {
    return system == SystemKind::Closed ? Dimension::Energy : Dimension::Power;
}
Dimension entropyDimension(SystemKind system) {
    return system == SystemKind::Closed ? Dimension::Entropy : Dimension::EntropyRate;
}

QString phaseText(const State& s) {
    const QString label = QString::fromUtf8(phaseLabel(s.phase).data(),
                                            qsizetype(phaseLabel(s.phase).size()));
    switch (s.phase) {
    case Phase::LiquidVapor:
    case Phase::SolidVapor:
        if (s.quality)
            return QStringLiteral("%1, x = %2").arg(label, QString::number(*s.quality, 'f', 3));
        return label;
    case Phase::SolidLiquid:
        if (s.meltFraction)
            return QStringLiteral("%1, %2 % liquid")
                .arg(label, QString::number(*s.meltFraction * 100.0, 'f', 1));
        return label;
    default:
        return label;
    }
}

QString phaseShort(const State& s) {
    switch (s.phase) {
    case Phase::LiquidVapor:
    case Phase::SolidVapor:
        if (s.quality) return QStringLiteral("x = %1").arg(QString::number(*s.quality, 'f', 3));
        break;
    case Phase::SolidLiquid:
        if (s.meltFraction)
            return QStringLiteral("%1 % liquid").arg(QString::number(*s.meltFraction * 100, 'f', 1));
        break;
    default:
        break;
    }
    return QString::fromUtf8(phaseLabel(s.phase).data(), qsizetype(phaseLabel(s.phase).size()));
}

const std::vector<StepKind>& allStepKinds() {
    static const std::vector<StepKind> kinds = {
        StepKind::Heat,     StepKind::Cool,    StepKind::Melt,      StepKind::Freeze,
        StepKind::Boil,     StepKind::Condense, StepKind::Sublimate, StepKind::Deposit,
        StepKind::Compress, StepKind::Expand,  StepKind::Throttle,
    };
    return kinds;
}

QString stepKindTitle(StepKind k) {
    switch (k) {
    case StepKind::Heat: return QStringLiteral("Heat");
    case StepKind::Cool: return QStringLiteral("Cool");
    case StepKind::Melt: return QStringLiteral("Melt");
    case StepKind::Freeze: return QStringLiteral("Freeze");
    case StepKind::Boil: return QStringLiteral("Boil");
    case StepKind::Condense: return QStringLiteral("Condense");
    case StepKind::Sublimate: return QStringLiteral("Sublimate");
    case StepKind::Deposit: return QStringLiteral("Deposit");
    case StepKind::Compress: return QStringLiteral("Compress");
    case StepKind::Expand: return QStringLiteral("Expand");
    case StepKind::Throttle: return QStringLiteral("Throttle");
    }
    return {};
}

static QString typed(const Quantity& q) { return QString::fromStdString(q.text); }
static QString typed(const Number& n) {
    return QString::fromStdString(n.raw.is_null() ? std::to_string(n.value) : n.raw.dump());
}

QString stepSpecSummary(const Step& step, SystemKind) {
    QStringList parts;
    if (step.hasTo) {
        if (step.to.T) parts << QStringLiteral("to %1").arg(typed(*step.to.T));
        if (step.to.P) parts << QStringLiteral("to %1").arg(typed(*step.to.P));
        if (step.to.duty) parts << QStringLiteral("duty %1").arg(typed(*step.to.duty));
        if (step.to.quality) parts << QStringLiteral("to x = %1").arg(typed(*step.to.quality));
        if (step.to.ratio) parts << QStringLiteral("ratio %1").arg(typed(*step.to.ratio));
    }
    if (step.fraction) parts << QStringLiteral("fraction %1").arg(typed(*step.fraction));
    if (step.at == HeatingAt::ConstantVolume) parts << QStringLiteral("const. V");
    if (step.path) {
        switch (*step.path) {
        case PathKind::Isothermal: parts << QStringLiteral("isothermal"); break;
        case PathKind::Isentropic: parts << QStringLiteral("isentropic"); break;
        case PathKind::Polytropic:
            parts << (step.n ? QStringLiteral("polytropic n = %1").arg(typed(*step.n))
                             : QStringLiteral("polytropic"));
            break;
        case PathKind::Adiabatic:
            parts << (step.efficiency ? QStringLiteral("η = %1").arg(typed(*step.efficiency))
                                      : QStringLiteral("adiabatic"));
            break;
        }
    }
    if (step.source && step.source->T) parts << QStringLiteral("source %1").arg(typed(*step.source->T));
    if (step.sink && step.sink->T) parts << QStringLiteral("sink %1").arg(typed(*step.sink->T));
    return parts.join(QStringLiteral(", "));
}

}  // namespace heatchain::view
