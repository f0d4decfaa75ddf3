# The Python module against the command line it mirrors, live reference
# libraries, and the laws: the same names and numbers as `compute --json`,
# edits with the file's quantity strings, errors like the CLI's.
import json
import math
import os

import numpy as np
import pytest

import heatchain
from conftest import cli, cli_json, sample

SAMPLES = ["melt-tank", "nitrogen-warmup", "compressor-aftercooler", "solvent-recovery", "boiler-feed",
           "ammonia-chiller"]


def without_curves(results):
    out = json.loads(json.dumps({k: v for k, v in results.items() if k != "steps"}))
    out["steps"] = [{k: v for k, v in s.items() if k != "curve"} for s in results["steps"]]
    return out


def test_version_is_the_build_version():
    r = cli("--version")
    assert r.stdout == "heatchain-cli %s\n" % heatchain.__version__


@pytest.mark.parametrize("name", SAMPLES)
def test_solve_gives_the_cli_results(name):
    # Same keys, same SI numbers as `heatchain-cli compute --json`.
    results = heatchain.Project(sample(name)).solve()
    assert without_curves(results) == cli_json("compute", sample(name), "--json")


def test_path_text_and_dict_load_the_same_project():
    path = sample("solvent-recovery")
    with open(path, encoding="utf-8") as f:
        text = f.read()
    a = heatchain.Project(path)
    b = heatchain.Project(text)
    c = heatchain.Project(json.loads(text))
    import pathlib
    d = heatchain.load(pathlib.Path(path))
    assert a.to_json() == b.to_json() == c.to_json() == d.to_json()
    assert a.file == path and b.file is None


def test_writing_is_the_file_writers_and_stable(tmp_path, boiler):
    written = boiler.to_json()
    # Same project, same bytes: reading what was written writes it again unchanged.
    assert heatchain.Project(written).to_json() == written
    out = tmp_path / "boiler.hchain"
    boiler.save(out)
    assert out.read_text(encoding="utf-8") == written
    # A saved file computes exactly as the original with the CLI.
    assert cli_json("compute", str(out), "--json") == cli_json("compute", sample("boiler-feed"), "--json")


def test_an_edit_changes_one_line_only(boiler):
    before = boiler.to_json().splitlines()
    step = [s["id"] for s in boiler.steps if "T" in s.get("to", {})][-1]
    assert isinstance(boiler.get(step, "to.T"), str)
    boiler.set(step, "to.T", "231.5 degC")
    after = boiler.to_json().splitlines()
    changed = [(x, y) for x, y in zip(before, after) if x != y]
    assert len(before) == len(after) and len(changed) == 1, changed
    assert "231.5 degC" in changed[0][1] and boiler.get(step, "to.T") == "231.5 degC"


def test_start_state_edits_and_the_solution_follows(boiler):
    boiler.set("start", "T", "50 degC")
    assert boiler.start["T"] == "50 degC"
    r = boiler.solve()
    # 50 degC = 323.15 K (ITS-90 offset, exact by definition of the Celsius scale).
    assert r["start"]["T_K"] == pytest.approx(323.15, abs=1e-9)


def test_state_matches_iapws97_live():
    iapws = pytest.importorskip("iapws")
    s = heatchain.state("water", T="180 degC", P="20 bar")
    ref = iapws.IAPWS97(T=453.15, P=2.0)  # region 1, python3-iapws run live
    assert s["h_J_per_kg"] == pytest.approx(ref.h * 1e3, rel=1e-9)
    assert s["s_J_per_kgK"] == pytest.approx(ref.s * 1e3, rel=1e-9)
    assert s["phase"] == "liquid"
    assert s == cli_json("state", "water", "T=180 degC", "P=20 bar", "--json")


def test_state_errors_are_heatchain_errors():
    with pytest.raises(heatchain.Error) as e:
        heatchain.state("water", T="180 degC", P="20 furlongs")
    assert e.value.path == "P" and "furlongs" in str(e.value)
    with pytest.raises(heatchain.Error, match="unknown substance"):
        heatchain.state("unobtainium", T="300 K", P="1 bar")
    with pytest.raises(heatchain.Error, match="unknown model"):
        heatchain.state("water", model="crystal-ball", T="300 K", P="1 bar")


def test_substances_are_the_cli_library():
    subs = heatchain.substances()
    assert subs == cli_json("substances", "--json")
    assert "water" in {s["id"] for s in subs}


def test_curves_are_numpy_arrays_along_each_step(boiler):
    r = boiler.solve()
    flow = r["system"] == "steady-flow"
    for step in r["steps"]:
        c = step["curve"]
        for key in ("T_K", "s_J_per_kgK", "Q", "P_Pa", "h_J_per_kg"):
            assert isinstance(c[key], np.ndarray) and c[key].dtype == np.float64
            assert len(c[key]) == len(c["T_K"]) > 1
        # The path ends where the step's end state is.
        assert c["T_K"][-1] == pytest.approx(step["end"]["T_K"], rel=1e-6)
        assert c["h_J_per_kg"][-1] == pytest.approx(step["end"]["h_J_per_kg"], rel=1e-6, abs=1e-3)
        # The cumulative heat along the path grows by the step's Q.
        assert c["Q"][-1] - c["Q"][0] == pytest.approx(step["Q"], rel=1e-6, abs=1e-6 * abs(r["totals"]["heatingDuty"]))
        # Energy balance (first law): steady flow dH = Q + W, closed dU = Q + W.
        lhs = step["dH"] if flow else step["dU"]
        assert lhs == pytest.approx(step["Q"] + step["W"], rel=1e-9, abs=1e-6)
        assert step["Sgen"] >= -1e-9 * max(1.0, abs(step["dS"]))  # second law


def test_bad_quantity_raises_with_the_clis_message_path_and_step():
    p = heatchain.Project(sample("melt-tank"))
    with pytest.raises(heatchain.Error) as e:
        p.set("to-pouring", "to.T", "78 furlongs")
    err = e.value
    assert err.step == "to-pouring"
    assert err.path == "steps[2].to.T"
    # The CLI says the same about the same text.
    text = json.loads(p.to_json())
    text["steps"][2]["to"]["T"] = "78 furlongs"
    r = cli("check", "-", stdin=json.dumps(text, ensure_ascii=False, indent=2))
    assert r.returncode == 3
    assert r.stderr.startswith("heatchain-cli: <stdin>: ")
    assert err.message in r.stderr and 'step "to-pouring" (steps[2]).to.T' in r.stderr
    # The project is unchanged by the failed edit.
    assert p.get("to-pouring", "to.T") == "78 degC"


def test_malformed_json_names_line_and_column():
    with pytest.raises(heatchain.Error) as e:
        heatchain.Project('{\n  "format": "heatchain-project",\n  oops\n}')
    assert e.value.line == 3 and e.value.column > 0
    r = cli("check", "-", stdin='{\n  "format": "heatchain-project",\n  oops\n}')
    assert r.returncode == 3 and str(e.value) in r.stderr


def test_file_errors_name_the_file(tmp_path):
    bad = tmp_path / "bad.hchain"
    bad.write_text('{ "format": "heatchain-project", "version": 99 }', encoding="utf-8")
    with pytest.raises(heatchain.Error) as e:
        heatchain.Project(str(bad))
    assert e.value.file == str(bad)
    r = cli("check", str(bad))
    assert r.returncode == 3 and r.stderr == "heatchain-cli: %s\n" % e.value
    with pytest.raises(heatchain.Error):
        heatchain.Project(str(tmp_path / "missing.hchain"))


def test_cannot_compute_raises_with_the_step():
    p = heatchain.Project(sample("melt-tank"))
    p.set("to-pouring", "to.T", "30 degC")  # heat the melt to below where it already is
    with pytest.raises(heatchain.Error) as e:
        p.solve()
    assert e.value.step == "to-pouring"
    partial = p.solve(check=False)
    assert "error" in [s for s in partial["steps"] if s["id"] == "to-pouring"][0]
    r = cli("compute", "-", "--json", stdin=p.to_json())
    assert r.returncode == 4 and str(e.value) in r.stderr


def test_unknown_step_raises():
    p = heatchain.Project(sample("melt-tank"))
    with pytest.raises(heatchain.Error, match='no step "nope"'):
        p.set("nope", "to.T", "30 degC")


def test_sweep_is_the_clis_and_re_solving_agrees():
    path = sample("solvent-recovery")
    p = heatchain.Project(path)
    s = p.sweep("superheat", "to.T", "115 degC", "135 degC", points=5)
    cli_s = cli_json("sweep", path, "--step", "superheat", "--input", "to.T", "--from", "115 degC",
                     "--to", "135 degC", "--points", "5", "--json")
    assert {k: v for k, v in s.items() if k not in ("x", "values")} == cli_s
    # 115..135 degC in 5 points: 388.15 K + 5 K steps (Celsius offset by definition).
    np.testing.assert_allclose(s["x"], np.linspace(388.15, 408.15, 5), rtol=0, atol=1e-9)
    # Each point equals solving the project with that value set by hand; a
    # point the sweep could not compute fails the same way by hand.
    assert 0 < s["computed"] < 5, "the range starts below the superheater inlet on purpose"
    for i, pt in enumerate(s["points"]):
        q = heatchain.Project(path)
        q.set("superheat", "to.T", pt["text"])
        if pt["error"] is None:
            assert s["values"]["total.Q"][i] == pytest.approx(q.solve()["totals"]["Q"], rel=1e-12)
        else:
            assert math.isnan(s["values"]["total.Q"][i])
            with pytest.raises(heatchain.Error) as e:
                q.solve()
            assert e.value.message in pt["error"] and e.value.step == "superheat"


def test_sweep_errors_raise():
    p = heatchain.Project(sample("solvent-recovery"))
    with pytest.raises(heatchain.Error):
        p.sweep("no-such-step", "to.T", "115 degC", "135 degC", points=5)
    with pytest.raises(heatchain.Error):
        p.sweep("superheat", "to.T", "115 degC", "135 degC", points=1)


def test_uncertainty_is_the_clis(tmp_path, boiler):
    # Tolerances on the feed temperature and the pump's efficiency: the
    # module's first-order and Monte Carlo answers are the CLI's, key for key.
    boiler.set("start", "T", "48 degC ± 2 K")
    boiler.set("feed-pump", "efficiency", "0.65 ± 0.03")
    path = tmp_path / "toleranced.hchain"
    boiler.save(path)
    for args, kwargs in ((["linear"], {"method": "linear"}),
                         (["montecarlo", "--samples", "400", "--seed", "7"],
                          {"method": "montecarlo", "samples": 400, "seed": 7})):
        expected = cli_json("compute", str(path), "--json", "--uncertainty", *args)["uncertainty"]
        got = boiler.uncertainty(**kwargs)
        assert got == expected


def test_uncertainty_contributions_add_up_to_the_variance(boiler):
    # First order (JCGM 100:2008, eq. 10): with independent inputs the squared
    # contributions make up the whole variance, so the shares sum to one.
    boiler.set("start", "T", "48 degC ± 2 K")
    boiler.set("feed-pump", "efficiency", "0.65 ± 0.03")
    u = boiler.uncertainty(contributions="steps.feed-pump.W")
    assert u["contributions"]["output"] == "steps.feed-pump.W"
    shares = [item["share"] for item in u["contributions"]["items"]]
    assert abs(sum(shares) - 1.0) < 1e-9
    # The pump's work hangs on its efficiency far more than on the feed temperature.
    assert u["contributions"]["items"][0]["input"] == "steps.feed-pump.efficiency"
