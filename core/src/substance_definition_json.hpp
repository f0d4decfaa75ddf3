#pragma once
// The JSON behind a custom substance's SubstanceDefinition, for the project
// file's reader and writer, resolveProject and the uncertainty statement.
#include "heatchain/json.hpp"
#include "heatchain/substance.hpp"

namespace heatchain {

struct SubstanceDefinition::Kept {
    Json object;
};

struct SubstanceDefinitionAccess {
    static const Json& json(const SubstanceDefinition& d);  // an empty object when none
    static SubstanceDefinition of(Json object);
};

}  // namespace heatchain
