#include "quantity_field.hpp"

#include <QVBoxLayout>

#include "locale_decimal.hpp"

namespace heatchain::gui {

QuantityField::QuantityField(QWidget* parent) : QWidget(parent) {
    auto* lay = new QVBoxLayout(this);
    lay->setContentsMargins(0, 0, 0, 0);
    lay->setSpacing(1);
    edit_ = new QLineEdit(this);
    error_ = new QLabel(this);
    error_->setWordWrap(true);
    error_->setTextFormat(Qt::PlainText);
    // A wrapped reason takes the lines it needs; never clipped to one.
    error_->setSizePolicy(QSizePolicy::Preferred, QSizePolicy::MinimumExpanding);
    error_->setStyleSheet(QStringLiteral("color: #b42318; font-size: 8.5pt;"));
    error_->hide();
    lay->addWidget(edit_);
    lay->addWidget(error_);
    connect(edit_, &QLineEdit::editingFinished, this, &QuantityField::commit);
    connect(edit_, &QLineEdit::textEdited, this, [this](const QString& t) {
        // Typing again: once the text passes its check the reason goes; the
        // value is applied on Enter or on leaving the field.
        if (!hasError()) return;
        if (!check_ || check_(t.trimmed()).isEmpty()) setError({});
        else edit_->setStyleSheet(QStringLiteral("QLineEdit { background: #fff7e6; }"));
    });
}

void QuantityField::showValue(const QString& text) {
    if (hasError() && edit_->hasFocus()) return;
    shown_ = text;
    if (edit_->text() != toLocaleDecimal(text)) edit_->setText(toLocaleDecimal(text));
    setError({});
}

void QuantityField::commit() {
    const QString text = fromLocaleDecimal(edit_->text().trimmed());
    if (text == shown_ && !hasError()) return;
    const QString reason = check_ ? check_(text) : QString();
    if (!reason.isEmpty()) {
        setError(reason);
        emit rejected(text, reason);
        return;
    }
    setError({});
    shown_ = text;
    emit committed(text);
}

void QuantityField::setError(const QString& reason) {
    if (reason.isEmpty()) {
        error_->hide();
        error_->clear();
        edit_->setStyleSheet({});
        edit_->setToolTip({});
    } else {
        error_->setText(reason);
        error_->show();
        edit_->setStyleSheet(
            QStringLiteral("QLineEdit { border: 1px solid #b42318; background: #fdecea; }"));
        edit_->setToolTip(reason);
    }
}

}  // namespace heatchain::gui
