#include "messages_panel.hpp"

#include <QHeaderView>

#include "heatchain_view/caution_text.hpp"
#include "heatchain_view/format.hpp"

namespace heatchain::gui {

namespace {
using heatchain::view::qs;
QColor levelColour(MessagesPanel::Level l) {
    switch (l) {
    case MessagesPanel::Level::Error: return {0xb4, 0x23, 0x18};
    case MessagesPanel::Level::Warning: return {0x8a, 0x5a, 0x00};
    case MessagesPanel::Level::Note: return {0x6b, 0x72, 0x7a};
    case MessagesPanel::Level::Caution: return {0x8a, 0x3a, 0x00};
    }
    return {};
}
}  // namespace

QString MessagesPanel::levelName(Level l) {
    switch (l) {
    case Level::Error: return tr("error");
    case Level::Warning: return tr("warning");
    case Level::Note: return tr("note");
    case Level::Caution: return tr("caution");
    }
    return {};
}

MessagesPanel::MessagesPanel(ProjectDocument* doc, QWidget* parent) : QTreeWidget(parent), doc_(doc) {
    setColumnCount(3);
    setHeaderLabels({tr("Level"), tr("Step"), tr("Message")});
    setRootIsDecorated(false);
    setUniformRowHeights(true);
    setWordWrap(false);
    header()->setStretchLastSection(true);
    header()->resizeSection(0, 80);
    header()->resizeSection(1, 150);
    connect(doc_, &ProjectDocument::changed, this, &MessagesPanel::refresh);
    connect(this, &QTreeWidget::itemClicked, this, [this](QTreeWidgetItem* item) {
        const int step = item->data(0, Qt::UserRole).toInt();
        doc_->setSelectedStep(step);
    });
    refresh();
}

void MessagesPanel::refresh() {
    struct Line {
        Level level;
        int step;
        QString where, text;
    };
    std::vector<Line> lines;
    const SequenceResult& r = doc_->result();
    // The substance's hazards first: a standing caution, not a warning.
    if (const std::string hz = hazardSentence(doc_->project().substance); !hz.empty())
        lines.push_back({Level::Caution, -1, tr("substance"), qs(hz)});
    // Then what the process reaches: cryogenic, hot, under pressure.
    for (const QString& c : view::processCautionText(doc_->project(), processCautions(doc_->project(), r)))
        lines.push_back({Level::Caution, -1, tr("sequence"), c});
    if (r.startError) lines.push_back({Level::Error, -1, tr("start"), view::escapedText(r.startError->text())});
    for (const std::string& w : r.warnings) lines.push_back({Level::Warning, -1, tr("sequence"), qs(w)});
    for (const std::string& n : view::notesOf(r)) lines.push_back({Level::Note, -1, tr("sequence"), qs(n)});
    for (std::size_t i = 0; i < r.steps.size(); ++i) {
        const StepResult& s = r.steps[i];
        const QString where = QStringLiteral("%1  %2").arg(i + 1).arg(qs(s.id));
        if (s.error) lines.push_back({Level::Error, int(i), where, qs(s.error->message)});
        for (const std::string& w : s.warnings) lines.push_back({Level::Warning, int(i), where, qs(w)});
        for (const std::string& n : view::notesOf(s)) lines.push_back({Level::Note, int(i), where, qs(n)});
    }
    // Most edits leave the messages as they were: compare before rebuilding
    // (a rebuilt tree repaints, every keystroke).
    QStringList now;
    for (const Line& l : lines) now << QStringLiteral("%1|%2|%3").arg(int(l.level)).arg(l.where, l.text);
    if (now == lines_ && topLevelItemCount() > 0) return;
    lines_ = now;
    clear();
    counts_ = {};
    for (const Line& l : lines) {
        auto* it = new QTreeWidgetItem(this, {levelName(l.level), l.where, l.text});
        it->setData(0, Qt::UserRole, l.step);
        it->setData(1, Qt::UserRole, int(l.level));
        it->setToolTip(2, l.text);
        it->setForeground(0, levelColour(l.level));
        if (l.level == Level::Note) it->setForeground(2, levelColour(Level::Note));
        if (l.level == Level::Error || l.level == Level::Warning) {
            QFont f = it->font(0);
            f.setBold(true);
            it->setFont(0, f);
        }
        ++counts_[std::size_t(l.level)];
    }
    if (counts_[0] == 0 && counts_[1] == 0) {
        auto* it = new QTreeWidgetItem(this, {tr("ok"), QString(), tr("No errors or warnings.")});
        it->setData(0, Qt::UserRole, -1);
        it->setData(1, Qt::UserRole, -1);
        it->setForeground(0, QColor(0x2e, 0x7d, 0x32));
    }
    applyFilter();
    emit countsChanged(counts_[0], counts_[1]);
}

void MessagesPanel::setLevelShown(Level l, bool shown) {
    if (shown_[std::size_t(l)] == shown) return;
    shown_[std::size_t(l)] = shown;
    applyFilter();
}

void MessagesPanel::applyFilter() {
    for (int i = 0; i < topLevelItemCount(); ++i) {
        QTreeWidgetItem* it = topLevelItem(i);
        const int level = it->data(1, Qt::UserRole).toInt();
        it->setHidden(level >= 0 && !shown_[std::size_t(level)]);
    }
}

QStringList MessagesPanel::visibleLines() const {
    QStringList out;
    for (int i = 0; i < topLevelItemCount(); ++i) {
        const QTreeWidgetItem* it = topLevelItem(i);
        if (!it->isHidden()) out << QStringLiteral("%1|%2|%3").arg(it->text(0), it->text(1), it->text(2));
    }
    return out;
}

}  // namespace heatchain::gui
