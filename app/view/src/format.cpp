#include "heatchain_view/format.hpp"

#include <optional>
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

QString unitSymbol(Dimension d, UnitSystem system, const UnitContext& ctx) {
    const std::string_view core = displayUnit(d, system, ctx);
    if (d == Dimension::Pressure) {
        // Every pressure says whether it is absolute or gauge.
        if (core == "bar") return QStringLiteral("bar(a)");
        if (core == "barg") return QStringLiteral("bar(g)");
        if (core == "kPa") return QStringLiteral("kPa(a)");
        if (core == "kPag") return QStringLiteral("kPa(g)");
    }
    return prettyUnit(core);
}

QString escapedText(std::string_view bytes) {
    // Valid UTF-8 passes; a stray byte (a UTF-16 byte-order mark FF FE, a
    // Latin-1 letter) or a control character other than line feed and tab
    // reads as \xHH, so a message never echoes raw bytes from a file.
    QString out;
    out.reserve(qsizetype(bytes.size()));
    auto hex = [&out](unsigned char c) {
        out += QStringLiteral("\\x") + QString::number(c, 16).toUpper().rightJustified(2, QLatin1Char('0'));
    };
    std::size_t i = 0;
    while (i < bytes.size()) {
        const auto c = static_cast<unsigned char>(bytes[i]);
        if (c < 0x80) {
            if ((c < 0x20 && c != '\n' && c != '\t') || c == 0x7F) hex(c);
            else out += QLatin1Char(char(c));
            ++i;
            continue;
        }
        const int len = c >= 0xF0 && c <= 0xF4 ? 4 : c >= 0xE0 ? 3 : c >= 0xC2 && c <= 0xDF ? 2 : 0;
        bool ok = len > 0 && i + std::size_t(len) <= bytes.size() && !(c >= 0xF5);
        for (int k = 1; ok && k < len; ++k) ok = (static_cast<unsigned char>(bytes[i + std::size_t(k)]) & 0xC0) == 0x80;
        if (!ok) {
            hex(c);
            ++i;
            continue;
        }
        const QString ch = QString::fromUtf8(bytes.data() + i, qsizetype(len));
        if (ch.size() == 1 && !ch.front().isPrint() && ch.front() != QChar(0x202F)) {
            for (int k = 0; k < len; ++k) hex(static_cast<unsigned char>(bytes[i + std::size_t(k)]));
        } else {
            out += ch;
        }
        i += std::size_t(len);
    }
    return out;
}

bool gaugeDisplay(const Project& project) {
    return project.displayExtra.string("pressure") == "gauge";
}

void setGaugeDisplay(Project& project, bool gauge) {
    if (gauge) project.displayExtra.setString("pressure", "gauge");
    else project.displayExtra.erase("pressure");
}

UnitContext displayContext(const Project& project) {
    UnitContext ctx = project.unitContext();
    ctx.gaugeDisplay = gaugeDisplay(project);
    return ctx;
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

QString formatFixed(double value, int decimals) {
    if (!std::isfinite(value)) return QStringLiteral("–");
    QString s = QString::number(value, 'f', std::max(0, decimals));
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
    const QString unit = unitSymbol(d, system, ctx);
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

QString phaseName(Phase p) {
    switch (p) {
    case Phase::Solid: return QStringLiteral("solid");
    case Phase::Liquid: return QStringLiteral("liquid");
    case Phase::Vapor: return QStringLiteral("vapour");
    case Phase::Supercritical: return QStringLiteral("supercritical");
    // The same words while melting and while freezing.
    case Phase::SolidLiquid: return QStringLiteral("solid + liquid");
    case Phase::LiquidVapor: return QStringLiteral("liquid + vapour");
    case Phase::SolidVapor: return QStringLiteral("solid + vapour");
    }
    return QStringLiteral("unknown");
}

namespace {
// A state on the saturation line at an end of the dome reads as the trade
// says it: "saturated vapour", not "liquid + vapour, x = 1.000".
constexpr double kSaturatedEnd = 1e-6;

// "saturated vapour" or "saturated liquid" at an end of the dome.
std::optional<QString> saturatedEnd(const State& s) {
    if (s.phase != Phase::LiquidVapor || !s.quality) return std::nullopt;
    if (*s.quality >= 1.0 - kSaturatedEnd) return QStringLiteral("saturated vapour");
    if (*s.quality <= kSaturatedEnd) return QStringLiteral("saturated liquid");
    return std::nullopt;
}

// A mixture's share: "x = 0.500" of a two-phase state, "40.0 % liquid" of a
// melting one; empty for a single phase.
QString mixtureShare(const State& s) {
    switch (s.phase) {
    case Phase::LiquidVapor:
    case Phase::SolidVapor:
        if (s.quality) return QStringLiteral("x = %1").arg(QString::number(*s.quality, 'f', 3));
        break;
    case Phase::SolidLiquid:
        if (s.meltFraction) return QStringLiteral("%1 % liquid").arg(QString::number(*s.meltFraction * 100.0, 'f', 1));
        break;
    default:
        break;
    }
    return {};
}

}  // namespace

QString phaseText(const State& s) {
    if (auto end = saturatedEnd(s)) return *end;
    const QString label = phaseName(s.phase);
    const QString share = mixtureShare(s);
    return share.isEmpty() ? label : QStringLiteral("%1, %2").arg(label, share);
}

QString phaseShort(const State& s) {
    if (auto end = saturatedEnd(s)) return *end;
    const QString share = mixtureShare(s);
    return share.isEmpty() ? phaseName(s.phase) : share;
}

const std::vector<StepKind>& allStepKinds() {
    static const std::vector<StepKind> kinds = {
        StepKind::Heat,     StepKind::Cool,    StepKind::Melt,      StepKind::Freeze,
        StepKind::Boil,     StepKind::Condense, StepKind::Sublimate, StepKind::Deposit,
        StepKind::Compress, StepKind::Expand,  StepKind::Throttle, StepKind::Hold,
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
    case StepKind::Hold: return QStringLiteral("Hold");
    }
    return {};
}

QString stepKindMeaning(StepKind k) {
    switch (k) {
    case StepKind::Heat: return QStringLiteral("raise the temperature or add a duty");
    case StepKind::Cool: return QStringLiteral("lower the temperature or remove a duty");
    case StepKind::Melt: return QStringLiteral("solid → liquid");
    case StepKind::Freeze: return QStringLiteral("liquid → solid");
    case StepKind::Boil: return QStringLiteral("liquid → vapour");
    case StepKind::Condense: return QStringLiteral("vapour → liquid");
    case StepKind::Sublimate: return QStringLiteral("solid → vapour");
    case StepKind::Deposit: return QStringLiteral("vapour → solid, the reverse of sublimation");
    case StepKind::Compress: return QStringLiteral("raise the pressure with work");
    case StepKind::Expand: return QStringLiteral("lower the pressure, taking work out");
    case StepKind::Throttle: return QStringLiteral("lower the pressure across a valve, no work");
    case StepKind::Hold: return QStringLiteral("keep a batch at its temperature for a time");
    }
    return {};
}

bool noSourceGiven(const StepResult& s) {
    // Core decides (StepResult::exergyNotCharged); views only say it.
    return s.computed && s.exergyNotCharged.has_value();
}

QString noSourceText() { return QStringLiteral("no source given"); }

QString modelTitle(ModelKind m) {
    switch (m) {
    case ModelKind::ConstantCp: return QStringLiteral("Constant cp");
    case ModelKind::TemperatureDependentCp: return QStringLiteral("Temperature-dependent cp");
    case ModelKind::RealFluid: return QStringLiteral("Real fluid (Peng–Robinson)");
    case ModelKind::Reference: return QStringLiteral("Reference");
    }
    return {};
}

static QString typed(const Quantity& q) { return QString::fromStdString(q.text); }
static QString typed(const Number& n) {
    return QString::fromStdString(n.typed());
}

QString stepSpecSummary(const Step& step, SystemKind) {
    QStringList parts;
    if (!step.to.empty()) {
        if (step.to.T) parts << QStringLiteral("to %1").arg(typed(*step.to.T));
        if (step.to.P) parts << QStringLiteral("to %1").arg(typed(*step.to.P));
        if (step.to.duty) parts << QStringLiteral("duty %1").arg(typed(*step.to.duty));
        if (step.to.quality) parts << QStringLiteral("to x = %1").arg(typed(*step.to.quality));
        if (step.to.ratio) parts << QStringLiteral("ratio %1").arg(typed(*step.to.ratio));
        if (step.to.rated) parts << QStringLiteral("rated: what its exchanger reaches");
        if (step.to.time) parts << QStringLiteral("for %1").arg(typed(*step.to.time));
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
