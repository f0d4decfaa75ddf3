#pragma once
// The step panel's heat-transfer rows: the overall coefficient U, one U per
// kind of zone the step passes through (liquid, vapour, two-phase, solid,
// and the melting and sublimation lines), the area, UA instead of both, and a
// hold step's duration. Each edit is one undoable change of the step, made
// through the panel's own apply().
#include <QFormLayout>
#include <QObject>
#include <functional>
#include <string>
#include <vector>

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
    // One field per zone key of the file format, in the order a heat-up
    // meets them; a row shows while the step passes through that zone (or
    // gives its U) and has more than one zone.
    std::vector<std::pair<std::string, QuantityField*>> zoneFields_;
    std::vector<std::string> zonesShown_;  // the zones of the step last shown
};

}  // namespace heatchain::gui
