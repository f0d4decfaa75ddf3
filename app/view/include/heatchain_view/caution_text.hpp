#pragma once
// The cautions as the messages panel and the report show them: core decides
// which apply and words them (heatchain/cautions.hpp); this gives core the
// worksheet's display units and returns the sentences as QStrings.
#include <QStringList>

#include "heatchain/cautions.hpp"
#include "heatchain/project.hpp"

namespace heatchain::view {

QStringList processCautionText(const Project& project, const ProcessCautions& cautions);

}  // namespace heatchain::view
