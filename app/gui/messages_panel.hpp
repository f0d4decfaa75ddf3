#pragma once
// Errors, warnings, notes and cautions of the solved sequence, one line each
// with the step it belongs to; clicking a line selects that step. Each level
// can be hidden (the filter buttons above the list).
#include <QStringList>
#include <QTreeWidget>
#include <array>

#include "document.hpp"

namespace heatchain::gui {

class MessagesPanel : public QTreeWidget {
    Q_OBJECT
public:
    // error: cannot compute; warning: probably not what was meant; note: an
    // ordinary fact; caution: the substance or the path can hurt someone.
    enum class Level { Error, Warning, Note, Caution };
    static constexpr int kLevels = 4;

    explicit MessagesPanel(ProjectDocument* doc, QWidget* parent = nullptr);
    int errorCount() const { return counts_[0]; }
    int warningCount() const { return counts_[1]; }
    int noteCount() const { return counts_[2]; }
    int count(Level l) const { return counts_[std::size_t(l)]; }
    static QString levelName(Level l);

    void setLevelShown(Level l, bool shown);
    bool levelShown(Level l) const { return shown_[std::size_t(l)]; }
    // Lines shown now (for tests): "level|where|message".
    QStringList visibleLines() const;

signals:
    void countsChanged(int errors, int warnings);

public slots:
    void refresh();

private:
    void applyFilter();

    ProjectDocument* doc_;
    std::array<int, kLevels> counts_{};
    std::array<bool, kLevels> shown_{true, true, true, true};
    QStringList lines_;  // what the tree shows, to skip rebuilding it unchanged
};

}  // namespace heatchain::gui
