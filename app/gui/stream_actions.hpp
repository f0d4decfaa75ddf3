#pragma once
// The streams of a worksheet as user actions: add, remove, rename, reorder,
// and copy a step to another stream. Each is one undoable EditStreams
// command on the document. The main window and the canvas's lane menu call
// these; the dialogs ask for a stream's id and name.
#include <QMenu>
#include <QObject>
#include <QString>
#include <QWidget>

#include "document.hpp"

namespace heatchain::gui {

class StreamActions : public QObject {
    Q_OBJECT
public:
    StreamActions(ProjectDocument* doc, QWidget* parent);

    // A new stream after the current one, with the current stream's material,
    // model, basis and start state and no steps; it becomes current.
    bool addStream(const QString& id, const QString& name = {});
    bool removeStream(int index);
    // A new id (unique, not empty) and name (empty: none).
    bool renameStream(int index, const QString& id, const QString& name);
    bool moveStream(int from, int to);
    // Step `step` of the current stream, added at the end of stream
    // `toStream` (renamed when its id is taken there); that stream becomes
    // current with the copy selected.
    bool copyStep(int step, int toStream);

    // With the dialogs.
    void addStreamDialog();
    void renameStreamDialog(int index);

    // The Streams menu (filled afresh each time it opens).
    void fillMenu(QMenu* menu);

    // Why the last action was refused (empty when it was done).
    QString lastError() const { return lastError_; }
    // A stream id not used yet, from `base` ("stream", "stream-2", …).
    QString freeId(const QString& base) const;

signals:
    void refused(const QString& why);

private:
    bool refuse(const QString& why);
    bool askIdAndName(const QString& title, QString& id, QString& name);

    ProjectDocument* doc_;
    QWidget* parent_;
    QString lastError_;
};

}  // namespace heatchain::gui
