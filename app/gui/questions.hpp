#pragma once
// The questions the window asks the user, and their possible answers. Tests
// inject the answers (MainWindow::setAsker) instead of pressing buttons.
#include <QString>
#include <QWidget>
#include <functional>

namespace heatchain::gui {

enum class Question { UnsavedChanges, ChangedOnDisk, Recover };
enum class Answer { Save, Discard, Cancel, Overwrite, SaveAs, Recover, Later };
using Asker = std::function<Answer(Question, const QString& text)>;

// Asks in a message box over `parent`: the text's first paragraph is the
// question, the rest its explanation; the buttons are the question's answers.
Answer askInDialog(QWidget* parent, Question q, const QString& text);

// What the helpers of the window need from it: ask a question, report an
// error (a dialog, or recorded when no one is there to press OK), a line for
// the status bar, and word that the last reported error no longer applies
// (an open, export or comparison that then succeeded).
struct WindowHooks {
    std::function<Answer(Question, const QString&)> ask;
    std::function<bool()> confirmDiscard;
    std::function<void(const QString& title, const QString& text)> reportError;
    std::function<void(const QString& text, int ms)> status;
    std::function<void()> clearError = [] {};
};

}  // namespace heatchain::gui
