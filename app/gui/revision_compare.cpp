#include "revision_compare.hpp"

#include <QFileDialog>
#include <QFileInfo>

#include "compare_dialog.hpp"

namespace heatchain::gui {

RevisionCompare::RevisionCompare(ProjectDocument* doc, QWidget* dialogParent, WindowHooks hooks)
    : QObject(dialogParent), doc_(doc), dialogParent_(dialogParent), hooks_(std::move(hooks)) {}

CompareDialog* RevisionCompare::compareWith(const QString& path) {
    QString error;
    CompareDialog* d = CompareDialog::againstFile(*doc_, path, &error, dialogParent_);
    if (!d) hooks_.reportError(tr("Cannot compare"), error);
    else hooks_.clearError();
    return d;
}

void RevisionCompare::show(const QString& path) {
    if (CompareDialog* d = compareWith(path)) {
        d->setAttribute(Qt::WA_DeleteOnClose);
        d->show();
    }
}

void RevisionCompare::chooseAndShow() {
    const QString start = doc_->filePath().isEmpty() ? QStringLiteral(HEATCHAIN_SAMPLES_DIR) : QFileInfo(doc_->filePath()).path();
    const QString path = QFileDialog::getOpenFileName(dialogParent_, tr("Compare with worksheet"), start,
                                                      tr("Heatchain worksheets (*.hchain);;All files (*)"));
    if (!path.isEmpty()) show(path);
}

}  // namespace heatchain::gui
