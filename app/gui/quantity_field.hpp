#pragma once
// A text field for a typed quantity ("6 barg", "180 degC") or number. On
// Enter or leaving the field the text is checked by `check`; invalid text
// stays in the field, marked, with core's reason beneath it, and is not
// applied. Valid, changed text is announced by committed().
#include <QLabel>
#include <QLineEdit>
#include <QWidget>
#include <functional>

#include "locale_decimal.hpp"

namespace heatchain::gui {

class QuantityField : public QWidget {
    Q_OBJECT
public:
    // Returns an empty string when `text` is acceptable, else the reason.
    using Check = std::function<QString(const QString& text)>;

    explicit QuantityField(QWidget* parent = nullptr);
    // The wrapped error label would make the field height-for-width; Qt 6.4's
    // QFormLayout then writes past its row arrays when such a field's error
    // shows while other rows are hidden (seen under valgrind in the step
    // panel). The field's own layout still wraps the label to its width.
    bool hasHeightForWidth() const override { return false; }
    void setCheck(Check check) { check_ = std::move(check); }
    void setPlaceholder(const QString& text) { edit_->setPlaceholderText(text); }
    // Shows the document's value (clears any error) unless the user is in
    // the middle of correcting an invalid entry in this field.
    void showValue(const QString& text);
    QString text() const { return fromLocaleDecimal(edit_->text()); }  // with the file's decimal point
    bool hasError() const { return !error_->isHidden(); }
    QString errorText() const { return error_->text(); }
    QLineEdit* lineEdit() const { return edit_; }
    // Checks the current text as if the user pressed Enter.
    void commit();

signals:
    void committed(const QString& text);
    // Text that failed its check on Enter or on leaving the field: the
    // entry is not applied, and the window says so (not only the field).
    void rejected(const QString& text, const QString& reason);

private:
    void setError(const QString& reason);
    QLineEdit* edit_;
    QLabel* error_;
    Check check_;
    QString shown_;
};

}  // namespace heatchain::gui
