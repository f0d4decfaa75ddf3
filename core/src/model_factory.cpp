// Chooses the property model for a substance. "reference" means the best the
// substance has: IAPWS-IF97 with ice Ih for water, the Tillner-Roth et al.
// (1993) equation of state for the library's ammonia, Peng–Robinson for every
// other substance with critical constants, else temperature-dependent cp.
#include "heatchain/models/ammonia.hpp"
#include "heatchain/models/peng_robinson.hpp"
#include "heatchain/models/simple_model.hpp"
#include "heatchain/models/water_model.hpp"
#include "heatchain/property_model.hpp"

namespace heatchain {

std::optional<std::string_view> referenceEquation(const Substance& substance) {
    if (substance.custom) return std::nullopt;
    if (substance.id == "water") return "IAPWS-IF97 with ice Ih";
    if (substance.id == "ammonia") return "the Tillner-Roth et al. (1993) ammonia equation";
    return std::nullopt;
}

Result<std::shared_ptr<const PropertyModel>> makeModel(ModelKind kind, const Substance& substance) {
    switch (kind) {
        case ModelKind::ConstantCp:
        case ModelKind::TemperatureDependentCp:
            return makeSimpleModel(substance, kind);
        case ModelKind::RealFluid:
            return makePengRobinsonModel(substance);
        case ModelKind::Reference:
            if (referenceEquation(substance)) {
                if (substance.id == "water") return makeWaterReferenceModel(substance);
                return makeAmmoniaReferenceModel(substance);
            }
            if (substance.critical && substance.cpVapor) return makePengRobinsonModel(substance);
            return makeSimpleModel(substance, ModelKind::TemperatureDependentCp);
    }
    return makeError("unknown model kind");
}

}  // namespace heatchain
