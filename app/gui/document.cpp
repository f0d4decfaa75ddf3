#include "document.hpp"

#include <QDateTime>
#include <QElapsedTimer>
#include <filesystem>

#include "heatchain/project_file.hpp"
#include "project_edit.hpp"

namespace heatchain::gui {

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
    auto loaded = loadProject(std::filesystem::path(path.toStdString()));
    if (!loaded) return loaded.error();
    reset(std::move(loaded.value()), path);
    return Ok{};
}

Status ProjectDocument::saveAs(const QString& path) {
    if (isModified()) {
        // Stamp the revision time only when something was edited, so saving an
        // untouched worksheet writes the same bytes it was read from.
        project_.meta.modified =
            QDateTime::currentDateTimeUtc().toString(Qt::ISODate).toStdString();
    }
    auto st = saveProject(project_, std::filesystem::path(path.toStdString()));
    if (!st) return st;
    filePath_ = path;
    undo_.setClean();
    emit fileStateChanged();
    return Ok{};
}

void ProjectDocument::reset(Project project, const QString& path) {
    undo_.clear();
    project_ = std::move(project);
    filePath_ = path;
    selected_ = project_.steps.empty() ? -1 : 0;
    recompute();
    emit changed();
    emit selectionChanged(selected_);
    emit fileStateChanged();
}

void ProjectDocument::setProject(Project project) {
    project_ = std::move(project);
    recompute();
    if (selected_ >= int(project_.steps.size())) selected_ = int(project_.steps.size()) - 1;
    emit changed();
}

void ProjectDocument::mutate(const std::function<void(Project&)>& change) {
    change(project_);
    recompute();
    if (selected_ >= int(project_.steps.size())) selected_ = int(project_.steps.size()) - 1;
    emit changed();
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
    lastSolveMs_ = double(timer.nsecsElapsed()) / 1e6;
}

}  // namespace heatchain::gui
