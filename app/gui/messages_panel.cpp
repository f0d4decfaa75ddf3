#include "messages_panel.hpp"

#include <QHeaderView>

namespace heatchain::gui {

MessagesPanel::MessagesPanel(ProjectDocument* doc, QWidget* parent) : QTreeWidget(parent), doc_(doc) {
    setColumnCount(3);
    setHeaderLabels({tr("Severity"), tr("Step"), tr("Message")});
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
    // Most edits leave the messages as they were: compare before rebuilding
    // (a rebuilt tree repaints, every keystroke).
    QStringList now;
    {
        const SequenceResult& r = doc_->result();
        now << QString::fromStdString(hazardSentence(doc_->project().substance));
        if (r.startError) now << QString::fromStdString(r.startError->text());
        for (const std::string& w : r.warnings) now << QString::fromStdString(w);
        for (std::size_t i = 0; i < r.steps.size(); ++i) {
            const StepResult& s = r.steps[i];
            const QString where = QStringLiteral("%1  %2|").arg(i + 1).arg(QString::fromStdString(s.id));
            if (s.error) now << where + QString::fromStdString(s.error->message);
            for (const std::string& w : s.warnings) now << where + QString::fromStdString(w);
        }
    }
    if (now == shown_ && topLevelItemCount() > 0) return;
    shown_ = now;
    clear();
    errors_ = warnings_ = 0;
    const SequenceResult& r = doc_->result();
    auto add = [this](const QString& sev, int step, const QString& where, const QString& msg) {
        auto* it = new QTreeWidgetItem(this, {sev, where, msg});
        it->setData(0, Qt::UserRole, step);
        it->setToolTip(2, msg);
        const QColor c = sev == tr("error") ? QColor(0xb4, 0x23, 0x18) : QColor(0x8a, 0x5a, 0x00);
        it->setForeground(0, c);
    };
    // The substance's hazards first: a standing caution, not a warning count.
    if (const std::string hz = hazardSentence(doc_->project().substance); !hz.empty())
        add(tr("caution"), -1, tr("substance"), QString::fromStdString(hz));
    if (r.startError) {
        add(tr("error"), -1, tr("start"), QString::fromStdString(r.startError->text()));
        ++errors_;
    }
    for (const std::string& w : r.warnings) {
        add(tr("warning"), -1, tr("sequence"), QString::fromStdString(w));
        ++warnings_;
    }
    for (std::size_t i = 0; i < r.steps.size(); ++i) {
        const StepResult& s = r.steps[i];
        const QString where = QStringLiteral("%1  %2").arg(i + 1).arg(QString::fromStdString(s.id));
        if (s.error) {
            add(tr("error"), int(i), where, QString::fromStdString(s.error->message));
            ++errors_;
        }
        for (const std::string& w : s.warnings) {
            add(tr("warning"), int(i), where, QString::fromStdString(w));
            ++warnings_;
        }
    }
    if (errors_ == 0 && warnings_ == 0) {
        auto* it = new QTreeWidgetItem(this, {tr("ok"), QString(), tr("No warnings or errors.")});
        it->setData(0, Qt::UserRole, -1);
        it->setForeground(0, QColor(0x2e, 0x7d, 0x32));
    }
    emit countsChanged(errors_, warnings_);
}

}  // namespace heatchain::gui
