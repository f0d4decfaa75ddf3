#pragma once
// The decimal separator of the user's locale in the application's number
// fields: a German engineer types "80,5 degC"; files and the command line
// always carry the point ("80.5 degC"). Fields show numbers with the
// locale's separator and hand core the point.
#include <QLocale>
#include <QString>

namespace heatchain::gui {

// Typed text → file text: the locale's decimal separator, where it sits
// before a digit (after a digit, a sign, a space or at the start), becomes a
// point. A point typed as in a file stays a point; nothing else changes.
// Identity in a locale whose separator is the point.
QString fromLocaleDecimal(const QString& typed, const QLocale& locale = QLocale());

// File text → shown text: a point between digits becomes the locale's
// decimal separator. Identity in a locale whose separator is the point.
QString toLocaleDecimal(const QString& fileText, const QLocale& locale = QLocale());

}  // namespace heatchain::gui
