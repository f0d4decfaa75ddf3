#include "document.hpp"

#include <QCryptographicHash>
#include <QDateTime>
#include <QElapsedTimer>
#include <QFile>
#include <QFileInfo>
#include <filesystem>

#include "heatchain/project_file.hpp"
#include "heatchain_view/palette.hpp"
#include "project_edit.hpp"

#include <array>
#include <unordered_map>

namespace heatchain::gui {

DiskStamp DiskStamp::ofBytes(const QByteArray& bytes, const QString& path) {
    DiskStamp d;
    const QFileInfo info(path);
    d.exists = true;
    d.size = bytes.size();
    d.modified = info.lastModified();
    d.sha256 = QCryptographicHash::hash(bytes, QCryptographicHash::Sha256);
    return d;
}

DiskStamp DiskStamp::of(const QString& path) {
    if (path.isEmpty()) return {};
    QFile f(path);
    if (!f.open(QIODevice::ReadOnly)) return {};
    // Hash rather than trust modification time and size alone: an edit of
    // the same length within the file system's time resolution changes
    // neither.
    return ofBytes(f.readAll(), path);
}

ProjectDocument::ProjectDocument(QObject* parent) : QObject(parent) {
    connect(&undo_, &QUndoStack::cleanChanged, this, &ProjectDocument::fileStateChanged);
    if (auto p = newProject()) {
        project_ = std::move(p.value());
    }
    recompute();
}

ProjectDocument::~ProjectDocument() {
    QObject::disconnect(&undo_, nullptr, this, nullptr);
    blockSignals(true);
}

void ProjectDocument::setSelectedStep(int index) {
    if (index < -1 || index >= int(project_.steps.size())) index = -1;
    if (index == selected_) return;
    selected_ = index;
    emit selectionChanged(selected_);
}

int ProjectDocument::indexOf(std::string_view stepId) const {
    for (std::size_t i = 0; i < project_.steps.size(); ++i)
        if (project_.steps[i].id == stepId) return int(i);
    return -1;
}

Status ProjectDocument::open(const QString& path) {
    // Stamp before reading: a change made between the two can then only
    // cause one needless question at Save, never a silent overwrite.
    DiskStamp stamp = DiskStamp::of(path);
    auto loaded = loadProject(std::filesystem::path(path.toStdString()));
    if (!loaded) return loaded.error();
    reset(std::move(loaded.value()), path);
    stamp_ = std::move(stamp);
    return Ok{};
}

bool ProjectDocument::fileChangedOnDisk() const {
    if (filePath_.isEmpty() || !stamp_.exists) return false;
    const QFileInfo info(filePath_);
    if (!info.exists()) return true;
    // A different size settles it; otherwise the content decides (a touched
    // but unchanged file is not a change worth a question).
    if (info.size() != stamp_.size) return true;
    return !(DiskStamp::of(filePath_) == stamp_);
}

void ProjectDocument::markModified() {
    if (dirty_) return;
    dirty_ = true;
    emit fileStateChanged();
}

Status ProjectDocument::saveAs(const QString& path) {
    if (isModified()) {
        // Stamp the revision time only when something was edited, so saving an
        // untouched worksheet writes the same bytes it was read from.
        project_.meta.modified =
            QDateTime::currentDateTimeUtc().toString(Qt::ISODate).toStdString();
    }
    const std::string bytes = writeProject(project_);
    auto st = writeFileAtomically(std::filesystem::path(path.toStdString()), bytes, true);
    if (!st) return st;
    filePath_ = path;
    stamp_ = DiskStamp::ofBytes(QByteArray::fromStdString(bytes), path);
    dirty_ = false;
    undo_.setClean();
    emit fileStateChanged();
    return Ok{};
}

void ProjectDocument::reset(Project project, const QString& path) {
    undo_.clear();
    project_ = std::move(project);
    filePath_ = path;
    stamp_ = DiskStamp::of(path);
    dirty_ = false;
    selected_ = project_.steps.empty() ? -1 : 0;
    colours_.clear();
    for (std::size_t i = 0; i < project_.steps.size(); ++i) colours_.push_back(int(i) % view::kStepColourCount);
    recompute();
    emit changed();
    emit selectionChanged(selected_);
    emit fileStateChanged();
}

void ProjectDocument::setProject(Project project) {
    const std::vector<std::string> before = stepIds();
    project_ = std::move(project);
    keepColours(before);
    recompute();
    if (selected_ >= int(project_.steps.size())) selected_ = int(project_.steps.size()) - 1;
    emit changed();
}

void ProjectDocument::mutate(const std::function<void(Project&)>& change) {
    const std::vector<std::string> before = stepIds();
    change(project_);
    keepColours(before);
    recompute();
    if (selected_ >= int(project_.steps.size())) selected_ = int(project_.steps.size()) - 1;
    emit changed();
}

std::vector<std::string> ProjectDocument::stepIds() const {
    std::vector<std::string> ids;
    ids.reserve(project_.steps.size());
    for (const Step& s : project_.steps) ids.push_back(s.id);
    return ids;
}

void ProjectDocument::keepColours(const std::vector<std::string>& before) {
    const auto& steps = project_.steps;
    std::vector<int> now(steps.size(), -1);
    // A step keeps its colour by name; a renamed step (same place, same
    // number of steps) keeps its place's colour.
    std::unordered_map<std::string, int> byId;
    for (std::size_t i = 0; i < before.size() && i < colours_.size(); ++i) byId[before[i]] = colours_[i];
    for (std::size_t i = 0; i < steps.size(); ++i) {
        if (auto it = byId.find(steps[i].id); it != byId.end()) now[i] = it->second;
        else if (before.size() == steps.size() && i < colours_.size()) now[i] = colours_[i];
    }
    // A new step takes the colour used least, and never its neighbours'.
    for (std::size_t i = 0; i < steps.size(); ++i) {
        if (now[i] >= 0) continue;
        std::array<int, view::kStepColourCount> uses{};
        for (int c : now)
            if (c >= 0) ++uses[std::size_t(c)];
        int best = -1;
        for (int c = 0; c < view::kStepColourCount; ++c) {
            const bool neighbour = (i > 0 && now[i - 1] == c) || (i + 1 < steps.size() && now[i + 1] == c);
            if (neighbour) continue;
            if (best < 0 || uses[std::size_t(c)] < uses[std::size_t(best)]) best = c;
        }
        now[i] = best < 0 ? 0 : best;
    }
    colours_ = std::move(now);
}

QColor ProjectDocument::stepColour(int index) const {
    if (index >= 0 && index < int(colours_.size())) return view::stepColour(colours_[std::size_t(index)]);
    return view::stepColour(index);
}

std::vector<QColor> ProjectDocument::stepColours() const {
    std::vector<QColor> out;
    out.reserve(colours_.size());
    for (int c : colours_) out.push_back(view::stepColour(c));
    return out;
}

void ProjectDocument::recompute() {
    QElapsedTimer timer;
    timer.start();
    // The model depends only on the model kind and the substance; keep it
    // across edits of steps and states.
    std::string key(modelId(project_.model));
    key += '|';
    key += project_.substanceId;
    if (project_.customSubstanceJson) key += project_.customSubstanceJson->dump();
    if (key != modelKey_ || !model_) {
        auto made = makeModel(project_.model, project_.substance);
        model_ = made ? made.value() : nullptr;
        modelKey_ = key;
        dome_ = model_ ? saturationDome(*model_) : DomeCurve{};
    }
    result_ = model_ ? solve(project_, model_) : solve(project_);
    uncertainty_.reset();
    uncertaintyError_.clear();
    auto inputs = uncertainInputs(project_);
    hasUncertainInputs_ = inputs && !inputs->empty();
    if (!inputs) uncertaintyError_ = QString::fromStdString(inputs.error().message);
    if (uncertaintyShown_ && hasUncertainInputs_ && !result_.firstError()) {
        auto u = propagateUncertainty(project_);
        if (u) uncertainty_ = std::move(*u);
        else uncertaintyError_ = QString::fromStdString(u.error().message);
    }
    lastSolveMs_ = double(timer.nsecsElapsed()) / 1e6;
}

void ProjectDocument::setUncertaintyShown(bool shown) {
    if (shown == uncertaintyShown_) return;
    uncertaintyShown_ = shown;
    recompute();
    emit changed();
}

}  // namespace heatchain::gui
