#pragma once
// The step panel's heat-transfer rows: the overall coefficient U, the area,
// UA instead of both, and a hold step's duration. Each edit is one undoable
// change of the step, made through the panel's own apply().
#include <QFormLayout>
#include <QObject>
#include <functional>

#include "document.hpp"
#include "quantity_field.hpp"

namespace heatchain::gui {

class TransferFields : public QObject {
    Q_OBJECT
public:
    using Apply = std::function<void(const QString& fieldName, const std::function<void(Step&)>& change)>;
    TransferFields(ProjectDocument* doc, QWidget* form, QFormLayout* layout, Apply apply);
    // Shows the step's values; rows only where the kind takes them.
    void refresh(const Step& step);
    QuantityField* field(const QString& name) const;

private:
    ProjectDocument* doc_;
    QFormLayout* layout_;
    QuantityField* U_;
    QuantityField* area_;
    QuantityField* UA_;
    QuantityField* duration_;
};

}  // namespace heatchain::gui
