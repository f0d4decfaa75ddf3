#pragma once
// The selected step's result at a glance: a small three-column table (name,
// start, end) drawn directly. A rich-text label did the same with a text
// document whose layout, re-run on every edit, cost more than the solve.
#include <QString>
#include <QVector>
#include <QWidget>

namespace heatchain::gui {

class ResultTable : public QWidget {
    Q_OBJECT
public:
    struct Row {
        QString name, a, b;
        bool rule = false;    // a separating line instead of text
        bool header = false;  // column titles, in italics
    };
    explicit ResultTable(QWidget* parent = nullptr);
    void setRows(QVector<Row> rows);
    const QVector<Row>& rows() const { return rows_; }
    // The rows as tab-separated text (context menu "Copy").
    QString text() const;
    QSize sizeHint() const override { return hint_; }
    QSize minimumSizeHint() const override { return hint_; }

protected:
    void paintEvent(QPaintEvent*) override;
    void contextMenuEvent(QContextMenuEvent* e) override;

private:
    QVector<Row> rows_;
    int nameW_ = 0, aW_ = 0, bW_ = 0;
    QSize hint_{0, 0};
};

}  // namespace heatchain::gui
