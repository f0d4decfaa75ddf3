#pragma once
// A small flowing page layout for the report: a cursor that moves down the
// page, paragraphs broken into lines, key–value grids and tables that break
// across pages with their header repeated, and the page furniture (header
// with title and revision, footer with the page number) on every page.
//
// The document is laid out twice: a dry pass that only measures and counts
// pages (so the footer can say "page n of N"), then the drawing pass. Every
// drawing call goes through this class, which skips it in the dry pass.
#include <QColor>
#include <QFont>
#include <QPainter>
#include <QPdfWriter>
#include <QString>
#include <QStringList>
#include <functional>
#include <vector>

#include "heatchain/project.hpp"
#include "heatchain/solver.hpp"
#include "heatchain_view/exergy_chart.hpp"
#include "heatchain_view/process_chart.hpp"

namespace heatchain::report_detail {

// Report inks: our own, chosen for a white page and black-and-white copies.
namespace rink {
inline QColor accent() { return QColor(0x1b, 0x4d, 0x5c); }       // headings, rules
inline QColor band() { return QColor(0xe8, 0xee, 0xf0); }         // table header band
inline QColor zebra() { return QColor(0xf6, 0xf8, 0xf9); }        // alternate rows
inline QColor rule() { return QColor(0xb9, 0xc3, 0xc8); }
inline QColor cautionFace() { return QColor(0xfd, 0xf6, 0xe3); }
inline QColor cautionEdge() { return QColor(0xc9, 0x8a, 0x00); }
}  // namespace rink

struct TableColumn {
    QString title;
    QString unit;       // second header line, may be empty
    double weight = 1;  // share of the table width
    Qt::Alignment align = Qt::AlignLeft;
};

struct TableRow {
    enum class Style { Normal, Subtle, Total };
    QStringList cells;
    Style style = Style::Normal;
    QColor marker;  // optional colour swatch in the first cell
};

class Layout {
public:
    struct Furniture {
        QString title, revision, footerLeft;
    };

    Layout(QPdfWriter& writer, QPainter& painter, bool dry, int totalPages, Furniture furniture);

    // Lengths in device units.
    double mm(double v) const { return v * dpi_ / 25.4; }
    double pt(double v) const { return v * dpi_ / 72.0; }

    QFont font(double points, bool bold = false, bool italic = false) const;
    QFont mono(double points) const;

    double width() const { return body_.width(); }
    double left() const { return body_.left(); }
    double y() const { return y_; }
    double remaining() const { return body_.bottom() - y_; }
    int page() const { return page_; }

    void newPage();
    // Starts a new page unless `h` still fits below the cursor.
    void need(double h);
    void space(double h) { y_ += h; }

    // Wrapped text, broken across pages line by line.
    void paragraph(const QString& text, const QFont& f, const QColor& colour, double indent = 0,
                   double after = -1);
    void heading(const QString& number, const QString& text, double keepWithNext);
    // Put before every heading's number ("3." makes section 2 "3.2"): a
    // stream's sections in the report of several streams.
    void setSectionPrefix(const QString& prefix) { sectionPrefix_ = prefix; }
    const QString& sectionPrefix() const { return sectionPrefix_; }
    void subheading(const QString& text, double keepWithNext);
    // A two-column grid of labels and values; value text wraps.
    void keyValues(const std::vector<std::pair<QString, QString>>& rows, double keyWidth,
                   const QFont& valueFont, const QFont* monoFor = nullptr, int monoRow = -1);
    // A table that breaks across pages with its header repeated.
    void table(const std::vector<TableColumn>& cols, const std::vector<TableRow>& rows, double fontPt,
               const QString& continuedCaption = {});
    // A boxed note (the cautions): a title and bullet lines.
    void box(const QString& title, const QStringList& lines, const QColor& face, const QColor& edge);
    // Reserves `h` and calls draw(painter, rect) in the drawing pass.
    void figure(double h, const std::function<void(QPainter&, const QRectF&)>& draw);

private:
    void furniture();
    double textHeight(const QString& text, const QFont& f, double w, int flags) const;
    void drawHeader(const std::vector<TableColumn>& cols, const std::vector<double>& xs,
                    const std::vector<double>& ws, double fontPt, double h);

    QPdfWriter& writer_;
    QPainter& p_;
    bool dry_;
    int total_;
    Furniture furn_;
    double dpi_;
    QRectF page_rect_, body_;
    double y_ = 0;
    int page_ = 1;
    QString sectionPrefix_;
};

// The chart with the report's fonts and a legend of step colours below it,
// into `rect` (device units of any painter). `logicalWidth` is the width in
// chart pixels the chart is laid out for; the drawing scales it to `rect`.
void paintChartFigure(QPainter& p, const QRectF& rect, const view::ProcessChart& chart,
                      const SequenceResult& result, double logicalWidth, bool legend);
// Height of the legend strip, as a share of the logical chart layout.
// A bar chart (exergy destroyed, contributions to the uncertainty) drawn by
// `draw` at `logicalWidth` with the report's chart font, scaled into `rect`.
void paintScaledFigure(QPainter& p, const QRectF& rect, double logicalWidth,
                       const std::function<void(QPainter&, const QRectF&)>& draw);
double legendHeight(const SequenceResult& result, double logicalWidth);

}  // namespace heatchain::report_detail
