#pragma once
// A dialog that edits the whole worksheet (the project settings, the
// utilities): OK builds the edited worksheet from the dialog's fields and
// applies it only when core's reader takes it (resolveProject), else shows
// core's reason in the dialog and stays open.
#include <QBoxLayout>
#include <QDialog>
#include <QLabel>
#include <optional>

#include "heatchain/project.hpp"

namespace heatchain::gui {

class WorksheetDialog : public QDialog {
    Q_OBJECT
public:
    // The edited project, once accepted.
    const std::optional<Project>& edited() const { return edited_; }
    // Builds and resolves the edited project; the reason when it cannot.
    QString tryBuild();
    // The reason shown for the last refused OK (empty when none).
    QString problem() const { return problem_->text(); }

    void accept() override;

protected:
    WorksheetDialog(const Project& project, QWidget* parent);
    // The worksheet as the fields have it, on top of `p` (a copy of the
    // worksheet the dialog opened with); the reason when a field is wrong.
    virtual QString build(Project& p) = 0;
    // Closes the dialog's layout: the line for the reason, then OK and Cancel.
    void finishLayout(QBoxLayout* outer);

    const Project base_;

private:
    std::optional<Project> edited_;
    QLabel* problem_;
};

}  // namespace heatchain::gui
