#include "second_law_panel.hpp"

#include <QEvent>
#include <QHeaderView>
#include <QStyle>
#include <algorithm>

#include "heatchain/rules.hpp"
#include "heatchain_view/format.hpp"
#include "heatchain_view/palette.hpp"
#include "heatchain_view/utility_text.hpp"

namespace heatchain::gui {

using namespace heatchain::view;

namespace {
using heatchain::view::qs;
}

SecondLawPanel::SecondLawPanel(ProjectDocument* doc, QWidget* parent) : QTableWidget(parent), doc_(doc) {
    setColumnCount(ColumnCount);
    verticalHeader()->hide();
    verticalHeader()->setDefaultSectionSize(20);
    horizontalHeader()->setDefaultAlignment(Qt::AlignRight | Qt::AlignVCenter);
    horizontalHeader()->setHighlightSections(false);
    setEditTriggers(QAbstractItemView::NoEditTriggers);
    setSelectionBehavior(QAbstractItemView::SelectRows);
    setSelectionMode(QAbstractItemView::SingleSelection);
    setShowGrid(false);
    setAlternatingRowColors(true);
    setWordWrap(false);
    connect(doc_, &ProjectDocument::changed, this, &SecondLawPanel::documentChanged);
    connect(this, &QTableWidget::currentCellChanged, this, [this](int row) {
        if (row >= 0 && row < int(stepOfRow_.size()) && stepOfRow_[std::size_t(row)] >= 0 &&
            stepOfRow_[std::size_t(row)] != doc_->selectedStep())
            doc_->setSelectedStep(stepOfRow_[std::size_t(row)]);
    });
    refresh();
}

void SecondLawPanel::documentChanged() {
    // Tabbed behind the ledger the panel counts as visible but shows nothing
    // (an empty visible region); rebuilding its hundred rows there was a
    // sixth of an edit on a long sheet. It catches up when shown or painted.
    if (isVisible() && !visibleRegion().isEmpty()) refresh();
    else stale_ = true;
}

void SecondLawPanel::catchUp() const {
    if (stale_) const_cast<SecondLawPanel*>(this)->refresh();
}

bool SecondLawPanel::viewportEvent(QEvent* e) {
    // Its tab chosen: the first paint finds the rows of the latest edit.
    if (e->type() == QEvent::Paint) catchUp();
    return QTableWidget::viewportEvent(e);
}

int SecondLawPanel::rowOfStep(int index) const {
    catchUp();
    for (std::size_t r = 0; r < stepOfRow_.size(); ++r)
        if (stepOfRow_[r] == index) return int(r);
    return -1;
}

int SecondLawPanel::rowOfUtility(const QString& id) const {
    catchUp();
    for (std::size_t r = 0; r < utilityOfRow_.size(); ++r)
        if (utilityOfRow_[r] == id) return int(r);
    return -1;
}

void SecondLawPanel::refresh() {
    stale_ = false;
    const Project& p = doc_->project();
    const SequenceResult& r = doc_->result();
    const UnitSystem u = p.displayUnits;
    const UnitContext ctx = displayContext(p);
    const Dimension eD = energyDimension(r.system);
    const QString eU = unitSymbol(eD, u), dTU = unitSymbol(Dimension::TemperatureDifference, u);
    QSignalBlocker block(this);
    clearContents();
    setHorizontalHeaderLabels({tr("Step"), tr("Utility"), tr("Uses"), tr("Closest approach [%1]").arg(dTU),
                               tr("Where"), tr("Exergy supplied [%1]").arg(eU), tr("Exergy destroyed [%1]").arg(eU),
                               tr("share"), tr("η_II")});
    stepOfRow_.clear();
    utilityOfRow_.clear();
    std::vector<std::vector<QTableWidgetItem*>> rows;
    auto cell = [](const QString& t, bool left = false) {
        auto* it = new QTableWidgetItem(t);
        it->setTextAlignment((left ? Qt::AlignLeft : Qt::AlignRight) | Qt::AlignVCenter);
        return it;
    };
    const double minAp = p.minApproachK();
    for (std::size_t i = 0; i < r.steps.size(); ++i) {
        const StepResult& s = r.steps[i];
        std::vector<QTableWidgetItem*> row(ColumnCount, nullptr);
        row[ColStep] = cell(qs(s.id), true);
        row[ColStep]->setForeground(doc_->stepColour(int(i)));
        if (!s.computed) {
            row[ColUtility] = cell(tr("not computed"), true);
            row[ColUtility]->setForeground(ink::error());
        } else {
            if (s.utility) {
                const StepUtility& su = *s.utility;
                row[ColUtility] = cell(QStringLiteral("%1 (%2)").arg(qs(su.id), su.asSource ? tr("source") : tr("sink")), true);
                row[ColUse] = cell(utilityUseText(su.kind, su.mass, su.volume, r.system, u, ctx));
                if (su.volume) row[ColUse]->setToolTip(utilityMassText(su.kind, su.mass, r.system, u, ctx));
                row[ColApproach] = cell(formatDisplay(su.minApproach, Dimension::TemperatureDifference, u, ctx, 4));
                if (approachBelowRequired(su, minAp)) {
                    row[ColApproach]->setForeground(ink::error());
                    row[ColApproach]->setToolTip(tr("below the required minimum approach of %1")
                                                     .arg(formatWithUnit(minAp, Dimension::TemperatureDifference, u, ctx, 3)));
                }
                row[ColWhere] = cell(approachWhereText(s), true);
            } else if (s.reservoirT) {
                row[ColUtility] = cell(tr("%1 (typed)").arg(formatWithUnit(*s.reservoirT, Dimension::Temperature, u, ctx, 4)), true);
            }
            if (r.exergyAvailable) {
                row[ColSupplied] = cell(formatDisplay(s.exergySupplied, eD, u, ctx));
                if (noSourceGiven(s)) {
                    row[ColDestroyed] = cell(noSourceText(), true);
                } else {
                    row[ColDestroyed] = cell(formatDisplay(s.exergyDestroyed, eD, u, ctx));
                    row[ColShare] = cell(QStringLiteral("%1 %").arg(formatNumber(100 * s.exergyDestroyedShare, 3, 1)));
                    row[ColEta] = cell(efficiencyText(s.secondLawEfficiency));
                }
            }
        }
        rows.push_back(row);
        stepOfRow_.push_back(int(i));
        utilityOfRow_.emplace_back();
    }
    QFont bold = font();
    bold.setBold(true);
    // The sequence as one process.
    {
        std::vector<QTableWidgetItem*> row(ColumnCount, nullptr);
        row[ColStep] = cell(tr("Sequence"), true);
        if (r.exergyAvailable) {
            row[ColSupplied] = cell(formatDisplay(r.totals.exergySupplied, eD, u, ctx));
            row[ColDestroyed] = cell(formatDisplay(r.totals.exergyDestroyed, eD, u, ctx));
            row[ColShare] = cell(QStringLiteral("100 %"));
            row[ColEta] = cell(efficiencyText(r.totals.secondLawEfficiency));
        }
        for (auto* it : row) if (it) it->setFont(bold);
        rows.push_back(row);
        stepOfRow_.push_back(-1);
        utilityOfRow_.emplace_back();
    }
    // Utilities in total.
    for (const UtilityTotal& t : r.utilities) {
        std::vector<QTableWidgetItem*> row(ColumnCount, nullptr);
        row[ColStep] = cell(tr("utility total"), true);
        row[ColStep]->setForeground(ink::muted());
        row[ColUtility] = cell(QStringLiteral("%1 (%2)").arg(qs(t.id), utilityKindText(t.kind)), true);
        row[ColUtility]->setFont(bold);
        if (t.error) {
            row[ColUse] = cell(qs(t.error->message), true);
            row[ColUse]->setForeground(ink::error());
        } else {
            row[ColUse] = cell(t.steps == 0 ? tr("unused") : utilityUseText(t.kind, t.mass, t.volume, r.system, u, ctx));
            if (t.volume) row[ColUse]->setToolTip(utilityMassText(t.kind, t.mass, r.system, u, ctx));
            const double duty = t.heatSupplied + t.heatAbsorbed;
            row[ColWhere] = cell(tr("%1 step(s), %2").arg(t.steps).arg(formatWithUnit(duty, eD, u, ctx, 4)), true);
            if (t.profile) row[ColWhere]->setToolTip(utilityTemperaturesText(*t.profile, u, ctx));
        }
        rows.push_back(row);
        stepOfRow_.push_back(-1);
        utilityOfRow_.push_back(qs(t.id));
    }
    setRowCount(int(rows.size()));
    for (std::size_t i = 0; i < rows.size(); ++i)
        for (int c = 0; c < ColumnCount; ++c)
            if (rows[i][std::size_t(c)]) setItem(int(i), c, rows[i][std::size_t(c)]);
    fitColumns();
}

// Column widths from the glyph advances of the longest texts of each column.
// Qt's resizeColumnsToContents() lays out every cell through the delegate,
// which on a 100-step sheet was a sixth of the time of an edit. The texts are
// single lines of digits (equal advances in the UI fonts) and short words, so
// the few longest strings of a column decide its width. A hidden panel (its
// dock tabbed behind the ledger) fits its columns when it is next shown.
void SecondLawPanel::fitColumns() {
    if (!isVisible()) {
        columnsStale_ = true;
        return;
    }
    columnsStale_ = false;
    const QFontMetrics plain(font());
    QFont boldFont = font();
    boldFont.setBold(true);
    const QFontMetrics bold(boldFont);
    const int margin = 2 * (style()->pixelMetric(QStyle::PM_FocusFrameHMargin, nullptr, this) + 1) + 8;
    for (int c = 0; c < columnCount(); ++c) {
        int w = 0;
        if (const QTableWidgetItem* h = horizontalHeaderItem(c))
            w = horizontalHeader()->fontMetrics().horizontalAdvance(h->text()) + 16;
        qsizetype longest = 0;
        for (int r = 0; r < rowCount(); ++r)
            if (const QTableWidgetItem* it = item(r, c)) longest = std::max(longest, it->text().size());
        for (int r = 0; r < rowCount(); ++r)
            if (const QTableWidgetItem* it = item(r, c); it && it->text().size() + 2 >= longest)
                w = std::max(w, (it->font().bold() ? bold : plain).horizontalAdvance(it->text()) + margin);
        horizontalHeader()->resizeSection(c, w);
    }
}

void SecondLawPanel::showEvent(QShowEvent* e) {
    QTableWidget::showEvent(e);
    if (stale_) refresh();
    else if (columnsStale_) fitColumns();
}

}  // namespace heatchain::gui
