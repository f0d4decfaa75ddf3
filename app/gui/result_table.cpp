#include "result_table.hpp"

#include <QApplication>
#include <QClipboard>
#include <QContextMenuEvent>
#include <QMenu>
#include <QPainter>

namespace heatchain::gui {

namespace {
constexpr int kGap = 10, kRuleH = 9;
}

ResultTable::ResultTable(QWidget* parent) : QWidget(parent) {
    setSizePolicy(QSizePolicy::Preferred, QSizePolicy::Fixed);
}

void ResultTable::setRows(QVector<Row> rows) {
    if (rows.size() == rows_.size()) {
        bool same = true;
        for (qsizetype i = 0; i < rows.size() && same; ++i)
            same = rows[i].name == rows_[i].name && rows[i].a == rows_[i].a && rows[i].b == rows_[i].b &&
                   rows[i].rule == rows_[i].rule && rows[i].header == rows_[i].header;
        if (same) return;
    }
    rows_ = std::move(rows);
    const QFontMetrics fm(font());
    int nw = 0, aw = 0, bw = 0, h = 0;
    for (const Row& r : rows_) {
        if (r.rule) {
            h += kRuleH;
            continue;
        }
        nw = std::max(nw, fm.horizontalAdvance(r.name));
        aw = std::max(aw, fm.horizontalAdvance(r.a));
        bw = std::max(bw, fm.horizontalAdvance(r.b));
        h += fm.height() + 2;
    }
    // Only a change of size asks the dock for a new layout.
    const QSize hint(nw + kGap + aw + (bw > 0 ? kGap + bw : 0) + 4, h + 2);
    nameW_ = nw;
    aW_ = aw;
    bW_ = bw;
    if (hint != hint_) {
        hint_ = hint;
        updateGeometry();
    }
    update();
}

QString ResultTable::text() const {
    QStringList lines;
    for (const Row& r : rows_)
        if (!r.rule) lines << QStringList{r.name, r.a, r.b}.join(QLatin1Char('\t')).trimmed();
    return lines.join(QLatin1Char('\n'));
}

void ResultTable::paintEvent(QPaintEvent*) {
    QPainter p(this);
    const QFontMetrics fm(font());
    QFont italic = font();
    italic.setItalic(true);
    const int xa = nameW_ + kGap, xb = xa + aW_ + kGap;
    int y = 1;
    const QColor muted(0x55, 0x55, 0x55), ink = palette().color(QPalette::WindowText);
    for (const Row& r : rows_) {
        if (r.rule) {
            p.setPen(QColor(0xc9, 0xce, 0xd4));
            p.drawLine(0, y + kRuleH / 2, width() - 1, y + kRuleH / 2);
            y += kRuleH;
            continue;
        }
        const int h = fm.height() + 2;
        p.setFont(font());
        p.setPen(muted);
        p.drawText(QRect(0, y, nameW_, h), Qt::AlignLeft | Qt::AlignVCenter, r.name);
        p.setFont(r.header ? italic : font());
        p.setPen(ink);
        p.drawText(QRect(xa, y, aW_, h), Qt::AlignRight | Qt::AlignVCenter, r.a);
        if (bW_ > 0) p.drawText(QRect(xb, y, bW_, h), Qt::AlignRight | Qt::AlignVCenter, r.b);
        y += h;
    }
}

void ResultTable::contextMenuEvent(QContextMenuEvent* e) {
    QMenu menu(this);
    menu.addAction(tr("Copy"), this, [this] { QApplication::clipboard()->setText(text()); });
    menu.exec(e->globalPos());
}

}  // namespace heatchain::gui
