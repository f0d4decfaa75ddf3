#pragma once
// The worksheets opened or saved lately (File ▸ Open recent) and the folder
// File ▸ Open starts in, kept in the application's settings.
#include <QMenu>
#include <QString>
#include <functional>

namespace heatchain::gui::recent {

// Puts `path` first in the list and remembers its folder.
void remember(const QString& path);
// The folder of the last worksheet opened or saved, empty when it is gone.
QString lastFolder();
// Fills `menu` with the list; choosing an entry calls `open` with its path.
void fillMenu(QMenu* menu, const std::function<void(const QString&)>& open);

}  // namespace heatchain::gui::recent
