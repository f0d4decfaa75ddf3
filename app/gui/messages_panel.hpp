#pragma once
// Warnings and errors of the solved sequence, one line each with the step it
// belongs to; clicking a line selects that step.
#include <QStringList>
#include <QTreeWidget>

#include "document.hpp"

namespace heatchain::gui {

class MessagesPanel : public QTreeWidget {
    Q_OBJECT
public:
    explicit MessagesPanel(ProjectDocument* doc, QWidget* parent = nullptr);
    int errorCount() const { return errors_; }
    int warningCount() const { return warnings_; }

signals:
    void countsChanged(int errors, int warnings);

public slots:
    void refresh();

private:
    ProjectDocument* doc_;
    int errors_ = 0, warnings_ = 0;
    QStringList shown_;  // what the tree shows, to skip rebuilding it unchanged
};

}  // namespace heatchain::gui
