// IAPWS-IF97 and ice Ih against python3-iapws run live (IAPWS97 and
// iapws._iapws._Ice). States are drawn in Python with a fixed seed, so the
// oracle and Heatchain see the same inputs; python3-iapws works in kJ/kg,
// MPa and K.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <sstream>
#include <string>
#include <vector>

#include "heatchain/models/if97.hpp"
#include "heatchain/models/water_model.hpp"
#include "support/python_oracle.hpp"

using namespace heatchain;

namespace {

std::shared_ptr<const PropertyModel> water() {
    Substance s;
    s.id = "water";
    s.name = "Water";
    return makeWaterReferenceModel(s).value();
}

struct Row {
    std::string kind;
    double a, b;           // inputs in SI
    double T, P, h, s, v;  // oracle output in SI
    double x;              // quality, or -1
};

// Draws the states and prints one line per state:
// kind a b T P h s v x   (SI units; x = -1 for single phase)
const char* kScript = R"PY(
import random, math
from iapws import IAPWS97
from iapws.iapws97 import _PSat_T, _TSat_P
random.seed(19970101)
out = []
def emit(kind, a, b, st):
    x = st.x if 0 < st.x < 1 else -1
    out.append("%s %.17g %.17g %.17g %.17g %.17g %.17g %.17g %.17g" % (kind, a, b, st.T, st.P*1e6, st.h*1e3, st.s*1e3, st.v, x))
def make(**kw):
    try:
        return IAPWS97(**kw)
    except Exception:
        return None
def tp(T, P):
    st = make(T=T, P=P/1e6)
    if st is not None and st.status: emit("TP", T, P, st)
    return st
n = 0
while n < 2400:
    r = random.random()
    if r < 0.2:     # region 1
        T = random.uniform(273.15, 623.15); P = random.uniform(_PSat_T(T)*1e6*1.02, 100e6)
        if T > 600 and P < 20e6: continue
    elif r < 0.45:  # region 2
        T = random.uniform(273.15, 1073.15)
        Pmax = 100e6
        if T < 623.15: Pmax = _PSat_T(T)*1e6*0.98
        elif T < 863.15: Pmax = (0.34805185628969e3 - 0.11671859879975e1*T + 0.10192970039326e-2*T*T)*1e6*0.98
        P = math.exp(random.uniform(math.log(1e3), math.log(Pmax)))
    elif r < 0.55:  # region 3
        T = random.uniform(623.15, 863.15)
        Pb = (0.34805185628969e3 - 0.11671859879975e1*T + 0.10192970039326e-2*T*T)*1e6
        P = random.uniform(Pb*1.02, 100e6)
        if T < 647.096 and abs(P - _PSat_T(T)*1e6) < 0.5e6: continue
        if abs(T - 647.096) < 3 and abs(P - 22.064e6) < 2e6: continue
    elif r < 0.65:  # region 5
        T = random.uniform(1073.15, 2273.15); P = random.uniform(1e4, 50e6)
    else:
        T = None
    if T is not None:
        st = tp(T, P)
        if st is None or not st.status: continue
        n += 1
        # the same state through (P,h) and (P,s)
        out.append("PH %.17g %.17g %.17g %.17g %.17g %.17g %.17g -1" % (P, st.h*1e3, st.T, P, st.h*1e3, st.s*1e3, st.v))
        out.append("PS %.17g %.17g %.17g %.17g %.17g %.17g %.17g -1" % (P, st.s*1e3, st.T, P, st.h*1e3, st.s*1e3, st.v))
        n += 2
        continue
    if r < 0.83:    # saturation by temperature
        T = random.uniform(273.16, 640.0); x = random.uniform(0, 1)
        st = make(T=T, x=x)
        if st is not None and st.status:
            emit("TX", T, x, st); n += 1
    else:           # saturation by pressure
        P = math.exp(random.uniform(math.log(700.0), math.log(20e6))); x = random.uniform(0, 1)
        st = make(P=P/1e6, x=x)
        if st is not None and st.status:
            emit("PX", P, x, st); n += 1
# More region 3 through (P,h) and (P,s) only, spread over the whole region
# (both sides of the critical isotherm, near the B23 and 623.15 K edges),
# since the direct (rho, T) Newton path there is the newest code.
m = 0
while m < 400:
    T = random.uniform(623.2, 863.1)
    Pb = (0.34805185628969e3 - 0.11671859879975e1*T + 0.10192970039326e-2*T*T)*1e6
    P = random.uniform(max(Pb*1.002, _PSat_T(623.15)*1e6*1.001), 100e6)
    if T < 647.096 and abs(P - _PSat_T(T)*1e6) < 0.3e6: continue
    if abs(T - 647.096) < 3 and abs(P - 22.064e6) < 2e6: continue
    st = make(T=T, P=P/1e6)
    if st is None or not st.status or st.region != 3: continue
    out.append("PH %.17g %.17g %.17g %.17g %.17g %.17g %.17g -1" % (P, st.h*1e3, st.T, P, st.h*1e3, st.s*1e3, st.v))
    out.append("PS %.17g %.17g %.17g %.17g %.17g %.17g %.17g -1" % (P, st.s*1e3, st.T, P, st.h*1e3, st.s*1e3, st.v))
    m += 1
for line in out: print(line)
)PY";

const char* kIceScript = R"PY(
import random
from iapws._iapws import _Ice
random.seed(20060101)
for i in range(300):
    T = random.uniform(50.0, 273.16); P = random.uniform(1e3, 200e6)
    st = _Ice(T, P/1e6)
    print("%.17g %.17g %.17g %.17g %.17g" % (T, P, st["h"]*1e3, st["s"]*1e3, st["v"]))
)PY";

double rel(double a, double b) { return std::fabs(a - b) / std::max(std::fabs(b), 1e-300); }

}  // namespace

TEST(If97AgainstIapws, RandomStatesAllRegionsAndInputPairs) {
    const std::string out = heatchain::testing::runPython(kScript);
    std::istringstream in(out);
    std::vector<Row> rows;
    for (std::string line; std::getline(in, line);) {
        std::istringstream ls(line);
        Row r;
        if (ls >> r.kind >> r.a >> r.b >> r.T >> r.P >> r.h >> r.s >> r.v >> r.x) rows.push_back(r);
    }
    ASSERT_GE(rows.size(), 2800u) << out.substr(0, 2000);
    auto m = water();
    double worst[3] = {0, 0, 0};
    std::string worstAt[3];
    double worst3 = 0;
    int count = 0;
    for (const auto& r : rows) {
        Result<State> s = makeError("unset");
        if (r.kind == "TP") s = m->stateTP(r.a, r.b);
        else if (r.kind == "PH") s = m->statePH(r.a, r.b);
        else if (r.kind == "PS") s = m->statePS(r.a, r.b);
        else if (r.kind == "TX") s = m->stateOnLineT(Transition::Boiling, r.a, r.b);
        else if (r.kind == "PX") s = m->stateOnLineP(Transition::Boiling, r.a, r.b);
        ASSERT_TRUE(s.ok()) << r.kind << " " << r.a << " " << r.b << ": " << s.error().text();
        ++count;
        // h near 0 (liquid near the triple point) is compared on a 1 kJ/kg scale.
        const double dh = std::fabs(s->h - r.h) / std::max(std::fabs(r.h), 1e3);
        const double ds = std::fabs(s->s - r.s) / std::max(std::fabs(r.s), 1.0);
        const double dv = rel(s->v, r.v);
        const double d[3] = {dh, ds, dv};
        const bool region3Saturation = (r.kind == "TX" || r.kind == "PX") && s->T > if97::T13;
        if (region3Saturation) {
            // Saturation inside region 3 (above 623.15 K): IF97 defines the
            // saturated densities as the roots of eq. 28 at p = ps(T). Ours
            // meet that to 1e-9; python3-iapws's do not (run live, its
            // saturated liquid at 624.1 K gives p3(rho, T) 2.4e-6 above
            // ps(T), as from a backward v(p,T) estimate), so here the
            // comparison is looser and the forward equation is checked instead.
            for (double f : {0.0, 1.0}) {
                auto end = r.kind == "TX" ? m->stateOnLineT(Transition::Boiling, r.a, f)
                                          : m->stateOnLineP(Transition::Boiling, r.a, f);
                ASSERT_TRUE(end.ok());
                const auto fwd = if97::region3(1.0 / end->v, end->T);
                EXPECT_NEAR(fwd.P, if97::saturationPressure(end->T), 1e-9 * fwd.P);
            }
            worst3 = std::max({worst3, dh, ds, dv});
            EXPECT_LT(dh, 1e-4) << r.kind << " " << r.a << " " << r.b;
            EXPECT_LT(ds, 1e-4) << r.kind << " " << r.a << " " << r.b;
            EXPECT_LT(dv, 1e-4) << r.kind << " " << r.a << " " << r.b;
            continue;
        }
        for (int k = 0; k < 3; ++k) {
            if (d[k] > worst[k]) {
                worst[k] = d[k];
                worstAt[k] = r.kind + " " + std::to_string(r.a) + " " + std::to_string(r.b);
            }
        }
        EXPECT_LT(dh, 1e-8) << r.kind << " " << r.a << " " << r.b << " h " << s->h << " vs " << r.h;
        EXPECT_LT(ds, 1e-8) << r.kind << " " << r.a << " " << r.b << " s " << s->s << " vs " << r.s;
        EXPECT_LT(dv, 1e-8) << r.kind << " " << r.a << " " << r.b << " v " << s->v << " vs " << r.v;
        if (r.kind == "PH" || r.kind == "PS") {
            EXPECT_NEAR(s->T, r.T, 1e-6 * r.T) << r.kind << " " << r.a;
        }
    }
    std::printf("compared %d states; largest relative deviation h %.3g (%s), s %.3g (%s), v %.3g (%s)\n", count,
                worst[0], worstAt[0].c_str(), worst[1], worstAt[1].c_str(), worst[2], worstAt[2].c_str());
    std::printf("saturation inside region 3: largest relative deviation %.3g\n", worst3);
}

TEST(IceAgainstIapws, RandomStates) {
    const std::string out = heatchain::testing::runPython(kIceScript);
    std::istringstream in(out);
    auto m = water();
    int n = 0;
    double worst = 0;
    for (std::string line; std::getline(in, line);) {
        std::istringstream ls(line);
        double T, P, h, s, v;
        if (!(ls >> T >> P >> h >> s >> v)) continue;
        auto st = m->phaseState(Phase::Solid, T, P);
        ASSERT_TRUE(st.ok()) << st.error().text();
        const double dh = std::fabs(st->h - h) / std::fabs(h);
        const double ds = std::fabs(st->s - s) / std::fabs(s);
        const double dv = rel(st->v, v);
        worst = std::max({worst, dh, ds, dv});
        EXPECT_LT(dh, 1e-9) << T << " " << P;
        EXPECT_LT(ds, 1e-9) << T << " " << P;
        EXPECT_LT(dv, 1e-9) << T << " " << P;
        ++n;
    }
    EXPECT_EQ(n, 300) << out.substr(0, 1000);
    std::printf("compared %d ice states; largest relative deviation %.3g\n", n, worst);
}
