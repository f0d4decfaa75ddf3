#include "locale_decimal.hpp"

namespace heatchain::gui {

namespace {

bool isDigit(const QString& s, qsizetype i) { return i >= 0 && i < s.size() && s.at(i).isDigit(); }

// Replaces `from` by `to` where `at(i)` says the separator stands in a number.
template <class At>
QString swapSeparator(const QString& text, const QString& from, const QString& to, At at) {
    if (from.isEmpty() || from == to) return text;
    QString out;
    out.reserve(text.size());
    for (qsizetype i = 0; i < text.size();) {
        if (text.mid(i, from.size()) == from && at(i, i + from.size())) {
            out += to;
            i += from.size();
        } else {
            out += text.at(i++);
        }
    }
    return out;
}

}  // namespace

QString fromLocaleDecimal(const QString& typed, const QLocale& locale) {
    const QString sep = locale.decimalPoint();
    if (sep == QStringLiteral(".")) return typed;
    return swapSeparator(typed, sep, QStringLiteral("."), [&](qsizetype begin, qsizetype end) {
        if (!isDigit(typed, end)) return false;
        if (begin == 0) return true;
        const QChar before = typed.at(begin - 1);
        return before.isDigit() || before.isSpace() || before == QLatin1Char('+') || before == QLatin1Char('-') ||
               before == QChar(0x2212);  // minus sign
    });
}

QString toLocaleDecimal(const QString& fileText, const QLocale& locale) {
    const QString sep = locale.decimalPoint();
    if (sep == QStringLiteral(".")) return fileText;
    return swapSeparator(fileText, QStringLiteral("."), sep, [&](qsizetype begin, qsizetype end) {
        return isDigit(fileText, begin - 1) && isDigit(fileText, end);
    });
}

}  // namespace heatchain::gui
