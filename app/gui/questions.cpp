#include "questions.hpp"

#include <QAbstractButton>
#include <QList>
#include <QMessageBox>
#include <QPushButton>
#include <utility>

namespace heatchain::gui {

Answer askInDialog(QWidget* parent, Question q, const QString& text) {
    QMessageBox box(parent);
    box.setIcon(q == Question::Recover ? QMessageBox::Information : QMessageBox::Warning);
    box.setText(text.section(QStringLiteral("\n\n"), 0, 0));
    box.setInformativeText(text.section(QStringLiteral("\n\n"), 1));
    QList<std::pair<QAbstractButton*, Answer>> buttons;
    auto add = [&](const QString& label, QMessageBox::ButtonRole role, Answer a) {
        buttons.append({box.addButton(label, role), a});
        return buttons.back().first;
    };
    switch (q) {
    case Question::UnsavedChanges:
        box.setWindowTitle(QObject::tr("Unsaved changes"));
        box.setDefaultButton(qobject_cast<QPushButton*>(add(QObject::tr("&Save"), QMessageBox::AcceptRole, Answer::Save)));
        add(QObject::tr("&Don't save"), QMessageBox::DestructiveRole, Answer::Discard);
        add(QObject::tr("Cancel"), QMessageBox::RejectRole, Answer::Cancel);
        break;
    case Question::ChangedOnDisk:
        box.setWindowTitle(QObject::tr("File changed on disk"));
        add(QObject::tr("&Overwrite"), QMessageBox::DestructiveRole, Answer::Overwrite);
        box.setDefaultButton(qobject_cast<QPushButton*>(add(QObject::tr("Save &as…"), QMessageBox::AcceptRole, Answer::SaveAs)));
        add(QObject::tr("Cancel"), QMessageBox::RejectRole, Answer::Cancel);
        break;
    case Question::Recover:
        box.setWindowTitle(QObject::tr("Recover worksheet"));
        box.setDefaultButton(qobject_cast<QPushButton*>(add(QObject::tr("&Recover"), QMessageBox::AcceptRole, Answer::Recover)));
        add(QObject::tr("&Discard"), QMessageBox::DestructiveRole, Answer::Discard);
        add(QObject::tr("&Later"), QMessageBox::RejectRole, Answer::Later);
        break;
    }
    box.exec();
    for (const auto& [button, answer] : buttons)
        if (box.clickedButton() == button) return answer;
    return q == Question::Recover ? Answer::Later : Answer::Cancel;
}

}  // namespace heatchain::gui
