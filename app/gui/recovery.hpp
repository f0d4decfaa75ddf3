#pragma once
// Autosave and recovery: writes the worksheet every minute (default) into the
// autosave folder while it holds unsaved work, and at start-up offers what a
// session that did not close cleanly left behind (Recover / Discard / Later).
// Never writes the worksheet's own file.
#include <QObject>
#include <QTimer>
#include <memory>

#include "autosave.hpp"
#include "document.hpp"
#include "questions.hpp"

namespace heatchain::gui {

class AutosaveKeeper : public QObject {
    Q_OBJECT
public:
    AutosaveKeeper(ProjectDocument* doc, WindowHooks hooks, QObject* parent = nullptr);

    void setInterval(int ms) { timer_.setInterval(ms); }
    int interval() const { return timer_.interval(); }
    void setFolder(const QString& folder);
    AutosaveStore* store() const { return store_.get(); }

    // Writes the autosave now if there is anything to lose; removes it when
    // the worksheet is saved and unedited.
    void autosaveNow();
    // Offers the newest autosave of an earlier session; true when recovered.
    bool offerRecovery();
    // Saved or closed cleanly: nothing left to protect.
    void forget() { store_->remove(); }
    void stop() { timer_.stop(); }

private:
    ProjectDocument* doc_;
    WindowHooks hooks_;
    QTimer timer_;
    std::unique_ptr<AutosaveStore> store_;
};

}  // namespace heatchain::gui
