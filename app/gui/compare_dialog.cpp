#include "compare_dialog.hpp"

#include <QApplication>
#include <QClipboard>
#include <QFileInfo>
#include <filesystem>
#include <QDialogButtonBox>
#include <QHeaderView>
#include <QPushButton>
#include <QVBoxLayout>
#include <functional>

#include "heatchain/project_file.hpp"
#include "heatchain_view/format.hpp"

namespace heatchain::gui {

using namespace heatchain::view;

namespace {
using heatchain::view::qs;

const QColor kAdded(0x2e, 0x7d, 0x32), kRemoved(0xb4, 0x23, 0x18), kMoved(0x1f, 0x5f, 0xa8), kMuted(0x6b, 0x72, 0x80);

// A signed change for the Δ column ("+12.5", "−3.1"); the unit is in the row label.
QString signedNumber(double displayValue) {
    const QString n = formatNumber(displayValue);
    return displayValue > 0 ? QStringLiteral("+") + n : n;
}

QTreeWidgetItem* section(QTreeWidget* tree, const QString& title, int count) {
    auto* item = new QTreeWidgetItem(tree, {count >= 0 ? QStringLiteral("%1 (%2)").arg(title).arg(count) : title});
    QFont f = item->font(0);
    f.setBold(true);
    item->setFont(0, f);
    item->setFirstColumnSpanned(true);
    item->setExpanded(true);
    return item;
}

QTreeWidgetItem* row(QTreeWidgetItem* parent, const QString& what, const QString& before, const QString& after,
                     const QString& change = {}) {
    auto* item = new QTreeWidgetItem(parent, {what, before, after, change});
    for (int c = 1; c < 4; ++c) item->setTextAlignment(c, Qt::AlignRight | Qt::AlignVCenter);
    // Long notes are elided in the columns; the whole text on hover.
    for (int c = 0; c < 3; ++c)
        if (item->text(c).size() > 24) item->setToolTip(c, item->text(c));
    return item;
}

QString fieldText(const std::string& text, bool present) { return present ? qs(text) : QStringLiteral("(none)"); }
}  // namespace

CompareDialog::CompareDialog(Revision before, Revision after, QWidget* parent)
    : QDialog(parent), before_(std::move(before)), after_(std::move(after)) {
    setWindowTitle(tr("Compare revisions"));
    setObjectName(QStringLiteral("compareDialog"));
    header_ = new QLabel(this);
    header_->setTextFormat(Qt::RichText);
    header_->setWordWrap(true);
    summary_ = new QLabel(this);
    summary_->setWordWrap(true);
    summary_->setStyleSheet(QStringLiteral("color: #374151; padding: 2px 0 6px 0;"));

    tree_ = new QTreeWidget(this);
    tree_->setColumnCount(4);
    tree_->setHeaderLabels({tr("What"), tr("Before"), tr("After"), tr("Change")});
    tree_->setAlternatingRowColors(true);
    tree_->setUniformRowHeights(true);
    tree_->setRootIsDecorated(true);
    tree_->header()->setStretchLastSection(false);
    tree_->header()->setSectionResizeMode(0, QHeaderView::Stretch);
    for (int c = 1; c < 4; ++c) tree_->header()->setSectionResizeMode(c, QHeaderView::Interactive);
    tree_->setColumnWidth(1, 170);
    tree_->setColumnWidth(2, 170);
    tree_->setColumnWidth(3, 120);

    auto* buttons = new QDialogButtonBox(QDialogButtonBox::Close, this);
    QPushButton* swapButton = buttons->addButton(tr("Swap before/after"), QDialogButtonBox::ActionRole);
    QPushButton* copyButton = buttons->addButton(tr("Copy as text"), QDialogButtonBox::ActionRole);
    connect(swapButton, &QPushButton::clicked, this, &CompareDialog::swap);
    connect(copyButton, &QPushButton::clicked, this, [this] {
        QApplication::clipboard()->setText(qs(projectDiffText(diff_, after_.project)));
    });
    connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);

    auto* layout = new QVBoxLayout(this);
    layout->addWidget(header_);
    layout->addWidget(summary_);
    layout->addWidget(tree_, 1);
    layout->addWidget(buttons);
    resize(880, 640);
    rebuild();
}

void CompareDialog::swap() {
    std::swap(before_, after_);
    rebuild();
}

void CompareDialog::rebuild() {
    diff_ = diffProjects(before_.project, before_.result, after_.project, after_.result);
    const Project& p = after_.project;
    const UnitSystem u = p.displayUnits;
    auto revisionLabel = [](const Revision& r) {
        QString s = QStringLiteral("<b>%1</b>").arg(r.name.toHtmlEscaped());
        if (!r.project.meta.revision.empty())
            s += QStringLiteral(" · revision %1").arg(qs(r.project.meta.revision).toHtmlEscaped());
        return s;
    };
    header_->setText(tr("Before: %1<br>After: %2").arg(revisionLabel(before_), revisionLabel(after_)));

    int added = 0, removed = 0, changed = 0, moved = 0;
    for (const StepChange& c : diff_.steps) {
        if (c.kind == StepChange::Kind::Added) ++added;
        else if (c.kind == StepChange::Kind::Removed) ++removed;
        else {
            if (c.moved) ++moved;
            if (!c.fields.empty()) ++changed;
        }
    }

    tree_->clear();
    // Inputs outside the steps: substance, model, start state, basis, meta.
    if (!diff_.project.empty()) {
        QTreeWidgetItem* s = section(tree_, tr("Worksheet settings"), int(diff_.project.size()));
        for (const FieldChange& f : diff_.project)
            row(s, qs(f.field), fieldText(f.before, f.presentBefore), fieldText(f.after, f.presentAfter));
    }
    if (!diff_.steps.empty()) {
        QTreeWidgetItem* s = section(tree_, tr("Steps"), int(diff_.steps.size()));
        for (const StepChange& c : diff_.steps) {
            QString what, before, after;
            QColor colour;
            switch (c.kind) {
            case StepChange::Kind::Added:
                what = tr("%1 — added").arg(qs(c.id));
                before = QStringLiteral("—");
                after = tr("step %1").arg(c.positionAfter);
                colour = kAdded;
                break;
            case StepChange::Kind::Removed:
                what = tr("%1 — removed").arg(qs(c.id));
                before = tr("step %1").arg(c.positionBefore);
                after = QStringLiteral("—");
                colour = kRemoved;
                break;
            case StepChange::Kind::Changed:
            case StepChange::Kind::Moved:
                what = c.moved && !c.fields.empty() ? tr("%1 — moved and changed").arg(qs(c.id))
                       : c.moved                    ? tr("%1 — moved").arg(qs(c.id))
                                                    : tr("%1 — changed").arg(qs(c.id));
                // Positions only when the order changed; otherwise they are noise.
                if (c.moved) {
                    before = tr("step %1").arg(c.positionBefore);
                    after = tr("step %1").arg(c.positionAfter);
                }
                colour = c.moved ? kMoved : QColor();
                break;
            }
            QTreeWidgetItem* item = row(s, what, before, after);
            if (colour.isValid()) item->setForeground(0, colour);
            for (const FieldChange& f : c.fields) {
                QTreeWidgetItem* fi = row(item, qs(f.field), fieldText(f.before, f.presentBefore),
                                          fieldText(f.after, f.presentAfter));
                if (!f.presentBefore) fi->setForeground(1, kMuted);
                if (!f.presentAfter) fi->setForeground(2, kMuted);
            }
            item->setExpanded(true);
        }
    }

    // Results: only the steps whose numbers moved, with the change in display units.
    const Dimension energy = energyDimension(p.system), entropy = entropyDimension(p.system);
    const QString dutyWord = p.system == SystemKind::SteadyFlow ? tr("Duty Q") : tr("Heat Q");
    auto shiftRow = [&](QTreeWidgetItem* parent, const QString& label, const Shift& sh, Dimension d, Dimension dd) {
        if (!sh.changed()) return;
        const QString unit = unitSymbol(d, u);
        const QString b = sh.before ? formatDisplay(*sh.before, d, u) : QStringLiteral("—");
        const QString a = sh.after ? formatDisplay(*sh.after, d, u) : QStringLiteral("—");
        QString delta;
        if (auto dv = sh.delta()) delta = signedNumber(toDisplay(*dv, dd, u));
        row(parent, QStringLiteral("%1 [%2]").arg(label, unit), b, a, delta);
    };
    int movedResults = 0;
    if (diff_.resultsCompared) {
        QTreeWidgetItem* s = section(tree_, tr("Results that moved"), -1);
        for (const StepResultShift& r : diff_.results) {
            auto* item = new QTreeWidgetItem(s, {qs(r.id)});
            shiftRow(item, dutyWord, r.Q, energy, energy);
            shiftRow(item, tr("Work W"), r.W, energy, energy);
            shiftRow(item, tr("S_gen"), r.Sgen, entropy, entropy);
            shiftRow(item, tr("End T"), r.endT, Dimension::Temperature, Dimension::TemperatureDifference);
            if (item->childCount() == 0) {
                delete item;
                continue;
            }
            ++movedResults;
            item->setExpanded(true);
        }
        s->setText(0, tr("Results that moved (%1 step(s))").arg(movedResults));
        if (movedResults == 0) row(s, tr("no step result moved"), {}, {})->setForeground(0, kMuted);

        QTreeWidgetItem* t = section(tree_, tr("Totals"), -1);
        const TotalsShift& ts = diff_.totals;
        shiftRow(t, tr("Net Q"), ts.Q, energy, energy);
        shiftRow(t, tr("Heating duty"), ts.heatingDuty, energy, energy);
        shiftRow(t, tr("Cooling duty"), ts.coolingDuty, energy, energy);
        shiftRow(t, tr("Net W"), ts.W, energy, energy);
        shiftRow(t, tr("S_gen"), ts.Sgen, entropy, entropy);
        shiftRow(t, tr("Exergy destroyed"), ts.exergyDestroyed, energy, energy);
        if (t->childCount() == 0) row(t, tr("no total moved"), {}, {})->setForeground(0, kMuted);
    } else {
        row(section(tree_, tr("Results"), -1), tr("not compared: a revision could not be solved"), {}, {})
            ->setForeground(0, kRemoved);
    }

    if (diff_.identicalInput()) {
        summary_->setText(tr("The inputs are identical."));
    } else {
        QStringList parts;
        if (!diff_.project.empty()) parts << tr("%1 worksheet setting(s)").arg(diff_.project.size());
        if (changed) parts << tr("%1 step(s) changed").arg(changed);
        if (added) parts << tr("%1 added").arg(added);
        if (removed) parts << tr("%1 removed").arg(removed);
        if (moved) parts << tr("%1 moved").arg(moved);
        QString text = parts.join(QStringLiteral(", "));
        if (diff_.resultsCompared) {
            if (auto d = diff_.totals.heatingDuty.delta(); d && diff_.totals.heatingDuty.changed())
                text += tr(" · heating duty %1 %2").arg(signedNumber(toDisplay(*d, energy, u)), unitSymbol(energy, u));
            if (auto d = diff_.totals.Sgen.delta(); d && diff_.totals.Sgen.changed())
                text += tr(" · S_gen %1 %2").arg(signedNumber(toDisplay(*d, entropy, u)), unitSymbol(entropy, u));
        }
        summary_->setText(text);
    }
}

QString CompareDialog::visibleText() const {
    QStringList lines;
    std::function<void(QTreeWidgetItem*, int)> walk = [&](QTreeWidgetItem* item, int depth) {
        QStringList cols;
        for (int c = 0; c < 4; ++c) cols << item->text(c);
        lines << QString(depth * 2, QLatin1Char(' ')) + cols.join(QStringLiteral(" | "));
        for (int i = 0; i < item->childCount(); ++i) walk(item->child(i), depth + 1);
    };
    for (int i = 0; i < tree_->topLevelItemCount(); ++i) walk(tree_->topLevelItem(i), 0);
    return lines.join(QLatin1Char('\n'));
}

CompareDialog* CompareDialog::againstFile(const ProjectDocument& doc, const QString& path, QString* error,
                                         QWidget* parent) {
    auto other = loadProject(std::filesystem::path(path.toStdString()));
    if (!other) {
        if (error)
            *error = tr("%1 could not be read.\n\n%2").arg(QFileInfo(path).fileName(), view::escapedText(other.error().text()));
        return nullptr;
    }
    SequenceResult otherResult = solve(other.value());
    QString mine = doc.filePath().isEmpty() ? tr("this worksheet (not saved)")
                                            : tr("this worksheet, %1").arg(QFileInfo(doc.filePath()).fileName());
    if (doc.isModified() && !doc.filePath().isEmpty()) mine += tr(" with unsaved changes");
    return new CompareDialog(Revision{std::move(other.value()), std::move(otherResult), QFileInfo(path).fileName()},
                             Revision{doc.project(), doc.result(), mine}, parent);
}

}  // namespace heatchain::gui
