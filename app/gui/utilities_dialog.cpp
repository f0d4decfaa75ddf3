#include "utilities_dialog.hpp"

#include <QComboBox>
#include <QDialogButtonBox>
#include <QFormLayout>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QPushButton>
#include <QVBoxLayout>

#include "heatchain/solver.hpp"
#include "heatchain_view/format.hpp"
#include "heatchain_view/palette.hpp"
#include "heatchain_view/utility_text.hpp"
#include "project_edit.hpp"

namespace heatchain::gui {

namespace {
using heatchain::view::qs;
QString text(const std::optional<Quantity>& q) { return q ? qs(q->text) : QString(); }
constexpr int kOriginalIdRole = Qt::UserRole + 1;

// Which cells a kind of utility uses (the others are greyed and ignored).
bool usesColumn(UtilityKind k, int c) {
    switch (c) {
    case UtilitiesDialog::ColP: return k == UtilityKind::Steam;
    case UtilitiesDialog::ColIn:
    case UtilitiesDialog::ColOut:
    case UtilitiesDialog::ColCp:
    case UtilitiesDialog::ColDensity: return k == UtilityKind::Sensible;
    case UtilitiesDialog::ColT: return k == UtilityKind::Fixed;
    default: return true;
    }
}
}  // namespace

UtilitiesDialog::UtilitiesDialog(const Project& project, QWidget* parent)
    : WorksheetDialog(project, parent) {
    setWindowTitle(tr("Utilities"));
    auto* outer = new QVBoxLayout(this);
    auto* intro = new QLabel(tr("Heat sources and sinks a step can name instead of a temperature. "
                                "Type quantities with their units (\"3 barg\", \"28 degC\", "
                                "\"4.18 kJ/(kg K)\", \"995 kg/m3\")."),
                             this);
    intro->setWordWrap(true);
    outer->addWidget(intro);

    table_ = new QTableWidget(0, ColumnCount, this);
    table_->setHorizontalHeaderLabels({tr("Name"), tr("Kind"), tr("Description"), tr("Steam P"), tr("In T"),
                                       tr("Out T"), tr("cp"), tr("Density"), tr("Fixed T"), tr("Gives")});
    table_->verticalHeader()->hide();
    table_->horizontalHeader()->setSectionResizeMode(QHeaderView::Interactive);
    table_->horizontalHeader()->setStretchLastSection(true);
    table_->setColumnWidth(ColId, 110);
    table_->setColumnWidth(ColKind, 100);
    table_->setColumnWidth(ColName, 190);
    for (int c = ColP; c < ColGives; ++c) table_->setColumnWidth(c, 100);
    table_->setSelectionBehavior(QAbstractItemView::SelectRows);
    table_->setSelectionMode(QAbstractItemView::SingleSelection);
    outer->addWidget(table_, 1);
    for (const Utility& u : project.utilityList()) addRow(u, qs(u.id));
    // Each row says what core makes of it as it is typed: the steam's
    // saturation temperature and latent heat, or the reason it cannot.
    connect(table_, &QTableWidget::itemChanged, this, [this](QTableWidgetItem* it) {
        if (it->column() != ColGives) updateResolved(it->row());
    });

    auto* rowButtons = new QHBoxLayout;
    auto addButton = [&](const QString& label, UtilityKind k) {
        auto* b = new QPushButton(label, this);
        connect(b, &QPushButton::clicked, this, [this, k] {
            const int r = addUtility(k);
            table_->setCurrentCell(r, ColId);
            table_->editItem(table_->item(r, ColId));
        });
        rowButtons->addWidget(b);
    };
    addButton(tr("Add steam"), UtilityKind::Steam);
    addButton(tr("Add sensible stream"), UtilityKind::Sensible);
    addButton(tr("Add fixed temperature"), UtilityKind::Fixed);
    auto* remove = new QPushButton(tr("Remove"), this);
    connect(remove, &QPushButton::clicked, this, [this] {
        if (table_->currentRow() >= 0) removeRow(table_->currentRow());
    });
    rowButtons->addStretch(1);
    rowButtons->addWidget(remove);
    outer->addLayout(rowButtons);

    auto* form = new QFormLayout;
    minApproach_ = new QuantityField(this);
    minApproach_->showValue(text(project.minApproach));
    minApproach_->setPlaceholder(tr("%1 K (default)").arg(Project::kDefaultMinApproach));
    minApproach_->setCheck([this](const QString& t) -> QString {
        if (t.isEmpty()) return {};
        auto q = parseTypedQuantity(t.toStdString(), Dimension::TemperatureDifference, base_);
        if (!q) return qs(q.error().message);
        return q->si > 0 ? QString() : tr("the required minimum approach must be above zero");
    });
    form->addRow(tr("Required minimum approach ΔT_min"), minApproach_);
    outer->addLayout(form);

    finishLayout(outer);
    resize(1180, 420);
}

void UtilitiesDialog::addRow(const Utility& u, const QString& originalId) {
    const int r = table_->rowCount();
    table_->insertRow(r);
    auto* id = new QTableWidgetItem(qs(u.id));
    id->setData(kOriginalIdRole, originalId);
    table_->setItem(r, ColId, id);
    auto* kind = new QComboBox(table_);
    for (UtilityKind k : {UtilityKind::Steam, UtilityKind::Sensible, UtilityKind::Fixed})
        kind->addItem(k == UtilityKind::Steam ? tr("steam") : k == UtilityKind::Sensible ? tr("sensible") : tr("fixed T"),
                      int(k));
    kind->setCurrentIndex(kind->findData(int(u.kind)));
    table_->setCellWidget(r, ColKind, kind);
    connect(kind, &QComboBox::currentIndexChanged, this, [this, kind] {
        for (int row = 0; row < table_->rowCount(); ++row)
            if (table_->cellWidget(row, ColKind) == kind) updateRowKind(row);
    });
    table_->setItem(r, ColName, new QTableWidgetItem(u.name ? qs(*u.name) : QString()));
    table_->setItem(r, ColP, new QTableWidgetItem(text(u.P)));
    table_->setItem(r, ColIn, new QTableWidgetItem(text(u.Tin)));
    table_->setItem(r, ColOut, new QTableWidgetItem(text(u.Tout)));
    table_->setItem(r, ColCp, new QTableWidgetItem(text(u.cp)));
    table_->setItem(r, ColDensity, new QTableWidgetItem(text(u.density)));
    table_->setItem(r, ColT, new QTableWidgetItem(text(u.T)));
    auto* gives = new QTableWidgetItem;
    gives->setFlags(Qt::ItemIsSelectable | Qt::ItemIsEnabled);
    table_->setItem(r, ColGives, gives);
    updateRowKind(r);
}

UtilityKind UtilitiesDialog::rowKind(int row) const {
    auto* kind = qobject_cast<QComboBox*>(table_->cellWidget(row, ColKind));
    return kind ? UtilityKind(kind->currentData().toInt()) : UtilityKind::Fixed;
}

void UtilitiesDialog::updateResolved(int row) {
    QTableWidgetItem* gives = table_->item(row, ColGives);
    if (!gives) return;
    const UtilityKind k = rowKind(row);
    Utility u;
    u.kind = k;
    u.id = table_->item(row, ColId) ? table_->item(row, ColId)->text().toStdString() : std::string();
    QString problem;
    auto read = [&](int c, Dimension d) -> std::optional<Quantity> {
        if (!usesColumn(k, c) || !table_->item(row, c)) return std::nullopt;
        const QString t = table_->item(row, c)->text().trimmed();
        if (t.isEmpty()) return std::nullopt;
        auto v = parseTypedQuantity(t.toStdString(), d, base_);
        if (!v) {
            if (problem.isEmpty())
                problem = QStringLiteral("%1: %2").arg(table_->horizontalHeaderItem(c)->text(), qs(v.error().message));
            return std::nullopt;
        }
        return *v;
    };
    u.P = read(ColP, Dimension::Pressure);
    u.Tin = read(ColIn, Dimension::Temperature);
    u.Tout = read(ColOut, Dimension::Temperature);
    u.cp = read(ColCp, Dimension::SpecificEntropy);
    u.density = read(ColDensity, Dimension::Density);
    u.T = read(ColT, Dimension::Temperature);
    QString shown;
    if (problem.isEmpty()) {
        auto prof = resolveUtility(u);
        if (!prof) problem = qs(prof.error().message);
        else {
            const UnitSystem us = base_.displayUnits;
            shown = view::utilityTemperaturesText(*prof, us, base_.unitContext());
            if (k == UtilityKind::Steam)
                shown += tr(", latent %1").arg(view::formatWithUnit(prof->latentHeat, Dimension::SpecificEnergy, us, {}, 4));
        }
    }
    QSignalBlocker block(table_);
    gives->setText(problem.isEmpty() ? shown : problem);
    gives->setToolTip(problem.isEmpty() ? shown : problem);
    gives->setForeground(problem.isEmpty() ? view::ink::text() : view::ink::error());
}

void UtilitiesDialog::updateRowKind(int row) {
    updateResolved(row);
    const UtilityKind k = rowKind(row);
    for (int c = ColP; c < ColGives; ++c) {
        QTableWidgetItem* it = table_->item(row, c);
        if (!it) continue;
        const bool used = usesColumn(k, c);
        it->setFlags(used ? Qt::ItemIsSelectable | Qt::ItemIsEnabled | Qt::ItemIsEditable : Qt::ItemIsSelectable);
        it->setBackground(used ? QBrush() : QBrush(QColor(0xf0, 0xf1, 0xf3)));
        it->setToolTip(used ? QString() : tr("not used by this kind of utility"));
    }
}

int UtilitiesDialog::addUtility(UtilityKind kind) {
    // A fresh id the worksheet does not use yet, and values of a common plant
    // utility (from memory) for the user to correct.
    const std::string base = kind == UtilityKind::Steam ? "steam" : kind == UtilityKind::Sensible ? "cw" : "fixed";
    std::string id = base;
    for (int n = 2;; ++n) {
        bool used = false;
        for (int r = 0; r < table_->rowCount(); ++r)
            if (table_->item(r, ColId)->text().toStdString() == id) used = true;
        if (!used || n > 999) break;
        id = base + "-" + std::to_string(n);
    }
    Utility u;
    u.id = id;
    u.kind = kind;
    if (kind == UtilityKind::Steam) u.P = Quantity{"3 barg", 0};
    if (kind == UtilityKind::Sensible) {
        u.Tin = Quantity{"28 degC", 0};
        u.Tout = Quantity{"35 degC", 0};
        u.cp = Quantity{"4.18 kJ/(kg K)", 0};
    }
    if (kind == UtilityKind::Fixed) u.T = Quantity{"25 degC", 0};
    addRow(u, QString());
    return table_->rowCount() - 1;
}

void UtilitiesDialog::setCell(int row, Column c, const QString& t) {
    if (c == ColKind) {
        auto* kind = qobject_cast<QComboBox*>(table_->cellWidget(row, ColKind));
        if (kind) kind->setCurrentIndex(std::max(0, kind->findText(t)));
        return;
    }
    if (QTableWidgetItem* it = table_->item(row, c)) it->setText(t);
}

void UtilitiesDialog::removeRow(int row) {
    if (row >= 0 && row < table_->rowCount()) table_->removeRow(row);
}

QString UtilitiesDialog::build(Project& p) {
    minApproach_->commit();
    if (minApproach_->hasError()) return tr("Required minimum approach: %1").arg(minApproach_->errorText());
    std::vector<Utility>& list = p.utilities.emplace();
    std::vector<std::pair<std::string, std::string>> renames;
    for (int r = 0; r < table_->rowCount(); ++r) {
        const UtilityKind k = rowKind(r);
        Utility u;
        u.id = table_->item(r, ColId)->text().trimmed().toStdString();
        u.kind = k;
        // Unknown fields of a utility kept from the file stay with it.
        const QString original = table_->item(r, ColId)->data(kOriginalIdRole).toString();
        if (const Utility* old = original.isEmpty() ? nullptr : base_.findUtility(original.toStdString())) {
            u.extra = old->extra;
            if (old->id != u.id) renames.emplace_back(old->id, u.id);
        }
        const QString name = table_->item(r, ColName)->text().trimmed();
        if (!name.isEmpty()) u.name = name.toStdString();
        auto cell = [&](int c) -> std::optional<Quantity> {
            if (!usesColumn(k, c)) return std::nullopt;
            const QString t = table_->item(r, c)->text().trimmed();
            if (t.isEmpty()) return std::nullopt;
            return Quantity{t.toStdString(), 0};
        };
        u.P = cell(ColP);
        u.Tin = cell(ColIn);
        u.Tout = cell(ColOut);
        u.cp = cell(ColCp);
        u.density = cell(ColDensity);
        u.T = cell(ColT);
        list.push_back(std::move(u));
    }
    for (const auto& [from, to] : renames)
        for (Step& s : p.steps)
            for (std::optional<Reservoir>* res : {&s.source, &s.sink})
                if (*res && (*res)->utility && *(*res)->utility == from) (*res)->utility = to;
    const QString ma = minApproach_->text().trimmed();
    if (ma.isEmpty()) p.minApproach.reset();
    else p.minApproach = Quantity{ma.toStdString(), 0};
    return {};
}

}  // namespace heatchain::gui
