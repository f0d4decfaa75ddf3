#include "report_layout.hpp"

#include <QFontMetricsF>
#include <QTextLayout>
#include <algorithm>
#include <cmath>

#include "heatchain_view/palette.hpp"

namespace heatchain::report_detail {

namespace {
const QString kFamily = QStringLiteral("DejaVu Sans");
const QString kMonoFamily = QStringLiteral("DejaVu Sans Mono");

// No ligatures: text copied or searched in the PDF must read "qualified",
// not "quali\uFB01ed" (Latin text needs no shaping).
QFont plain(const QString& family) {
    QFont f(family);
    f.setStyleStrategy(QFont::PreferNoShaping);
    return f;
}
}  // namespace

Layout::Layout(QPdfWriter& writer, QPainter& painter, bool dry, int totalPages, Furniture furn)
    : writer_(writer), p_(painter), dry_(dry), total_(totalPages), furn_(std::move(furn)) {
    dpi_ = writer_.resolution();
    page_rect_ = QRectF(0, 0, writer_.width(), writer_.height());
    // Margins: wide enough for binding and for the header and footer lines.
    body_ = page_rect_.adjusted(mm(18), mm(22), -mm(18), -mm(18));
    y_ = body_.top();
    furniture();
}

QFont Layout::font(double points, bool bold, bool italic) const {
    QFont f = plain(kFamily);
    f.setPointSizeF(points);
    f.setBold(bold);
    f.setItalic(italic);
    return f;
}

QFont Layout::mono(double points) const {
    QFont f = plain(kMonoFamily);
    f.setStyleHint(QFont::Monospace);
    f.setPointSizeF(points);
    return f;
}

void Layout::furniture() {
    if (dry_) return;
    p_.save();
    const QFont f = font(7.5);
    const QFontMetricsF fm(f, &writer_);
    p_.setFont(f);
    p_.setPen(view::ink::muted());
    const double top = mm(10);
    const QString rev = furn_.revision.isEmpty() ? QString() : QStringLiteral("Revision %1").arg(furn_.revision);
    const double revW = fm.horizontalAdvance(rev) + mm(4);
    p_.drawText(QRectF(body_.left(), top, body_.width() - revW, fm.height()), Qt::AlignLeft | Qt::AlignVCenter,
                fm.elidedText(furn_.title, Qt::ElideRight, body_.width() - revW));
    p_.drawText(QRectF(body_.left(), top, body_.width(), fm.height()), Qt::AlignRight | Qt::AlignVCenter, rev);
    p_.setPen(QPen(rink::accent(), pt(0.8)));
    const double ruleY = top + fm.height() + mm(1.5);
    p_.drawLine(QPointF(body_.left(), ruleY), QPointF(body_.right(), ruleY));

    const double foot = page_rect_.bottom() - mm(12);
    p_.setPen(QPen(rink::rule(), pt(0.5)));
    p_.drawLine(QPointF(body_.left(), foot), QPointF(body_.right(), foot));
    p_.setPen(view::ink::muted());
    const QString pageText = QStringLiteral("Page %1 of %2").arg(page_).arg(total_);
    const double pw = fm.horizontalAdvance(pageText) + mm(4);
    p_.drawText(QRectF(body_.left(), foot + mm(1.5), body_.width() - pw, fm.height()),
                Qt::AlignLeft | Qt::AlignVCenter,
                fm.elidedText(furn_.footerLeft, Qt::ElideMiddle, body_.width() - pw));
    p_.drawText(QRectF(body_.left(), foot + mm(1.5), body_.width(), fm.height()),
                Qt::AlignRight | Qt::AlignVCenter, pageText);
    p_.restore();
}

void Layout::newPage() {
    if (!dry_) writer_.newPage();
    ++page_;
    y_ = body_.top();
    furniture();
}

void Layout::need(double h) {
    // A block taller than a whole page starts on a fresh page and flows on.
    if (y_ + h > body_.bottom() && y_ > body_.top() + 1) newPage();
}

double Layout::textHeight(const QString& text, const QFont& f, double w, int flags) const {
    const QFontMetricsF fm(f, &writer_);
    if (text.isEmpty()) return fm.height();
    return fm.boundingRect(QRectF(0, 0, w, 1e9), flags, text).height();
}

void Layout::paragraph(const QString& text, const QFont& f, const QColor& colour, double indent, double after) {
    const double w = body_.width() - indent;
    const QFontMetricsF fm(f, &writer_);
    const double leading = fm.height() * 0.18;
    for (const QString& para : text.split(QLatin1Char('\n'))) {
        QTextLayout tl(para, f, &writer_);
        tl.beginLayout();
        std::vector<std::pair<int, int>> lines;
        for (int guard = 0; guard < 100000; ++guard) {
            QTextLine line = tl.createLine();
            if (!line.isValid()) break;
            line.setLineWidth(w);
            lines.emplace_back(line.textStart(), line.textLength());
        }
        tl.endLayout();
        if (lines.empty()) lines.emplace_back(0, 0);
        for (auto [start, len] : lines) {
            need(fm.height());
            if (!dry_) {
                p_.setFont(f);
                p_.setPen(colour);
                p_.drawText(QPointF(body_.left() + indent, y_ + fm.ascent()), para.mid(start, len).trimmed());
            }
            y_ += fm.height() + leading;
        }
    }
    y_ += after >= 0 ? after : mm(1.5);
}

void Layout::heading(const QString& numberIn, const QString& text, double keepWithNext) {
    const QString number = numberIn.isEmpty() ? numberIn : sectionPrefix_ + numberIn;
    const QFont f = font(12, true);
    const QFontMetricsF fm(f, &writer_);
    need(mm(4) + fm.height() + mm(3) + keepWithNext);
    if (y_ > body_.top() + 1) y_ += mm(4);
    if (!dry_) {
        p_.setFont(f);
        p_.setPen(rink::accent());
        const double numW = number.isEmpty() ? 0 : fm.horizontalAdvance(number) + mm(3);
        if (!number.isEmpty()) p_.drawText(QPointF(body_.left(), y_ + fm.ascent()), number);
        p_.setPen(view::ink::text());
        p_.drawText(QPointF(body_.left() + numW, y_ + fm.ascent()), text);
        p_.setPen(QPen(rink::accent(), pt(0.6)));
        p_.drawLine(QPointF(body_.left(), y_ + fm.height() + mm(0.8)),
                    QPointF(body_.right(), y_ + fm.height() + mm(0.8)));
    }
    y_ += fm.height() + mm(3);
}

void Layout::subheading(const QString& text, double keepWithNext) {
    const QFont f = font(9.5, true);
    const QFontMetricsF fm(f, &writer_);
    need(mm(2) + fm.height() + mm(1.5) + keepWithNext);
    if (y_ > body_.top() + 1) y_ += mm(2);
    if (!dry_) {
        p_.setFont(f);
        p_.setPen(rink::accent());
        p_.drawText(QPointF(body_.left(), y_ + fm.ascent()), text);
    }
    y_ += fm.height() + mm(1.5);
}

void Layout::keyValues(const std::vector<std::pair<QString, QString>>& rows, double keyWidth,
                       const QFont& valueFont, const QFont* monoFor, int monoRow) {
    const QFont keyFont = font(valueFont.pointSizeF() - 0.5);
    const int flags = Qt::TextWordWrap | Qt::AlignLeft | Qt::AlignTop;
    const double vw = body_.width() - keyWidth;
    for (std::size_t i = 0; i < rows.size(); ++i) {
        const QFont& vf = (monoFor && int(i) == monoRow) ? *monoFor : valueFont;
        int vflags = flags;
        // A long token with no break point (a checksum, a path) may break anywhere.
        const QFontMetricsF vfm(vf, &writer_);
        for (const QString& word : rows[i].second.split(QLatin1Char(' ')))
            if (vfm.horizontalAdvance(word) > vw) vflags = Qt::TextWrapAnywhere | Qt::AlignLeft | Qt::AlignTop;
        const double h = std::max(textHeight(rows[i].first, keyFont, keyWidth - mm(2), flags),
                                  textHeight(rows[i].second, vf, vw, vflags)) + mm(1.2);
        need(h);
        if (!dry_) {
            p_.setFont(keyFont);
            p_.setPen(view::ink::muted());
            p_.drawText(QRectF(body_.left(), y_, keyWidth - mm(2), h), flags, rows[i].first);
            p_.setFont(vf);
            p_.setPen(view::ink::text());
            p_.drawText(QRectF(body_.left() + keyWidth, y_, vw, h), vflags, rows[i].second);
        }
        y_ += h;
    }
    y_ += mm(1.5);
}

void Layout::drawHeader(const std::vector<TableColumn>& cols, const std::vector<double>& xs,
                        const std::vector<double>& ws, double fontPt, double h) {
    if (dry_) {
        y_ += h;
        return;
    }
    const QFont hf = font(fontPt, true), uf = font(fontPt - 0.5);
    const QFontMetricsF hfm(hf, &writer_);
    const double pad = mm(1);
    p_.fillRect(QRectF(body_.left(), y_, body_.width(), h), rink::band());
    for (std::size_t c = 0; c < cols.size(); ++c) {
        const QRectF cell(xs[c] + pad, y_ + pad, ws[c] - 2 * pad, h - 2 * pad);
        const int hal = int(cols[c].align & Qt::AlignHorizontal_Mask);
        p_.setFont(hf);
        p_.setPen(view::ink::text());
        const QRectF titleBox = p_.boundingRect(cell, hal | Qt::AlignTop | Qt::TextWordWrap, cols[c].title);
        p_.drawText(cell, hal | Qt::AlignTop | Qt::TextWordWrap, cols[c].title);
        if (!cols[c].unit.isEmpty()) {
            p_.setFont(uf);
            p_.setPen(view::ink::muted());
            p_.drawText(QRectF(cell.left(), titleBox.bottom(), cell.width(), hfm.height()), hal | Qt::AlignTop,
                        cols[c].unit);
        }
    }
    p_.setPen(QPen(rink::accent(), pt(0.6)));
    p_.drawLine(QPointF(body_.left(), y_ + h), QPointF(body_.right(), y_ + h));
    y_ += h;
}

void Layout::table(const std::vector<TableColumn>& cols, const std::vector<TableRow>& rows, double fontPt,
                   const QString& continuedCaption) {
    const double pad = mm(1);
    double total = 0;
    for (const auto& c : cols) total += c.weight;
    std::vector<double> xs, ws;
    double x = body_.left();
    for (const auto& c : cols) {
        xs.push_back(x);
        ws.push_back(body_.width() * c.weight / total);
        x += ws.back();
    }
    const QFont f = font(fontPt), bf = font(fontPt, true), sf = font(fontPt - 0.5, false, true);
    const QFont hf = font(fontPt, true), uf = font(fontPt - 0.5);
    const QFontMetricsF ufm(uf, &writer_);
    const bool markers = std::any_of(rows.begin(), rows.end(), [](const TableRow& r) { return r.marker.isValid(); });
    const double markerW = markers ? mm(3) : 0;

    // No word is broken: every column gets at least the width of its widest
    // unbreakable piece (a whole number in a right-aligned column; a word, or
    // the part of a hyphenated word up to its hyphen, elsewhere), taken from
    // the columns that have room to spare.
    auto pieces = [](const QString& text, bool whole) {
        if (whole) return QStringList{text};
        QStringList out;
        for (const QString& word : text.split(QLatin1Char(' '), Qt::SkipEmptyParts)) {
            qsizetype from = 0;
            for (qsizetype i = 0; i < word.size(); ++i)
                if (word[i] == QLatin1Char('-') || word[i] == QLatin1Char('/')) {
                    out << word.mid(from, i - from + 1);
                    from = i + 1;
                }
            if (from < word.size()) out << word.mid(from);
        }
        return out;
    };
    {
        const QFontMetricsF fm(f, &writer_), bfm(bf, &writer_), hfm(hf, &writer_);
        std::vector<double> minW(cols.size(), 0.0);
        for (std::size_t c = 0; c < cols.size(); ++c) {
            const bool number = (cols[c].align & Qt::AlignRight) != 0;
            double needW = 0;
            for (const TableRow& r : rows)
                if (c < std::size_t(r.cells.size()))
                    for (const QString& piece : pieces(r.cells[int(c)], number))
                        needW = std::max(needW, (r.style == TableRow::Style::Total ? bfm : fm).horizontalAdvance(piece));
            for (const QString& piece : pieces(cols[c].title, false))
                needW = std::max(needW, hfm.horizontalAdvance(piece));
            minW[c] = needW + 2 * pad + (c == 0 ? markerW : 0) + mm(0.3);
        }
        double extra = 0, spare = 0;
        for (std::size_t c = 0; c < cols.size(); ++c) {
            if (minW[c] > ws[c]) extra += minW[c] - ws[c];
            else spare += ws[c] - minW[c];
        }
        if (extra > 0 && spare > 0) {
            const double k = std::min(1.0, extra / spare);
            for (std::size_t c = 0; c < cols.size(); ++c) {
                if (minW[c] > ws[c]) ws[c] = minW[c];
                else ws[c] -= (ws[c] - minW[c]) * k;
            }
        }
        double xx = body_.left();
        for (std::size_t c = 0; c < cols.size(); ++c) {
            xs[c] = xx;
            xx += ws[c];
        }
    }

    double headerH = 0;
    bool anyUnit = false;
    for (std::size_t c = 0; c < cols.size(); ++c) {
        headerH = std::max(headerH, textHeight(cols[c].title, hf, ws[c] - 2 * pad, Qt::TextWordWrap));
        anyUnit = anyUnit || !cols[c].unit.isEmpty();
    }
    double maxTitle = 0;
    for (std::size_t c = 0; c < cols.size(); ++c)
        maxTitle = std::max(maxTitle, textHeight(cols[c].title, hf, ws[c] - 2 * pad, Qt::TextWordWrap));
    headerH = maxTitle + (anyUnit ? ufm.height() : 0) + 2 * pad;

    auto cellFlags = [&](const QString& text, const QFont& cf, double w, Qt::Alignment al) {
        const QFontMetricsF fm(cf, &writer_);
        int fl = int(al & Qt::AlignHorizontal_Mask) | Qt::AlignTop | Qt::TextWordWrap;
        // Only a piece wider than the whole page's share may still be cut.
        for (const QString& piece : pieces(text, false))
            if (fm.horizontalAdvance(piece) > w + 0.5) fl = int(al & Qt::AlignHorizontal_Mask) | Qt::AlignTop | Qt::TextWrapAnywhere;
        return fl;
    };
    auto rowFont = [&](const TableRow& r) -> const QFont& {
        return r.style == TableRow::Style::Total ? bf : r.style == TableRow::Style::Subtle ? sf : f;
    };
    auto rowHeight = [&](const TableRow& r) {
        double h = 0;
        for (std::size_t c = 0; c < cols.size() && c < std::size_t(r.cells.size()); ++c) {
            const double w = ws[c] - 2 * pad - (c == 0 ? markerW : 0);
            h = std::max(h, textHeight(r.cells[c], rowFont(r), w, cellFlags(r.cells[c], rowFont(r), w, cols[c].align)));
        }
        return h + 2 * pad;
    };

    // Keep the header with at least its first row.
    need(headerH + (rows.empty() ? 0 : rowHeight(rows.front())));
    drawHeader(cols, xs, ws, fontPt, headerH);
    int band = 0;
    for (const TableRow& r : rows) {
        const double h = rowHeight(r);
        if (y_ + h > body_.bottom()) {
            newPage();
            if (!continuedCaption.isEmpty()) {
                const QFont cf = font(7.5, false, true);
                const QFontMetricsF cfm(cf, &writer_);
                if (!dry_) {
                    p_.setFont(cf);
                    p_.setPen(view::ink::muted());
                    p_.drawText(QPointF(body_.left(), y_ + cfm.ascent()), continuedCaption);
                }
                y_ += cfm.height() + mm(1);
            }
            drawHeader(cols, xs, ws, fontPt, headerH);
            band = 0;
        }
        if (!dry_) {
            if (r.style == TableRow::Style::Total) {
                p_.setPen(QPen(view::ink::text(), pt(0.6)));
                p_.drawLine(QPointF(body_.left(), y_), QPointF(body_.right(), y_));
            } else if (band % 2 == 1) {
                p_.fillRect(QRectF(body_.left(), y_, body_.width(), h), rink::zebra());
            }
            p_.setFont(rowFont(r));
            p_.setPen(r.style == TableRow::Style::Subtle ? view::ink::muted() : view::ink::text());
            for (std::size_t c = 0; c < cols.size() && c < std::size_t(r.cells.size()); ++c) {
                const double off = c == 0 ? markerW : 0;
                const QRectF cell(xs[c] + pad + off, y_ + pad, ws[c] - 2 * pad - off, h - 2 * pad);
                p_.drawText(cell, cellFlags(r.cells[c], rowFont(r), cell.width(), cols[c].align), r.cells[c]);
            }
            if (r.marker.isValid()) {
                const QFontMetricsF fm(rowFont(r), &writer_);
                const double s = mm(2);
                p_.fillRect(QRectF(xs[0] + pad, y_ + pad + (fm.height() - s) / 2, s, s), r.marker);
            }
        }
        if (r.style != TableRow::Style::Subtle) ++band;
        y_ += h;
    }
    if (!dry_) {
        p_.setPen(QPen(rink::rule(), pt(0.5)));
        p_.drawLine(QPointF(body_.left(), y_), QPointF(body_.right(), y_));
    }
    y_ += mm(2.5);
}

void Layout::box(const QString& title, const QStringList& lines, const QColor& face, const QColor& edge) {
    const double pad = mm(3);
    const QFont tf = font(9.5, true), f = font(8.5);
    const QFontMetricsF tfm(tf, &writer_), fm(f, &writer_);
    const double bullet = mm(4);
    const double w = body_.width() - 2 * pad - bullet;
    const int flags = Qt::TextWordWrap | Qt::AlignLeft | Qt::AlignTop;
    std::vector<double> hs;
    double h = pad + tfm.height() + mm(1.5);
    for (const QString& l : lines) {
        hs.push_back(textHeight(l, f, w, flags) + mm(1.2));
        h += hs.back();
    }
    h += pad - mm(1.2);
    need(h);
    if (!dry_) {
        p_.setPen(QPen(edge, pt(0.8)));
        p_.setBrush(face);
        p_.drawRect(QRectF(body_.left(), y_, body_.width(), h));
        p_.fillRect(QRectF(body_.left(), y_, mm(1.4), h), edge);
        p_.setBrush(Qt::NoBrush);
        p_.setFont(tf);
        p_.setPen(view::ink::text());
        p_.drawText(QPointF(body_.left() + pad, y_ + pad + tfm.ascent()), title);
        double yy = y_ + pad + tfm.height() + mm(1.5);
        p_.setFont(f);
        for (std::size_t i = 0; i < std::size_t(lines.size()); ++i) {
            p_.drawText(QPointF(body_.left() + pad, yy + fm.ascent()), QStringLiteral("•"));
            p_.drawText(QRectF(body_.left() + pad + bullet, yy, w, hs[i]), flags, lines[int(i)]);
            yy += hs[i];
        }
    }
    y_ += h + mm(3);
}

void Layout::figure(double h, const std::function<void(QPainter&, const QRectF&)>& draw) {
    need(h);
    if (!dry_) {
        p_.save();
        draw(p_, QRectF(body_.left(), y_, body_.width(), h));
        p_.restore();
    }
    y_ += h;
}

// ---- Chart figure ------------------------------------------------------

namespace {

struct LegendEntry {
    QColor colour;
    QString text;
};

// One entry per step; long sequences (the palette repeats every 10 steps)
// get one entry per colour listing the steps that share it.
std::vector<LegendEntry> legendEntries(const SequenceResult& r) {
    std::vector<LegendEntry> out;
    const int n = int(r.steps.size());
    if (n <= 30) {
        for (int i = 0; i < n; ++i)
            out.push_back({view::stepColour(i), QStringLiteral("%1 %2").arg(i + 1).arg(QString::fromStdString(r.steps[std::size_t(i)].id))});
        return out;
    }
    for (int k = 0; k < 10 && k < n; ++k) {
        QStringList nums;
        for (int i = k; i < n && nums.size() < 3; i += 10) nums << QString::number(i + 1);
        out.push_back({view::stepColour(k), QStringLiteral("steps %1, …").arg(nums.join(QStringLiteral(", ")))});
    }
    return out;
}

QFont chartFont() {
    QFont f = plain(kFamily);
    f.setPixelSize(11);
    return f;
}

// Lays the legend out in rows across `width`; draws when `p` is given.
double layoutLegend(const std::vector<LegendEntry>& entries, double width, QPainter* p, double top) {
    const QFont f = chartFont();
    const QFontMetricsF fm(f);
    const double rowH = fm.height() + 4, left = 62, swatch = 16, gap = 14;
    double x = left, y = top + 4;
    if (p) p->setFont(f);
    for (const LegendEntry& e : entries) {
        const double w = swatch + 4 + fm.horizontalAdvance(e.text) + gap;
        if (x + w > width - 8 && x > left) {
            x = left;
            y += rowH;
        }
        if (p) {
            p->setPen(QPen(e.colour, 2.4));
            p->drawLine(QPointF(x, y + rowH / 2), QPointF(x + swatch, y + rowH / 2));
            p->setPen(view::ink::text());
            p->drawText(QRectF(x + swatch + 4, y, w, rowH), Qt::AlignLeft | Qt::AlignVCenter, e.text);
        }
        x += w;
    }
    return entries.empty() ? 0 : y + rowH + 4 - top;
}

}  // namespace

double legendHeight(const SequenceResult& result, double logicalWidth) {
    return layoutLegend(legendEntries(result), logicalWidth, nullptr, 0);
}

void paintChartFigure(QPainter& p, const QRectF& rect, const view::ProcessChart& chart,
                      const SequenceResult& result, double logicalWidth, bool legend) {
    const double scale = rect.width() / logicalWidth;
    const double logicalHeight = rect.height() / scale;
    const double lh = legend ? legendHeight(result, logicalWidth) : 0;
    p.save();
    p.translate(rect.topLeft());
    p.scale(scale, scale);
    p.fillRect(QRectF(0, 0, logicalWidth, logicalHeight), Qt::white);
    p.setFont(chartFont());
    chart.paint(p, QRectF(0, 0, logicalWidth, logicalHeight - lh));
    if (legend) layoutLegend(legendEntries(result), logicalWidth, &p, logicalHeight - lh);
    p.restore();
}

void paintScaledFigure(QPainter& p, const QRectF& rect, double logicalWidth,
                       const std::function<void(QPainter&, const QRectF&)>& draw) {
    const double scale = rect.width() / logicalWidth;
    p.save();
    p.translate(rect.topLeft());
    p.scale(scale, scale);
    p.setFont(chartFont());
    draw(p, QRectF(0, 0, logicalWidth, rect.height() / scale));
    p.restore();
}

}  // namespace heatchain::report_detail
