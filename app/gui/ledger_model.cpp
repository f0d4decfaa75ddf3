#include "ledger_model.hpp"

#include <QBrush>
#include <QColor>
#include <QFont>
#include <algorithm>
#include <cmath>

#include "heatchain/rules.hpp"
#include "heatchain_view/format.hpp"

namespace heatchain::gui {

using namespace heatchain::view;

LedgerModel::LedgerModel(ProjectDocument* doc, QObject* parent)
    : QAbstractTableModel(parent), doc_(doc) {
    connect(doc_, &ProjectDocument::changed, this, &LedgerModel::refresh);
    refresh();
}

void LedgerModel::refresh() {
    beginResetModel();
    rows_.clear();
    const bool all = showsAllStreams();
    const int first = all ? 0 : doc_->currentStream();
    const int last = all ? doc_->streamCount() - 1 : doc_->currentStream();
    for (int k = first; k <= last; ++k) {
        const SequenceResult& r = doc_->results()[std::size_t(k)];
        if (all) rows_.push_back({RowKind::Stream, -1, -1, k});
        rows_.push_back({RowKind::Start, -1, -1, k});
        for (std::size_t i = 0; i < r.steps.size(); ++i) {
            rows_.push_back({RowKind::Step, int(i), -1, k});
            if (r.steps[i].segments.size() > 1 && opened_.count(openedKey(k, r.steps[i].id)))
                for (std::size_t g = 0; g < r.steps[i].segments.size(); ++g)
                    rows_.push_back({RowKind::Segment, int(i), int(g), k});
        }
        rows_.push_back({RowKind::Total, -1, -1, k});
        rows_.push_back({RowKind::HeatingDuty, -1, -1, k});
        rows_.push_back({RowKind::CoolingDuty, -1, -1, k});
    }
    const Project& p = doc_->project();
    const UnitContext ctx = displayContext(p);
    decimals_.assign(ColumnCount, -1);
    for (int c = ColTin; c < ColumnCount; ++c) {
        if (c == ColPhase || isUncertaintyColumn(c)) continue;
        const Dimension d = dimensionOf(c);
        double largest = 0;
        for (const Row& row : rows_)
            if (const QVariant v = siValue(row, c); v.isValid())
                largest = std::max(largest, std::fabs(toDisplay(v.toDouble(), d, p.displayUnits, ctx)));
        if (d == Dimension::Temperature) {
            decimals_[std::size_t(c)] = largest < 10 ? 2 : 1;
        } else {
            // Five significant digits for the largest, at most four decimals.
            const int mag = largest > 0 ? int(std::floor(std::log10(largest))) : 0;
            decimals_[std::size_t(c)] = std::clamp(4 - mag, 0, 4);
        }
    }
    // "804.9 ± 12.3": a ± column shows the decimals of the value beside it.
    decimals_[std::size_t(ColUTout)] = decimals_[std::size_t(ColTout)];
    decimals_[std::size_t(ColUQ)] = decimals_[std::size_t(ColQ)];
    decimals_[std::size_t(ColUW)] = decimals_[std::size_t(ColW)];
    endResetModel();
    // The headings name the display units: tell the header only when one of
    // them reads differently (telling it on every edit cost the header a
    // relayout each time).
    QStringList headings;
    for (int c = 0; c < ColumnCount; ++c) headings << headerData(c, Qt::Horizontal, Qt::DisplayRole).toString();
    if (headings != headings_) {
        headings_ = std::move(headings);
        emit headerDataChanged(Qt::Horizontal, 0, ColumnCount - 1);
    }
}

const SequenceResult& LedgerModel::resultOf(const Row& r) const { return doc_->results()[std::size_t(r.stream)]; }

const Project& LedgerModel::projectOf(const Row& r) const {
    return doc_->streams().streams[std::size_t(r.stream)].project;
}

std::string LedgerModel::openedKey(int stream, const std::string& stepId) const {
    return doc_->streams().streams[std::size_t(stream)].id + '\x1f' + stepId;
}

bool LedgerModel::canShowAllStreams() const {
    const auto& streams = doc_->streams().streams;
    if (streams.size() < 2) return false;
    return std::all_of(streams.begin(), streams.end(),
                       [&](const Stream& s) { return s.project.system == streams.front().project.system; });
}

void LedgerModel::setAllStreams(bool all) {
    if (all == allStreams_) return;
    allStreams_ = all;
    refresh();
}

bool LedgerModel::showsArea() const {
    return std::any_of(rows_.begin(), rows_.end(), [&](const Row& row) {
        if (row.kind != RowKind::Step) return false;
        const StepResult& s = resultOf(row).steps[std::size_t(row.step)];
        return s.computed && s.transfer && s.transfer->area;
    });
}

bool LedgerModel::showsTime() const {
    return std::any_of(rows_.begin(), rows_.end(), [&](const Row& row) {
        if (row.kind != RowKind::Step) return false;
        const StepResult& s = resultOf(row).steps[std::size_t(row.step)];
        return s.computed && s.batch;
    });
}

int LedgerModel::rowCount(const QModelIndex& parent) const {
    return parent.isValid() ? 0 : int(rows_.size());
}
int LedgerModel::columnCount(const QModelIndex& parent) const {
    return parent.isValid() ? 0 : ColumnCount;
}

bool LedgerModel::hasSegments(int stepIndex, int stream) const {
    const SequenceResult& r = doc_->results()[std::size_t(streamOr(stream))];
    return stepIndex >= 0 && std::size_t(stepIndex) < r.steps.size() && r.steps[std::size_t(stepIndex)].segments.size() > 1;
}

bool LedgerModel::segmentsShown(int stepIndex, int stream) const {
    const int k = streamOr(stream);
    return hasSegments(stepIndex, k) &&
           opened_.count(openedKey(k, doc_->results()[std::size_t(k)].steps[std::size_t(stepIndex)].id)) > 0;
}

void LedgerModel::setSegmentsShown(int stepIndex, bool shown, int stream) {
    const int k = streamOr(stream);
    if (!hasSegments(stepIndex, k) || segmentsShown(stepIndex, k) == shown) return;
    const std::string key = openedKey(k, doc_->results()[std::size_t(k)].steps[std::size_t(stepIndex)].id);
    if (shown) opened_.insert(key);
    else opened_.erase(key);
    refresh();
}

int LedgerModel::rowOfStep(int stepIndex) const {
    const int k = doc_->currentStream();
    for (std::size_t i = 0; i < rows_.size(); ++i)
        if (rows_[i].kind == RowKind::Step && rows_[i].step == stepIndex && rows_[i].stream == k) return int(i);
    return -1;
}

Dimension LedgerModel::dimensionOf(int column) const {
    const SystemKind sys = doc_->result().system;
    switch (column) {
    case ColTin: case ColTout: return Dimension::Temperature;
    case ColUTout: return Dimension::TemperatureDifference;
    case ColUQ: case ColUW: return energyDimension(sys);
    case ColPin: case ColPout: return Dimension::Pressure;
    case ColQ: case ColW: case ColdH: case ColdU: case ColExd: return energyDimension(sys);
    case ColdS: case ColSgen: return entropyDimension(sys);
    case ColArea: return Dimension::Area;
    case ColTime: return Dimension::Time;
    default: return Dimension::Dimensionless;
    }
}

QVariant LedgerModel::siValue(const Row& row, int c) const {
    if (row.kind == RowKind::Stream) return {};
    const SequenceResult& r = resultOf(row);
    if (isUncertaintyColumn(c)) {
        // The propagation is the current stream's.
        const UncertaintyResult* u = row.stream == doc_->currentStream() ? doc_->uncertainty() : nullptr;
        if (!u) return {};
        std::string path;
        const char* key = c == ColUQ ? ".Q" : c == ColUW ? ".W" : ".end.T_K";
        if (row.kind == RowKind::Step) path = "steps." + r.steps[std::size_t(row.step)].id + key;
        else if (c != ColUTout && row.kind == RowKind::Total) path = std::string("totals") + key;
        else if (c == ColUQ && row.kind == RowKind::HeatingDuty) path = "totals.heatingDuty";
        else if (c == ColUQ && row.kind == RowKind::CoolingDuty) path = "totals.coolingDuty";
        const UncertainOutput* o = path.empty() ? nullptr : u->find(path);
        if (!o) return {};
        // Below the solver's own noise a spread is none (as the command line).
        return spreadForDisplay(o->u, o->value);
    }
    auto fromState = [&](const State& a, const State& b) -> QVariant {
        switch (c) {
        case ColTin: return a.T;
        case ColTout: return b.T;
        case ColPin: return a.P;
        case ColPout: return b.P;
        default: return {};
        }
    };
    switch (row.kind) {
    case RowKind::Start:
        if (r.startError) return {};
        if (c == ColTout) return r.start.T;
        if (c == ColPout) return r.start.P;
        return {};
    case RowKind::Step: {
        const StepResult& s = r.steps[std::size_t(row.step)];
        if (!s.computed) return {};
        if (QVariant v = fromState(s.start, s.end); v.isValid()) return v;
        switch (c) {
        case ColQ: return s.Q;
        case ColW: return s.W;
        case ColdH: return s.dH;
        case ColdU: return s.dU;
        case ColdS: return s.dS;
        case ColSgen: return s.Sgen;
        case ColExd: return s.exergyDestroyed;
        case ColArea: return s.transfer && s.transfer->area ? QVariant(*s.transfer->area) : QVariant();
        case ColTime: return s.batch ? QVariant(s.batch->duration) : QVariant();
        default: return {};
        }
    }
    case RowKind::Segment: {
        const StepResult& s = r.steps[std::size_t(row.step)];
        if (!s.computed) return {};
        const SegmentResult& g = s.segments[std::size_t(row.segment)];
        if (QVariant v = fromState(g.start, g.end); v.isValid()) return v;
        if (c == ColQ) return g.Q;
        return {};
    }
    case RowKind::Total:
        switch (c) {
        case ColQ: return r.totals.Q;
        case ColW: return r.totals.W;
        case ColdH: return r.totals.dH;
        case ColdU: return r.totals.dU;
        case ColdS: return r.totals.dS;
        case ColSgen: return r.totals.Sgen;
        case ColExd: return r.totals.exergyDestroyed;
        // Steady flow: the exchangers added up; a batch: the cycle time
        // (its steps share one jacket, so their areas are not added).
        case ColArea: return r.totals.area ? QVariant(*r.totals.area) : QVariant();
        case ColTime: return r.totals.cycleTime ? QVariant(*r.totals.cycleTime) : QVariant();
        default: return {};
        }
    case RowKind::HeatingDuty:
        return c == ColQ ? QVariant(r.totals.heatingDuty) : QVariant();
    case RowKind::CoolingDuty:
        return c == ColQ ? QVariant(r.totals.coolingDuty) : QVariant();
    case RowKind::Stream:
        return {};
    }
    return {};
}

QString LedgerModel::text(const Row& row, int c) const {
    const SequenceResult& r = resultOf(row);
    const Project& p = projectOf(row);
    if (row.kind == RowKind::Stream) {
        const Stream& st = doc_->streams().streams[std::size_t(row.stream)];
        if (c == ColStep) return QString::fromStdString(st.id);
        if (c == ColWhat)
            return st.name ? QStringLiteral("%1 · %2").arg(QString::fromStdString(*st.name),
                                                          QString::fromStdString(p.substance.name))
                           : QString::fromStdString(p.substance.name);
        return {};
    }
    if (c == ColStep) {
        switch (row.kind) {
        case RowKind::Start: return tr("start");
        case RowKind::Step: return QStringLiteral("%1  %2").arg(row.step + 1).arg(QString::fromStdString(r.steps[std::size_t(row.step)].id));
        case RowKind::Segment: return {};
        case RowKind::Total: return tr("Total");
        case RowKind::HeatingDuty: return tr("Heating duty");
        case RowKind::CoolingDuty: return tr("Cooling duty");
        case RowKind::Stream: return {};
        }
    }
    if (c == ColWhat) {
        switch (row.kind) {
        case RowKind::Start: return QString::fromStdString(p.substance.name);
        case RowKind::Step: {
            const StepResult& s = r.steps[std::size_t(row.step)];
            if (s.segments.size() <= 1) return stepKindTitle(s.kind);
            return tr("%1  %2 %3 parts").arg(stepKindTitle(s.kind), opened_.count(openedKey(row.stream, s.id)) ? QStringLiteral("▾")
                                                                                          : QStringLiteral("▸"))
                .arg(s.segments.size());
        }
        case RowKind::Segment:
            return QStringLiteral("   └ %1").arg(QString::fromStdString(
                r.steps[std::size_t(row.step)].segments[std::size_t(row.segment)].label));
        case RowKind::HeatingDuty: return tr("sum of Q > 0");
        case RowKind::CoolingDuty: return tr("sum of |Q < 0|");
        default: return {};
        }
    }
    if (c == ColPhase) {
        switch (row.kind) {
        case RowKind::Start: return r.startError ? tr("error") : phaseText(r.start);
        case RowKind::Step: {
            const StepResult& s = r.steps[std::size_t(row.step)];
            if (s.error) return tr("error: %1").arg(QString::fromStdString(s.error->message));
            if (!s.computed) return tr("not computed");
            return phaseText(s.end);
        }
        case RowKind::Segment: {
            const StepResult& s = r.steps[std::size_t(row.step)];
            return s.computed ? phaseText(s.segments[std::size_t(row.segment)].end) : QString();
        }
        default: return {};
        }
    }
    if (c == ColExd && row.kind == RowKind::Step && noSourceGiven(r.steps[std::size_t(row.step)]))
        return noSourceText();
    const QVariant v = siValue(row, c);
    if (!v.isValid()) return {};
    if (c >= ColQ && c <= ColExd && !isUncertaintyColumn(c)) {
        // Round-off of a balance (ΔH of a throttle: 8e−13 kW) shows as 0 by
        // core's rule, judged within the step (a segment within its step) or
        // the totals. The full value stays in the copied text and in SiRole.
        const bool entropy = c == ColdS || c == ColSgen;
        std::optional<double> scale;
        if (row.kind == RowKind::Step || row.kind == RowKind::Segment) {
            const StepResult& s = resultOf(row).steps[std::size_t(row.step)];
            scale = entropy ? entropyScale(s) : energyScale(s);
        } else if (row.kind == RowKind::Total) {
            const Totals& t = resultOf(row).totals;
            scale = entropy ? entropyScale(t) : energyScale(t);
        }
        if (scale && showsAsZero(v.toDouble(), *scale)) return QStringLiteral("0");
    }
    const double shown = toDisplay(v.toDouble(), dimensionOf(c), p.displayUnits, displayContext(p));
    if (std::size_t(c) < decimals_.size() && decimals_[std::size_t(c)] >= 0)
        return formatFixed(shown, decimals_[std::size_t(c)]);
    return formatDisplay(v.toDouble(), dimensionOf(c), p.displayUnits, displayContext(p));
}

QVariant LedgerModel::data(const QModelIndex& index, int role) const {
    if (!index.isValid() || index.row() >= int(rows_.size())) return {};
    const Row& row = rows_[std::size_t(index.row())];
    const int c = index.column();
    switch (role) {
    case Qt::DisplayRole: return text(row, c);
    case SiRole: return siValue(row, c);
    case RowStepRole: return row.step;
    case RowKindRole: return int(row.kind);
    case RowStreamRole: return row.stream;
    case Qt::TextAlignmentRole:
        if (c == ColStep || c == ColWhat || c == ColPhase) return int(Qt::AlignLeft | Qt::AlignVCenter);
        return int(Qt::AlignRight | Qt::AlignVCenter);
    case Qt::FontRole: {
        if ((row.kind == RowKind::Step && c == ColStep) || row.kind == RowKind::Stream) { QFont f; f.setBold(true); return f; }
        if (row.kind == RowKind::Total || row.kind == RowKind::HeatingDuty || row.kind == RowKind::CoolingDuty) {
            QFont f; f.setBold(row.kind == RowKind::Total); return f;
        }
        return {};
    }
    case Qt::ForegroundRole: {
        if (row.kind == RowKind::Segment) return QBrush(QColor(0x5c, 0x63, 0x6b));
        if (row.kind == RowKind::Step) {
            const StepResult& s = resultOf(row).steps[std::size_t(row.step)];
            if (s.error || !s.computed) return QBrush(QColor(0xb4, 0x23, 0x18));
            if (!s.warnings.empty() && c == ColPhase) return QBrush(QColor(0x8a, 0x5a, 0x00));
        }
        return {};
    }
    case Qt::BackgroundRole:
        if (row.kind == RowKind::Total || row.kind == RowKind::HeatingDuty || row.kind == RowKind::CoolingDuty)
            return QBrush(QColor(0xf1, 0xf3, 0xf5));
        if (row.kind == RowKind::Start) return QBrush(QColor(0xf7, 0xf8, 0xf9));
        if (row.kind == RowKind::Stream) return QBrush(QColor(0xe3, 0xea, 0xf1));
        return {};
    case Qt::ToolTipRole:
        if (isUncertaintyColumn(c))
            return tr("Standard uncertainty from the worksheet's tolerances (first-order method, JCGM 100:2008)");
        if (row.kind == RowKind::Stream) return text(row, ColWhat);
        if (row.kind == RowKind::Step) {
            const StepResult& s = resultOf(row).steps[std::size_t(row.step)];
            QStringList t;
            if (s.error) t << tr("Error: %1").arg(QString::fromStdString(s.error->message));
            for (const auto& w : s.warnings) t << tr("Warning: %1").arg(QString::fromStdString(w));
            if (!t.isEmpty()) return t.join(QLatin1Char('\n'));
        }
        return {};
    default:
        return {};
    }
}

QVariant LedgerModel::headerData(int section, Qt::Orientation o, int role) const {
    if (o != Qt::Horizontal) return {};
    if (role == Qt::TextAlignmentRole)
        return int((section == ColStep || section == ColWhat || section == ColPhase ? Qt::AlignLeft : Qt::AlignRight) | Qt::AlignVCenter);
    if (role != Qt::DisplayRole) return {};
    const UnitSystem u = doc_->project().displayUnits;
    auto h = [&](const QString& name) {
        return QStringLiteral("%1\n[%2]").arg(name, unitSymbol(dimensionOf(section), u, displayContext(doc_->project())));
    };
    switch (section) {
    case ColStep: return tr("Step\n");
    case ColWhat: return tr("Kind / segment\n");
    case ColTin: return h(tr("T in"));
    case ColTout: return h(tr("T out"));
    case ColUTout: return h(tr("± T out"));
    case ColUQ: return h(tr("± Q"));
    case ColUW: return h(tr("± W"));
    case ColPin: return h(tr("P in"));
    case ColPout: return h(tr("P out"));
    case ColPhase: return tr("Phase out\n");
    case ColQ: return h(tr("Q"));
    case ColW: return h(tr("W"));
    case ColdH: return h(tr("ΔH"));
    case ColdU: return h(tr("ΔU"));
    case ColdS: return h(tr("ΔS"));
    case ColSgen: return h(tr("S_gen"));
    case ColExd: return h(tr("Exergy destroyed"));
    case ColArea: return h(tr("Area"));
    case ColTime: return h(tr("Time"));
    default: return {};
    }
}

QString LedgerModel::toTabSeparated() const {
    const Project& p = doc_->project();
    QStringList lines;
    QStringList head;
    for (int c = 0; c < ColumnCount; ++c)
        head << headerData(c, Qt::Horizontal, Qt::DisplayRole).toString().replace(QLatin1Char('\n'), QLatin1Char(' ')).trimmed();
    lines << head.join(QLatin1Char('\t'));
    for (const Row& row : rows_) {
        QStringList cells;
        for (int c = 0; c < ColumnCount; ++c) {
            const QVariant v = siValue(row, c);
            if (v.isValid()) {
                // Full precision and a plain minus for spreadsheets.
                cells << QString::number(toDisplay(v.toDouble(), dimensionOf(c), p.displayUnits, displayContext(p)), 'g', 10);
            } else {
                cells << text(row, c).trimmed().replace(QStringLiteral("└ "), QString());
            }
        }
        lines << cells.join(QLatin1Char('\t'));
    }
    return lines.join(QLatin1Char('\n')) + QLatin1Char('\n');
}

}  // namespace heatchain::gui
