#include "worksheet_dialog.hpp"

#include <QDialogButtonBox>

#include "heatchain/project_file.hpp"

namespace heatchain::gui {

WorksheetDialog::WorksheetDialog(const Project& project, QWidget* parent)
    : QDialog(parent), base_(project), problem_(new QLabel(this)) {
    problem_->setWordWrap(true);
    problem_->setStyleSheet(QStringLiteral("color: #b42318;"));
    problem_->hide();
}

void WorksheetDialog::finishLayout(QBoxLayout* outer) {
    outer->addWidget(problem_);
    auto* buttons = new QDialogButtonBox(QDialogButtonBox::Ok | QDialogButtonBox::Cancel, this);
    connect(buttons, &QDialogButtonBox::accepted, this, &WorksheetDialog::accept);
    connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);
    outer->addWidget(buttons);
}

QString WorksheetDialog::tryBuild() {
    Project p = base_;
    if (QString reason = build(p); !reason.isEmpty()) return reason;
    // Core's reader recomputes every SI value (gauge pressures follow a new
    // atmosphere) and checks the whole worksheet, steps included.
    auto checked = resolveProject(p);
    if (!checked) return QString::fromStdString(checked.error().text());
    edited_ = std::move(checked.value());
    return {};
}

void WorksheetDialog::accept() {
    const QString reason = tryBuild();
    if (!reason.isEmpty()) {
        problem_->setText(reason);
        problem_->show();
        return;
    }
    QDialog::accept();
}

}  // namespace heatchain::gui
