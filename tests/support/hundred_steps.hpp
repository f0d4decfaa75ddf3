#pragma once
// The 100-step worksheet the GUI's edit → redraw is measured on (the
// benchmark and the hand-run timing tool): liquid water heated and cooled by
// 10 K in turn, each step against a source or sink, so no step changes phase.
#include <string>

namespace heatchain::testing {

inline std::string hundredStepWorksheet() {
    std::string text = R"({"format":"heatchain-project","version":1,"meta":{"title":"100 steps"},)"
                       R"("display":{"units":"metric-engineering"},"system":"steady-flow",)"
                       R"("model":"reference","substance":"water","basis":{"massFlow":"1 kg/s"},)"
                       R"("start":{"T":"40 degC","P":"3 bar"},"steps":[)";
    for (int i = 0; i < 100; ++i) {
        if (i) text += ",";
        if (i % 2 == 0)
            text += R"({"id":"h)" + std::to_string(i) + R"(","kind":"heat","to":{"T":"50 degC"},"source":{"T":"90 degC"}})";
        else
            text += R"({"id":"c)" + std::to_string(i) + R"(","kind":"cool","to":{"T":"40 degC"},"sink":{"T":"20 degC"}})";
    }
    text += "]}";
    return text;
}

}  // namespace heatchain::testing
