#include "help_text.hpp"
#include "heatchain_view/format.hpp"

#include <QApplication>
#include <QMessageBox>

#include "heatchain/cautions.hpp"
#include "heatchain/substance.hpp"
#include "heatchain_view/step_icons.hpp"

namespace heatchain::gui::help {

namespace {
using heatchain::view::qs;

// The quick-add phrases, for its tooltip and the getting-started page.
const char* const kQuickAddPhrases[][2] = {
    {"heat to 180 degC source 240 degC", "heat to an end temperature, with the heat's source"},
    {"heat by 10 K", "a change: 10 K above where the step starts"},
    {"heat duty 250 kW", "add an amount of heat"},
    {"boil", "the whole phase change (add fraction 0.5 or 50 % for half)"},
    {"cool to x 0.2 sink 30 degC", "to a quality, with the heat's sink"},
    {"compress to 14 barg eff 0.72", "to a pressure, adiabatic with an isentropic efficiency"},
    {"expand ratio 3 isentropic", "by a pressure ratio"},
    {"throttle to 2 bar(a)", "across a valve"},
};

}  // namespace

QString caution() { return qs(generalCaution()); }

QString quickAddTooltip() {
    QString t = QObject::tr("Type a step and press Enter, e.g.");
    for (const auto& row : kQuickAddPhrases) t += QStringLiteral("\n  %1").arg(QString::fromUtf8(row[0]));
    return t;
}

QString gettingStartedHtml() {
    QString html = QObject::tr(
        "<h3>Getting started</h3>"
        "<p>A worksheet follows one material through a chain of steps. The chain starts with the "
        "<b>Start card</b>; each step card after it is one change: heat, cool, melt, freeze, boil, "
        "condense, sublimate, deposit (vapour → solid), compress, expand or throttle.</p>"
        "<ol>"
        "<li><b>Choose the material and where it starts.</b> Click the Start card: the step panel on the "
        "left shows the substance, the property model (Reference is the best the substance has), the "
        "start temperature and pressure and the basis (for example 2 kg/s). Type a value and press Enter; "
        "every value keeps the units you type (<i>180 degC</i>, <i>6 barg</i>, <i>4.2 t/h</i>).</li>"
        "<li><b>Add steps.</b> Use the toolbar's step buttons, the + between two cards, or type a phrase "
        "in the quick-add line (Ctrl+L) and press Enter. A new step goes after the selected card.</li>"
        "<li><b>Edit a step.</b> Click its card; the step panel shows its target (<i>to</i> a temperature, "
        "a pressure or a quality, a duty, or a pressure ratio), its source or sink, and its result. "
        "F2 renames it. Ctrl+Z and Ctrl+Y undo and redo.</li>"
        "<li><b>Read the results.</b> Every card shows the state after its step and its duty Q and work "
        "W; the ledger below lists every step, the charts on the right draw the path. The messages panel "
        "lists errors (nothing computed), warnings (probably not what you meant) and notes (ordinary "
        "facts).</li>"
        "<li><b>Save and report.</b> Ctrl+S saves the worksheet file (the previous version is kept as "
        "<i>.bak</i>); File ▸ Export ▸ Report writes the PDF for review.</li>"
        "</ol>"
        "<h4>Quick-add phrases</h4><table cellspacing='0' cellpadding='2'>");
    for (const auto& row : kQuickAddPhrases)
        html += QStringLiteral("<tr><td><code>%1</code></td><td>&nbsp;&nbsp;%2</td></tr>")
                    .arg(QString::fromUtf8(row[0]).toHtmlEscaped(), QObject::tr(row[1]).toHtmlEscaped());
    html += QObject::tr("</table><p><i>to</i> always names an end value; <i>by</i> only a change of temperature. "
               "Pressures: <i>bar(a)</i>, <i>bara</i> are absolute, <i>barg</i>, <i>bar(g)</i>, <i>psig</i> "
               "gauge (above the worksheet's atmosphere).</p>"
               "<p>The samples (File ▸ Open, folder <i>sample-projects</i>) are complete worksheets to "
               "look at. The words used here are defined in <i>docs/glossary.md</i>.</p>");
    return html;
}

void showGettingStarted(QWidget* parent) {
    QMessageBox box(parent);
    box.setWindowTitle(QObject::tr("Getting started"));
    box.setTextFormat(Qt::RichText);
    box.setText(gettingStartedHtml());
    box.exec();
}

void showAbout(QWidget* parent, const Project& p, const SequenceResult& r) {
    QString html = QObject::tr("<h3>Heatchain %1</h3><p>A worksheet for thermal processes: chain the steps a "
                      "material goes through and read the state after each step with Q, W, ΔH, ΔS, "
                      "S<sub>gen</sub> and exergy destroyed.</p>")
                       .arg(QApplication::applicationVersion());
    html += QStringLiteral("<p style='color:#8a5a00'><b>%1</b></p>").arg(caution().toHtmlEscaped());
    if (r.model) {
        html += QObject::tr("<h4>Property model: %1</h4><p>%2</p><p><i>Range:</i> %3</p>")
                    .arg(qs(r.model->name()).toHtmlEscaped(),
                         qs(r.model->sourceText()).toHtmlEscaped().replace(QLatin1Char('\n'), QStringLiteral("<br>")),
                         qs(r.model->rangeText()).toHtmlEscaped());
    }
    html += QObject::tr("<h4>Substance data: %1</h4><ul>").arg(qs(p.substance.name).toHtmlEscaped());
    for (const SourceNote& n : p.substance.sources)
        html += QStringLiteral("<li><b>%1</b>: %2%3</li>")
                    .arg(qs(sourceFieldLabel(n.field)).toHtmlEscaped(), qs(n.text).toHtmlEscaped(),
                         n.confirmed ? QString() : QObject::tr(" (not independently confirmed)"));
    if (p.substance.sources.empty()) html += QObject::tr("<li>no sources recorded</li>");
    html += QStringLiteral("</ul>");
    QMessageBox box(parent);
    box.setWindowTitle(QObject::tr("About Heatchain"));
    box.setIconPixmap(view::appIcon().pixmap(64, 64));
    box.setTextFormat(Qt::RichText);
    box.setText(html);
    box.exec();
}

}  // namespace heatchain::gui::help
