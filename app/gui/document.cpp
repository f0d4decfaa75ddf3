#include "document.hpp"

#include <QCryptographicHash>
#include <QDateTime>
#include <QElapsedTimer>
#include <QFile>
#include <QFileInfo>
#include <filesystem>

#include "heatchain/project_file.hpp"
#include "heatchain/streams.hpp"
#include "heatchain_view/palette.hpp"
#include "project_edit.hpp"

#include <algorithm>
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
    Project blank;
    if (auto p = newProject()) blank = std::move(p.value());
    set_ = streamSetOf(std::move(blank));
    freshColours();
    recompute();
}

ProjectDocument::~ProjectDocument() {
    QObject::disconnect(&undo_, nullptr, this, nullptr);
    blockSignals(true);
}

void ProjectDocument::setSelectedStep(int index) {
    if (index < -1 || index >= int(project().steps.size())) index = -1;
    if (index == selected_) return;
    selected_ = index;
    emit selectionChanged(selected_);
}

int ProjectDocument::indexOf(std::string_view stepId) const {
    const auto& steps = project().steps;
    for (std::size_t i = 0; i < steps.size(); ++i)
        if (steps[i].id == stepId) return int(i);
    return -1;
}

int ProjectDocument::streamIndexOf(std::string_view streamId) const {
    for (std::size_t i = 0; i < set_.streams.size(); ++i)
        if (set_.streams[i].id == streamId) return int(i);
    return -1;
}

void ProjectDocument::setCurrentStream(int index, int step) {
    index = std::clamp(index, 0, streamCount() - 1);
    if (index == current_) {
        setSelectedStep(step);
        return;
    }
    current_ = index;
    selected_ = std::clamp(step, -1, int(project().steps.size()) - 1);
    recompute(/*solveStreams=*/false);
    emit changed();
    emit selectionChanged(selected_);
}

Status ProjectDocument::open(const QString& path) {
    // Stamp before reading: a change made between the two can then only
    // cause one needless question at Save, never a silent overwrite.
    DiskStamp stamp = DiskStamp::of(path);
    auto loaded = loadStreamSet(std::filesystem::path(path.toStdString()));
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

std::string ProjectDocument::fileText() const { return writeStreamSet(set_); }

Status ProjectDocument::saveAs(const QString& path) {
    if (isModified()) {
        // Stamp the revision time only when something was edited, so saving an
        // untouched worksheet writes the same bytes it was read from.
        current().meta.modified = QDateTime::currentDateTimeUtc().toString(Qt::ISODate).toStdString();
        adoptShared();
    }
    const std::string bytes = fileText();
    auto st = writeFileAtomically(std::filesystem::path(path.toStdString()), bytes, true);
    if (!st) return st;
    filePath_ = path;
    stamp_ = DiskStamp::ofBytes(QByteArray::fromStdString(bytes), path);
    dirty_ = false;
    undo_.setClean();
    emit fileStateChanged();
    return Ok{};
}

void ProjectDocument::reset(Project project, const QString& path) { reset(streamSetOf(std::move(project)), path); }

void ProjectDocument::reset(StreamSet set, const QString& path) {
    undo_.clear();
    if (set.streams.empty()) set = streamSetOf(set.shared);  // never without a stream
    set_ = std::move(set);
    current_ = 0;
    filePath_ = path;
    stamp_ = DiskStamp::of(path);
    dirty_ = false;
    selected_ = project().steps.empty() ? -1 : 0;
    freshColours();
    recompute();
    emit changed();
    emit selectionChanged(selected_);
    emit fileStateChanged();
}

void ProjectDocument::setProject(Project project) {
    mutate([&](Project& p) { p = std::move(project); });
}

void ProjectDocument::mutate(const std::function<void(Project&)>& change) {
    const std::vector<std::string> before = stepIds(current_);
    change(current());
    adoptShared();
    keepColours(current_, before);
    recompute();
    if (selected_ >= int(project().steps.size())) selected_ = int(project().steps.size()) - 1;
    emit changed();
}

void ProjectDocument::setStreams(StreamSet set, int current, int selected) {
    if (set.streams.empty()) return;
    // Colours follow the stream by its id, the step by its name.
    std::unordered_map<std::string, std::pair<std::vector<std::string>, std::vector<int>>> old;
    for (std::size_t i = 0; i < set_.streams.size() && i < colours_.size(); ++i)
        old[set_.streams[i].id] = {stepIds(int(i)), colours_[i]};
    // Several streams are written as version 2; a set that comes back to one
    // plain stream is written as version 1 again (writeStreamSet decides).
    if (set.streams.size() > 1) set.version = kStreamsFormatVersion;
    set_ = std::move(set);
    colours_.assign(set_.streams.size(), {});
    for (std::size_t i = 0; i < set_.streams.size(); ++i) {
        if (auto it = old.find(set_.streams[i].id); it != old.end()) {
            colours_[i] = it->second.second;
            keepColours(int(i), it->second.first);
        } else {
            keepColours(int(i), {});
        }
    }
    current_ = std::clamp(current, 0, streamCount() - 1);
    selected_ = std::clamp(selected, -1, int(project().steps.size()) - 1);
    recompute();
    emit changed();
    emit selectionChanged(selected_);
}

void ProjectDocument::adoptShared() {
    // Field by field: copying the whole project (its steps) on every edit
    // would cost a long worksheet time for nothing.
    set_.takeShared(project());
}

std::vector<std::string> ProjectDocument::stepIds(int stream) const {
    std::vector<std::string> ids;
    if (stream < 0 || stream >= streamCount()) return ids;
    const auto& steps = set_.streams[std::size_t(stream)].project.steps;
    ids.reserve(steps.size());
    for (const Step& s : steps) ids.push_back(s.id);
    return ids;
}

void ProjectDocument::freshColours() {
    colours_.assign(set_.streams.size(), {});
    for (std::size_t k = 0; k < set_.streams.size(); ++k)
        for (std::size_t i = 0; i < set_.streams[k].project.steps.size(); ++i)
            colours_[k].push_back(int(i) % view::kStepColourCount);
}

void ProjectDocument::keepColours(int stream, const std::vector<std::string>& before) {
    if (colours_.size() != set_.streams.size()) colours_.resize(set_.streams.size());
    const auto& steps = set_.streams[std::size_t(stream)].project.steps;
    std::vector<int>& colours = colours_[std::size_t(stream)];
    std::vector<int> now(steps.size(), -1);
    // A step keeps its colour by name; a renamed step (same place, same
    // number of steps) keeps its place's colour.
    std::unordered_map<std::string, int> byId;
    for (std::size_t i = 0; i < before.size() && i < colours.size(); ++i) byId[before[i]] = colours[i];
    for (std::size_t i = 0; i < steps.size(); ++i) {
        if (auto it = byId.find(steps[i].id); it != byId.end()) now[i] = it->second;
        else if (before.size() == steps.size() && i < colours.size()) now[i] = colours[i];
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
    colours = std::move(now);
}

QColor ProjectDocument::stepColour(int stream, int index) const {
    if (stream >= 0 && stream < int(colours_.size())) {
        const std::vector<int>& colours = colours_[std::size_t(stream)];
        if (index >= 0 && index < int(colours.size())) return view::stepColour(colours[std::size_t(index)]);
    }
    return view::stepColour(index);
}

std::vector<QColor> ProjectDocument::stepColours() const {
    std::vector<QColor> out;
    if (current_ >= int(colours_.size())) return out;
    out.reserve(colours_[std::size_t(current_)].size());
    for (int c : colours_[std::size_t(current_)]) out.push_back(view::stepColour(c));
    return out;
}

namespace {
// The model depends only on the model kind and the substance.
std::string modelKeyOf(const Project& p) {
    std::string key(modelId(p.model));
    key += '|';
    key += p.substance.id;
    if (p.substance.definition) key += p.substance.definition->compact();
    return key;
}
}  // namespace

void ProjectDocument::recompute(bool solveStreams) {
    QElapsedTimer timer;
    timer.start();
    std::shared_ptr<const PropertyModel> currentModel;
    if (solveStreams) {
        // Models are kept across edits of steps and states (and shared by
        // streams of one material); one no stream uses any more is dropped.
        std::unordered_map<std::string, std::shared_ptr<const PropertyModel>> used;
        results_.clear();
        results_.reserve(set_.streams.size());
        for (const Stream& s : set_.streams) {
            const std::string key = modelKeyOf(s.project);
            auto it = used.find(key);
            if (it == used.end()) {
                auto old = models_.find(key);
                std::shared_ptr<const PropertyModel> model;
                if (old != models_.end()) {
                    model = old->second;
                } else if (auto made = makeModel(s.project.model, s.project.substance)) {
                    model = made.value();
                }
                it = used.emplace(key, std::move(model)).first;
            }
            results_.push_back(it->second ? solve(s.project, it->second) : solve(s.project));
        }
        models_ = std::move(used);
    }
    const std::string key = modelKeyOf(project());
    if (auto it = models_.find(key); it != models_.end()) currentModel = it->second;
    if (key != domeKey_) {
        dome_ = currentModel ? saturationDome(*currentModel) : DomeCurve{};
        domeKey_ = key;
    }
    uncertainty_.reset();
    uncertaintyError_.clear();
    auto inputs = uncertainInputs(project());
    hasUncertainInputs_ = inputs && !inputs->empty();
    if (!inputs) uncertaintyError_ = QString::fromStdString(inputs.error().message);
    if (uncertaintyShown_ && hasUncertainInputs_ && !result().firstError()) {
        auto u = propagateUncertainty(project());
        if (u) uncertainty_ = std::move(*u);
        else uncertaintyError_ = QString::fromStdString(u.error().message);
    }
    if (solveStreams) lastSolveMs_ = double(timer.nsecsElapsed()) / 1e6;
}

void ProjectDocument::setUncertaintyShown(bool shown) {
    if (shown == uncertaintyShown_) return;
    uncertaintyShown_ = shown;
    recompute(/*solveStreams=*/false);
    emit changed();
}

}  // namespace heatchain::gui
