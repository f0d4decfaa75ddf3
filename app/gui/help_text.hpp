#pragma once
// The window's help texts: the safety caution, the quick-add phrases,
// Help ▸ Getting started and Help ▸ About (the property model and the
// substance data with their sources).
#include <QString>
#include <QWidget>

#include "heatchain/project.hpp"
#include "heatchain/solver.hpp"

namespace heatchain::gui::help {

// The caution shown in the status bar and in About.
QString caution();
// The quick-add line's tooltip: a few phrases it understands.
QString quickAddTooltip();
// Help ▸ Getting started, as HTML.
QString gettingStartedHtml();
void showGettingStarted(QWidget* parent);
// Help ▸ About for the open worksheet.
void showAbout(QWidget* parent, const Project& project, const SequenceResult& result);

}  // namespace heatchain::gui::help
