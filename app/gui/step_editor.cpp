#include "step_editor.hpp"
#include "transfer_fields.hpp"

#include "heatchain/rules.hpp"
#include "heatchain/project_file.hpp"

#include <QHBoxLayout>
#include <QVBoxLayout>

#include "commands.hpp"
#include "heatchain_view/format.hpp"
#include "heatchain_view/step_icons.hpp"
#include "heatchain_view/utility_text.hpp"
#include "project_edit.hpp"

namespace heatchain::gui {

using namespace heatchain::view;

namespace {
using heatchain::view::qs;
QString typedText(const std::optional<Quantity>& q) { return q ? qs(q->text) : QString(); }
QString typedText(const std::optional<Number>& n) {
    if (!n) return {};
    return qs(n->typed());
}
QString typedText(const std::optional<Reservoir>& r) {
    return r && r->T ? qs(r->T->text) : QString();
}
}  // namespace

StepEditor::StepEditor(ProjectDocument* doc, QWidget* parent) : QWidget(parent), doc_(doc) {
    auto* outer = new QVBoxLayout(this);
    outer->setContentsMargins(8, 6, 8, 6);
    header_ = new QLabel(this);
    header_->setTextFormat(Qt::RichText);
    outer->addWidget(header_);
    empty_ = new QLabel(tr("Select a step on the chain to edit it, or add one with the "
                           "toolbar, the canvas menu, or the quick-add line."),
                        this);
    empty_->setWordWrap(true);
    empty_->setStyleSheet(QStringLiteral("color: #6b727a;"));
    outer->addWidget(empty_);
    // An edit core refuses (it would save a file that does not open): why.
    problem_ = new QLabel(this);
    problem_->setWordWrap(true);
    problem_->setStyleSheet(QStringLiteral("color: #b42318;"));
    problem_->hide();
    outer->addWidget(problem_);

    form_ = new QWidget(this);
    formLayout_ = new QFormLayout(form_);
    formLayout_->setContentsMargins(0, 0, 0, 0);
    formLayout_->setLabelAlignment(Qt::AlignRight);
    formLayout_->setFieldGrowthPolicy(QFormLayout::AllNonFixedFieldsGrow);

    id_ = new QuantityField(form_);
    id_->setObjectName(QStringLiteral("id"));
    kind_ = new QComboBox(form_);
    for (StepKind k : allStepKinds())
        kind_->addItem(stepIcon(k), stepKindTitle(k), int(k));
    targetKind_ = new QComboBox(form_);
    targetKind_->setObjectName(QStringLiteral("targetKind"));
    // As wide as its usual choices: a long one ("rated: …") would otherwise
    // squeeze the value beside it.
    targetKind_->setSizeAdjustPolicy(QComboBox::AdjustToMinimumContentsLengthWithIcon);
    targetKind_->setMinimumContentsLength(14);
    target_ = new QuantityField(form_);
    auto* targetRow = new QWidget(form_);
    auto* tl = new QHBoxLayout(targetRow);
    tl->setContentsMargins(0, 0, 0, 0);
    tl->addWidget(targetKind_);
    tl->addWidget(target_, 1);
    at_ = new QComboBox(form_);
    at_->addItem(tr("constant pressure"), int(HeatingAt::ConstantPressure));
    at_->addItem(tr("constant volume"), int(HeatingAt::ConstantVolume));
    fraction_ = new QuantityField(form_);
    fraction_->setPlaceholder(tr("1 (the whole change)"));
    path_ = new QComboBox(form_);
    path_->addItem(tr("isentropic (reversible, adiabatic)"), int(PathKind::Isentropic));
    path_->addItem(tr("adiabatic with efficiency"), int(PathKind::Adiabatic));
    path_->addItem(tr("polytropic, P·vⁿ constant"), int(PathKind::Polytropic));
    path_->addItem(tr("isothermal"), int(PathKind::Isothermal));
    n_ = new QuantityField(form_);
    efficiency_ = new QuantityField(form_);
    efficiency_->setPlaceholder(tr("isentropic efficiency, 0–1"));
    source_ = new QuantityField(form_);
    source_->setPlaceholder(tr("none (S_gen not charged to a source)"));
    sink_ = new QuantityField(form_);
    sink_->setPlaceholder(tr("none"));
    note_ = new QuantityField(form_);
    // Source and sink: a typed temperature or a named utility, side by side.
    auto reservoirRow = [this](QComboBox*& box, QuantityField* field) {
        box = new QComboBox(form_);
        box->setSizeAdjustPolicy(QComboBox::AdjustToContents);
        box->setToolTip(tr("A temperature you type, or one of the worksheet's utilities "
                           "(Edit ▸ Utilities…)"));
        auto* row = new QWidget(form_);
        auto* l = new QHBoxLayout(row);
        l->setContentsMargins(0, 0, 0, 0);
        l->addWidget(box);
        l->addWidget(field, 1);
        return row;
    };
    QWidget* sourceRow = reservoirRow(sourceUtility_, source_);
    QWidget* sinkRow = reservoirRow(sinkUtility_, sink_);

    formLayout_->addRow(tr("Name"), id_);
    formLayout_->addRow(tr("Kind"), kind_);
    formLayout_->addRow(tr("Target"), targetRow);
    formLayout_->addRow(tr("Held at"), at_);
    formLayout_->addRow(tr("Fraction"), fraction_);
    formLayout_->addRow(tr("Path"), path_);
    formLayout_->addRow(tr("Exponent n"), n_);
    formLayout_->addRow(tr("Efficiency"), efficiency_);
    formLayout_->addRow(tr("Source"), sourceRow);
    formLayout_->addRow(tr("Sink"), sinkRow);
    transfer_ = new TransferFields(doc_, form_, formLayout_,
                                   [this](const QString& name, const std::function<void(Step&)>& change) { apply(name, change); });
    formLayout_->addRow(tr("Comment"), note_);
    outer->addWidget(form_);
    // An invalid entry left by clicking elsewhere stays marked in its field
    // and is announced: nothing is dropped silently.
    const std::pair<QuantityField*, QString> named[] = {
        {id_, tr("Name")},        {target_, tr("Target")}, {fraction_, tr("Fraction")},
        {n_, tr("Exponent n")},   {efficiency_, tr("Isentropic efficiency")},
        {source_, tr("Source")},  {sink_, tr("Sink")},     {note_, tr("Comment")}};
    for (const auto& [f, label] : named) {
        connect(f, &QuantityField::rejected, this, [this, label](const QString& text, const QString& reason) {
            emit rejected(tr("%1 “%2” not applied: %3").arg(label, text, reason));
        });
    }

    resultBox_ = new QGroupBox(tr("Result"), this);
    auto* rl = new QVBoxLayout(resultBox_);
    resultText_ = new ResultTable(resultBox_);
    messages_ = new QLabel(resultBox_);
    messages_->setWordWrap(true);
    messages_->setTextFormat(Qt::RichText);
    rl->addWidget(resultText_);
    rl->addWidget(messages_);
    outer->addWidget(resultBox_);
    outer->addStretch(1);

    // --- checks: core's parser gives the reason -------------------------
    id_->setCheck([this](const QString& t) -> QString {
        if (t.isEmpty()) return tr("a step needs a name");
        const int other = doc_->indexOf(t.toStdString());
        if (other >= 0 && other != doc_->selectedStep())
            return tr("another step is already named \"%1\"").arg(t);
        return {};
    });
    target_->setCheck([this](const QString& t) { return checkTarget(t, currentTarget()); });
    auto tempCheck = [this](const QString& t) -> QString {
        if (t.isEmpty()) return {};
        auto q = parseTypedQuantity(t.toStdString(), Dimension::Temperature, doc_->project());
        return q ? QString() : qs(q.error().message);
    };
    source_->setCheck(tempCheck);
    sink_->setCheck(tempCheck);
    auto numberCheck = [](BoundedField field, const char* what) {
        return [field, what](const QString& t) -> QString {
            if (t.isEmpty()) return {};
            auto n = parseTypedNumber(t.toStdString(), field, what);
            return n ? QString() : qs(n.error().message);
        };
    };
    // The bounds the file's reader has (core's rangeOf).
    fraction_->setCheck(numberCheck(BoundedField::Fraction, "the fraction"));
    n_->setCheck(numberCheck(BoundedField::PolytropicExponent, "the polytropic exponent n"));
    efficiency_->setCheck(numberCheck(BoundedField::Efficiency, "the isentropic efficiency"));

    // --- commits: one undoable command each -----------------------------
    connect(id_, &QuantityField::committed, this, [this](const QString& t) {
        apply(tr("name"), [&](Step& s) { s.id = t.toStdString(); });
    });
    connect(target_, &QuantityField::committed, this, &StepEditor::applyTarget);
    connect(targetKind_, &QComboBox::activated, this, [this] {
        // A new kind of target: keep the text if it fits, else ask for a value.
        // "rated" takes no value: the exchanger's area is its target.
        if (currentTarget() == Target::Rated) {
            applyTarget(QString());
            return;
        }
        const QString reason = checkTarget(target_->text(), currentTarget());
        if (reason.isEmpty()) applyTarget(target_->text());
        else target_->commit();
    });
    connect(kind_, &QComboBox::activated, this, [this] {
        const auto k = StepKind(kind_->currentData().toInt());
        const Step* s = step();
        if (!s || s->kind == k) return;
        // A new kind gets that kind's defaults; the name, note and
        // source/sink stay.
        Step fresh = defaultStep(doc_->project(), doc_->result(), k, doc_->selectedStep());
        fresh.id = s->id;
        fresh.note = s->note;
        fresh.source = s->source;
        fresh.sink = s->sink;
        fresh.extra = s->extra;
        apply(tr("kind"), [&](Step& st) { st = fresh; });
    });
    connect(at_, &QComboBox::activated, this, [this] {
        const auto a = HeatingAt(at_->currentData().toInt());
        apply(tr("heating path"), [&](Step& s) {
            // Constant pressure is the default and is written only when chosen.
            s.at = a == HeatingAt::ConstantPressure && !s.at ? std::nullopt
                                                             : std::optional<HeatingAt>(a);
        });
    });
    connect(path_, &QComboBox::activated, this, [this] {
        const auto p = PathKind(path_->currentData().toInt());
        apply(tr("path"), [&](Step& s) {
            s.path = p;
            if (p != PathKind::Polytropic) s.n.reset();
            else if (!s.n) s.n = Number{1.3, "1.3", false};
            if (p != PathKind::Adiabatic) s.efficiency.reset();
            else if (!s.efficiency) s.efficiency = Number{0.75, "0.75", false};
        });
    });
    // The field's check has passed; the field here only lets a fraction be
    // read from a percentage the way the check read it.
    auto numberCommit = [this](QuantityField* f, std::optional<Number> Step::*member,
                               const QString& name, BoundedField field) {
        connect(f, &QuantityField::committed, this, [this, member, name, field](const QString& t) {
            apply(name, [&](Step& s) {
                if (t.isEmpty()) {
                    (s.*member).reset();
                    return;
                }
                auto n = parseTypedNumber(t.toStdString(), field, "value");
                if (n) s.*member = *n;
            });
        });
    };
    numberCommit(fraction_, &Step::fraction, tr("fraction"), BoundedField::Fraction);
    numberCommit(n_, &Step::n, tr("exponent n"), BoundedField::PolytropicExponent);
    numberCommit(efficiency_, &Step::efficiency, tr("efficiency"), BoundedField::Efficiency);
    auto reservoirCommit = [this](QuantityField* f, std::optional<Reservoir> Step::*member,
                                  const QString& name) {
        connect(f, &QuantityField::committed, this, [this, member, name](const QString& t) {
            apply(name, [&](Step& s) {
                if (t.isEmpty()) {
                    if (s.*member && (s.*member)->utility) (s.*member)->T.reset();
                    else (s.*member).reset();
                    return;
                }
                auto q = parseTypedQuantity(t.toStdString(), Dimension::Temperature, doc_->project());
                if (!q) return;
                if (!(s.*member)) s.*member = Reservoir{};
                (s.*member)->T = *q;
                // A typed temperature replaces a named utility: the file may carry one or the other.
                (s.*member)->utility.reset();
            });
        });
    };
    reservoirCommit(source_, &Step::source, tr("source temperature"));
    reservoirCommit(sink_, &Step::sink, tr("sink temperature"));
    // Choosing a utility replaces a typed temperature (a reservoir carries
    // one or the other); choosing "temperature…" drops the utility and puts
    // the cursor in the field for the value.
    auto utilityCommit = [this](QComboBox* box, QuantityField* field, std::optional<Reservoir> Step::*member,
                                const QString& name) {
        connect(box, &QComboBox::activated, this, [this, box, field, member, name] {
            const QString id = box->currentData().toString();
            const Step* s = step();
            if (!s) return;
            const auto& cur = s->*member;
            if (id.isEmpty()) {
                if (cur && cur->utility) apply(name, [&](Step& st) { (st.*member).reset(); });
                field->lineEdit()->setFocus();
                return;
            }
            if (cur && cur->utility && *cur->utility == id.toStdString()) return;
            apply(name, [&](Step& st) {
                Reservoir r;
                if (st.*member) r.extra = (st.*member)->extra;
                r.utility = id.toStdString();
                st.*member = r;
            });
        });
    };
    utilityCommit(sourceUtility_, source_, &Step::source, tr("source utility"));
    utilityCommit(sinkUtility_, sink_, &Step::sink, tr("sink utility"));
    connect(note_, &QuantityField::committed, this, [this](const QString& t) {
        apply(tr("comment"), [&](Step& s) {
            if (t.isEmpty()) s.note.reset();
            else s.note = t.toStdString();
        });
    });

    connect(doc_, &ProjectDocument::changed, this, &StepEditor::refresh);
    connect(doc_, &ProjectDocument::selectionChanged, this, [this] {
        problem_->hide();  // it was about the step selected before
        refresh();
    });
    refresh();
}

QString StepEditor::problem() const { return problem_->isHidden() ? QString() : problem_->text(); }

QuantityField* StepEditor::field(const QString& name) const {
    if (name == QLatin1String("id")) return id_;
    if (name == QLatin1String("target")) return target_;
    if (name == QLatin1String("source")) return source_;
    if (name == QLatin1String("sink")) return sink_;
    if (name == QLatin1String("fraction")) return fraction_;
    if (name == QLatin1String("n")) return n_;
    if (name == QLatin1String("efficiency")) return efficiency_;
    if (name == QLatin1String("note")) return note_;
    return transfer_->field(name);
}

const Step* StepEditor::step() const {
    const int i = doc_->selectedStep();
    if (i < 0 || i >= int(doc_->project().steps.size())) return nullptr;
    return &doc_->project().steps[std::size_t(i)];
}

StepEditor::Target StepEditor::currentTarget() const {
    return Target(targetKind_->currentData().toInt());
}

QString StepEditor::checkTarget(const QString& text, Target t) const {
    const Project& p = doc_->project();
    if (t == Target::Rated) return {};
    if (text.isEmpty()) return tr("this step needs a target value");
    const std::string s = text.toStdString();
    switch (t) {
    case Target::Temperature: {
        auto q = parseTypedQuantity(s, Dimension::Temperature, p);
        return q ? QString() : qs(q.error().message);
    }
    case Target::Pressure: {
        auto q = parseTypedQuantity(s, Dimension::Pressure, p);
        return q ? QString() : qs(q.error().message);
    }
    case Target::Duty: {
        auto q = parseTypedQuantity(s, dutyDimension(p), p);
        return q ? QString() : qs(q.error().message);
    }
    case Target::Quality: {
        auto n = parseTypedNumber(s, BoundedField::Quality, "the quality");
        return n ? QString() : qs(n.error().message);
    }
    case Target::Ratio: {
        auto n = parseTypedNumber(s, BoundedField::Ratio, "the pressure ratio");
        return n ? QString() : qs(n.error().message);
    }
    case Target::Time: {
        auto q = parseTypedQuantity(s, Dimension::Time, p);
        if (!q) return qs(q.error().message);
        return q->si > 0 ? QString() : tr("must be greater than zero");
    }
    case Target::Rated:
    case Target::None:
        return {};
    }
    return {};
}

void StepEditor::applyTarget(const QString& text) {
    const Target t = currentTarget();
    const Project& p = doc_->project();
    const std::string s = text.toStdString();
    StepTarget to;
    to.extra = step() ? step()->to.extra : UnknownFields{};
    switch (t) {
    case Target::Temperature: if (auto q = parseTypedQuantity(s, Dimension::Temperature, p)) to.T = *q; else return; break;
    case Target::Pressure: if (auto q = parseTypedQuantity(s, Dimension::Pressure, p)) to.P = *q; else return; break;
    case Target::Duty: if (auto q = parseTypedQuantity(s, dutyDimension(p), p)) to.duty = *q; else return; break;
    case Target::Quality: if (auto n = parseTypedNumber(s, BoundedField::Quality, "quality")) to.quality = *n; else return; break;
    case Target::Ratio: if (auto n = parseTypedNumber(s, BoundedField::Ratio, "ratio")) to.ratio = *n; else return; break;
    case Target::Time: if (auto q = parseTypedQuantity(s, Dimension::Time, p)) to.time = *q; else return; break;
    case Target::Rated: to.rated = true; break;
    case Target::None: return;
    }
    apply(tr("target"), [&](Step& st) {
        st.to = to;
    });
}

void StepEditor::apply(const QString& fieldName, const std::function<void(Step&)>& change) {
    if (filling_) return;
    const Step* s = step();
    if (!s) return;
    Step after = *s;
    change(after);
    // Held to the rules a saved file is: a rated target without an exchanger,
    // a utility the worksheet does not define, … are refused here, saying why.
    auto placed = placedStep(doc_->project(), doc_->selectedStep(), std::move(after), true);
    if (!placed) {
        const QString reason = qs(placed.error().message);
        problem_->setText(tr("Not applied (%1): %2").arg(fieldName, reason));
        problem_->show();
        emit rejected(tr("Step %1 not applied: %2").arg(fieldName, reason));
        refresh();
        return;
    }
    problem_->hide();
    doc_->undoStack()->push(new EditStepField(doc_, doc_->selectedStep(), std::move(*placed), fieldName));
}

void StepEditor::fillTargetChoices(StepKind k, Target current) {
    targetKind_->clear();
    switch (k) {
    case StepKind::Heat:
    case StepKind::Cool:
        targetKind_->addItem(tr("to temperature"), int(Target::Temperature));
        targetKind_->addItem(tr("duty"), int(Target::Duty));
        targetKind_->addItem(tr("to quality x"), int(Target::Quality));
        // From an exchanger (its transfer's U and area): what it reaches,
        // or for a batch, where it is after a time.
        targetKind_->addItem(tr("rated: what the exchanger reaches"), int(Target::Rated));
        if (doc_->project().system == SystemKind::Closed) targetKind_->addItem(tr("after a time"), int(Target::Time));
        break;
    case StepKind::Compress:
    case StepKind::Expand:
        targetKind_->addItem(tr("to pressure"), int(Target::Pressure));
        targetKind_->addItem(tr("pressure ratio"), int(Target::Ratio));
        break;
    case StepKind::Throttle:
        targetKind_->addItem(tr("to pressure"), int(Target::Pressure));
        break;
    default:
        break;
    }
    const int i = targetKind_->findData(int(current));
    if (i >= 0) targetKind_->setCurrentIndex(i);
}

void StepEditor::setRow(QWidget* w, bool visible) { formLayout_->setRowVisible(w, visible); }

void StepEditor::fillUtilityChoices(QComboBox* box, QuantityField* field, const std::optional<Reservoir>& r) {
    box->clear();
    box->addItem(tr("temperature…"), QString());
    for (const Utility& u : doc_->project().utilityList()) {
        box->addItem(qs(u.id), qs(u.id));
        if (u.name) box->setItemData(box->count() - 1, qs(*u.name), Qt::ToolTipRole);
    }
    int i = 0;
    if (r && r->utility) {
        i = box->findData(qs(*r->utility));
        if (i < 0) {  // named but not defined: show it, core reports the error
            box->addItem(tr("%1 (not defined)").arg(qs(*r->utility)), qs(*r->utility));
            i = box->count() - 1;
        }
    }
    box->setCurrentIndex(i);
    box->setEnabled(box->count() > 1);
    // The typed field stays for typing over a utility, but says what is in use.
    field->setPlaceholder(r && r->utility ? tr("or type a temperature instead of the utility")
                          : field == source_ ? tr("none (S_gen not charged to a source)")
                                             : tr("none"));
}

void StepEditor::refresh() {
    const Step* s = step();
    const int index = doc_->selectedStep();
    {
        // An edit elsewhere on a long sheet leaves this panel as it was;
        // refilling it would relayout and repaint the dock on every edit.
        // The key: the selected step as saved, its results and the units.
        QString key = QString::number(index) + QLatin1Char('|') + QString::number(int(doc_->project().displayUnits)) +
                      QLatin1Char('|') + QString::number(doc_->project().steps.size());
        if (s) {
            Project one;
            one.steps.push_back(*s);
            key += QString::fromStdString(writeProject(one));
            if (index < int(doc_->result().steps.size())) {
                const StepResult& sr = doc_->result().steps[std::size_t(index)];
                for (double v : {sr.start.T, sr.start.P, sr.start.h, sr.start.s, sr.end.T, sr.end.P, sr.end.h, sr.end.s,
                                 sr.Q, sr.W, sr.dH, sr.dU, sr.dS, sr.Sgen, sr.exergyDestroyed})
                    key += QLatin1Char('|') + QString::number(v, 'g', 17);
                key += QString::number(int(sr.computed)) + phaseText(sr.start) + phaseText(sr.end);
                if (sr.error) key += QString::fromStdString(sr.error->message);
                for (const std::string& w : sr.warnings) key += QString::fromStdString(w);
                for (const std::string& n : notesOf(sr)) key += QString::fromStdString(n);
            }
        }
        if (key == shownKey_) return;
        shownKey_ = key;
    }
    filling_ = true;
    form_->setVisible(s != nullptr);
    resultBox_->setVisible(s != nullptr);
    empty_->setVisible(s == nullptr);
    if (!s) {
        header_->setText(tr("<b>No step selected</b>"));
        filling_ = false;
        return;
    }
    header_->setText(tr("<b>Step %1 of %2</b> &nbsp;·&nbsp; %3")
                         .arg(index + 1)
                         .arg(doc_->project().steps.size())
                         .arg(qs(s->id).toHtmlEscaped()));
    id_->showValue(qs(s->id));
    kind_->setCurrentIndex(kind_->findData(int(s->kind)));

    Target t = Target::None;
    QString targetText;
    if (s->to.T) { t = Target::Temperature; targetText = typedText(s->to.T); }
    else if (s->to.P) { t = Target::Pressure; targetText = typedText(s->to.P); }
    else if (s->to.duty) { t = Target::Duty; targetText = typedText(s->to.duty); }
    else if (s->to.quality) { t = Target::Quality; targetText = typedText(s->to.quality); }
    else if (s->to.ratio) { t = Target::Ratio; targetText = typedText(s->to.ratio); }
    else if (s->to.time) { t = Target::Time; targetText = typedText(s->to.time); }
    else if (s->to.rated) t = Target::Rated;
    fillTargetChoices(s->kind, t);
    target_->showValue(targetText);
    target_->setEnabled(t != Target::Rated);
    target_->setPlaceholder(t == Target::Rated ? tr("the area given below") : QString());
    const bool heatCool = s->kind == StepKind::Heat || s->kind == StepKind::Cool;
    const bool pressure = s->kind == StepKind::Compress || s->kind == StepKind::Expand;
    setRow(targetKind_->parentWidget(), targetKind_->count() > 0);
    setRow(at_, heatCool);
    at_->setCurrentIndex(at_->findData(int(s->at.value_or(HeatingAt::ConstantPressure))));
    setRow(fraction_, isPhaseChangeKind(s->kind));
    fraction_->showValue(typedText(s->fraction));
    transfer_->refresh(*s);
    setRow(path_, pressure);
    const PathKind path = s->path.value_or(PathKind::Isentropic);
    path_->setCurrentIndex(path_->findData(int(path)));
    setRow(n_, pressure && path == PathKind::Polytropic);
    n_->showValue(typedText(s->n));
    setRow(efficiency_, pressure && path == PathKind::Adiabatic);
    efficiency_->showValue(typedText(s->efficiency));
    source_->showValue(typedText(s->source));
    sink_->showValue(typedText(s->sink));
    fillUtilityChoices(sourceUtility_, source_, s->source);
    fillUtilityChoices(sinkUtility_, sink_, s->sink);
    note_->showValue(s->note ? qs(*s->note) : QString());

    // ---- result at a glance -------------------------------------------
    const SequenceResult& r = doc_->result();
    const UnitSystem u = doc_->project().displayUnits;
    const UnitContext ctx = displayContext(doc_->project());
    QVector<ResultTable::Row> rows;
    QString msgs;
    if (index < int(r.steps.size())) {
        const StepResult& sr = r.steps[std::size_t(index)];
        if (sr.computed) {
            const Dimension eD = energyDimension(r.system), sD = entropyDimension(r.system);
            rows.push_back({QString(), tr("start"), tr("end"), false, true});
            rows.push_back({tr("T"), formatWithUnit(sr.start.T, Dimension::Temperature, u, ctx),
                            formatWithUnit(sr.end.T, Dimension::Temperature, u, ctx)});
            rows.push_back({tr("P"), formatWithUnit(sr.start.P, Dimension::Pressure, u, ctx),
                            formatWithUnit(sr.end.P, Dimension::Pressure, u, ctx)});
            // Two-line phase text keeps the start/end columns inside the dock.
            const QStringList pa = phaseText(sr.start).split(QStringLiteral(", "));
            const QStringList pb = phaseText(sr.end).split(QStringLiteral(", "));
            for (qsizetype k = 0; k < std::max(pa.size(), pb.size()); ++k)
                rows.push_back({k == 0 ? tr("phase") : QString(), k < pa.size() ? pa[k] : QString(),
                                k < pb.size() ? pb[k] : QString()});
            rows.push_back({tr("h"), formatWithUnit(sr.start.h, Dimension::SpecificEnergy, u, ctx),
                            formatWithUnit(sr.end.h, Dimension::SpecificEnergy, u, ctx)});
            rows.push_back({tr("s"), formatWithUnit(sr.start.s, Dimension::SpecificEntropy, u, ctx),
                            formatWithUnit(sr.end.s, Dimension::SpecificEntropy, u, ctx)});
            rows.push_back({QString(), QString(), QString(), true});
            rows.push_back({tr("Q"), formatWithUnit(sr.Q, eD, u, ctx)});
            rows.push_back({tr("W"), formatWithUnit(sr.W, eD, u, ctx)});
            rows.push_back({tr("ΔH"), formatWithUnit(sr.dH, eD, u, ctx)});
            rows.push_back({tr("ΔU"), formatWithUnit(sr.dU, eD, u, ctx)});
            rows.push_back({tr("ΔS"), formatWithUnit(sr.dS, sD, u, ctx)});
            rows.push_back({tr("S_gen"), formatWithUnit(sr.Sgen, sD, u, ctx)});
            if (noSourceGiven(sr)) {
                rows.push_back({tr("Exergy destroyed"), noSourceText()});
            } else {
                rows.push_back({tr("Exergy destroyed"), formatWithUnit(sr.exergyDestroyed, eD, u, ctx)});
            }
            if (r.exergyAvailable && !noSourceGiven(sr)) {
                rows.push_back({tr("Exergy supplied"), formatWithUnit(sr.exergySupplied, eD, u, ctx)});
                rows.push_back({tr("η_II"), efficiencyText(sr.secondLawEfficiency)});
            }
            if (sr.utility) {
                const StepUtility& su = *sr.utility;
                const bool tight = approachBelowRequired(su, doc_->project().minApproachK());
                rows.push_back({QString(), QString(), QString(), true});
                rows.push_back({su.asSource ? tr("Source") : tr("Sink"), qs(su.id), utilityKindText(su.kind)});
                rows.push_back({tr("Uses"), utilityUseText(su.kind, su.mass, su.volume, r.system, u, ctx),
                                su.volume ? utilityMassText(su.kind, su.mass, r.system, u, ctx) : QString()});
                rows.push_back({tr("Closest approach"),
                                formatWithUnit(su.minApproach, Dimension::TemperatureDifference, u, ctx) +
                                    (tight ? tr(" (below the required minimum)") : QString()),
                                approachWhereText(sr)});
            }
        } else {
            rows.push_back({tr("Not computed."), QString(), QString()});
        }
        if (sr.error)
            msgs += QStringLiteral("<p style='color:#b42318'><b>Error:</b> %1</p>")
                        .arg(qs(sr.error->message).toHtmlEscaped());
        for (const std::string& w : sr.warnings)
            msgs += QStringLiteral("<p style='color:#8a5a00'><b>Warning:</b> %1</p>")
                        .arg(qs(w).toHtmlEscaped());
        for (const std::string& n : notesOf(sr))
            msgs += QStringLiteral("<p style='color:#6b727a'>Note: %1</p>").arg(qs(n).toHtmlEscaped());
    }
    resultText_->setRows(std::move(rows));
    if (messages_->text() != msgs) messages_->setText(msgs);
    messages_->setVisible(!msgs.isEmpty());
    filling_ = false;
}

}  // namespace heatchain::gui
