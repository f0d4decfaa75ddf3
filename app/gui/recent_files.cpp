#include "recent_files.hpp"

#include <QAction>
#include <QFileInfo>
#include <QSettings>
#include <QStringList>

namespace heatchain::gui::recent {

namespace {
constexpr int kMaxRecent = 8;
}  // namespace

void remember(const QString& path) {
    QSettings s;
    QStringList list = s.value(QStringLiteral("recentFiles")).toStringList();
    const QString abs = QFileInfo(path).absoluteFilePath();
    list.removeAll(abs);
    list.prepend(abs);
    while (list.size() > kMaxRecent) list.removeLast();
    s.setValue(QStringLiteral("recentFiles"), list);
    s.setValue(QStringLiteral("lastFolder"), QFileInfo(abs).path());
}

QString lastFolder() {
    const QString last = QSettings().value(QStringLiteral("lastFolder")).toString();
    return !last.isEmpty() && QFileInfo(last).isDir() ? last : QString();
}

void fillMenu(QMenu* menu, const std::function<void(const QString&)>& open) {
    menu->clear();
    const QStringList list = QSettings().value(QStringLiteral("recentFiles")).toStringList();
    for (const QString& path : list) {
        QAction* a = menu->addAction(QFileInfo(path).fileName(), menu, [open, path] { open(path); });
        a->setToolTip(path);
        a->setEnabled(QFileInfo::exists(path));
    }
    if (list.isEmpty()) menu->addAction(QObject::tr("(none yet)"))->setEnabled(false);
}

}  // namespace heatchain::gui::recent
