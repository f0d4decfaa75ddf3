"""Heatchain from Python: load, edit, solve and sweep a thermal process worksheet.

    import heatchain
    p = heatchain.Project("boiler-feed.hchain")       # a path, a JSON string or a dict
    p.set("superheat", "to.T", "420 degC")           # same quantity strings as the file
    r = p.solve()                                    # same names and SI units as `compute --json`
    print(r["totals"]["Q"], r["steps"][0]["curve"]["T_K"])

Every failure raises heatchain.Error, carrying the same message, JSON path and
step as heatchain-cli.
"""
import json as _json
import math as _math
import os as _os
import re as _re

import numpy as _np

from . import _core

__version__ = _core.__version__
__all__ = ["Error", "Project", "load", "state", "substances", "__version__"]

_STEP_WHERE = _re.compile(r'step "((?:[^"\\]|\\.)*)" \((steps\[\d+\])\)(.*)$')


class Error(Exception):
    """A Heatchain error: what is wrong (`message`) and where.

    `where` is core's location text, as heatchain-cli prints it before the
    message; `path` the JSON path ("steps[2].to.T") or None; `step` the step
    id or None; `line`/`column` the 1-based position in the project text (0
    when unknown); `file` the file the project came from, if any. str(error)
    is the line heatchain-cli prints after "heatchain-cli: ".
    """

    def __init__(self, message, where="", line=0, column=0, file=""):
        self.message = message
        self.where = where or ""
        self.line = int(line)
        self.column = int(column)
        self.file = file or None
        location = self.where
        if self.file and location.startswith(self.file + ": "):
            location = location[len(self.file) + 2:]
        elif self.file and location == self.file:
            location = ""
        self.step = None
        self.path = None
        found = _STEP_WHERE.search(location)
        if found:
            self.step = found.group(1)
            self.path = found.group(2) + found.group(3)
        elif location:
            self.path = location
        super().__init__(self.text())

    def text(self):
        out = self.where
        if self.line > 0:
            out += (" " if out else "") + "(line %d" % self.line
            if self.column > 0:
                out += ", column %d" % self.column
            out += ")"
        return (out + ": " if out else "") + self.message


def _raise(message, where=""):
    raise Error(message, where)


class Project:
    """A Heatchain project (*.hchain), read with the same rules as the file.

    `source` is a path (str or os.PathLike naming an existing file), the
    project's JSON text, or a dict of the same shape.
    """

    def __init__(self, source):
        self.file = None
        if isinstance(source, dict):
            self._core = _core.parse(_json.dumps(source, ensure_ascii=False, indent=2), "")
        elif isinstance(source, (str, _os.PathLike)) and not str(source).lstrip().startswith("{"):
            self.file = _os.fspath(source)
            self._core = _core.load(self.file)
        elif isinstance(source, str):
            self._core = _core.parse(source, "")
        else:
            raise TypeError("heatchain.Project takes a path, a JSON string or a dict, not %s"
                            % type(source).__name__)

    # ---- reading and writing
    def to_json(self):
        """The project as the file writer writes it (same project, same bytes)."""
        return _core.write(self._core)

    def to_dict(self):
        return _json.loads(self.to_json())

    def save(self, path):
        """Writes the project atomically (the previous file is kept as <name>.bak)."""
        _core.save(self._core, _os.fspath(path))

    def __repr__(self):
        d = self.to_dict()
        return "<heatchain.Project %r, %d steps>" % (d.get("meta", {}).get("title", ""), len(d.get("steps", [])))

    # ---- steps and the start state, as written in the file
    @property
    def steps(self):
        """The steps as in the file: a list of dicts (copies; change them with set())."""
        return self.to_dict()["steps"]

    @property
    def step_ids(self):
        return [s["id"] for s in self.steps]

    def step(self, step_id):
        for s in self.steps:
            if s["id"] == step_id:
                return s
        _raise("no step %s; steps: %s" % (_json.dumps(step_id), ", ".join(self.step_ids)), "steps")

    @property
    def start(self):
        """The start state as in the file, e.g. {"T": "48 degC", "P": "1.4 bar"}."""
        return self.to_dict()["start"]

    def get(self, step_id, path):
        """The value at `path` ("to.T", "efficiency") of a step, or of the start for step_id "start"."""
        node, where = self._locate(self.to_dict(), step_id, path)
        keys = path.split(".")
        for k in keys:
            if not isinstance(node, dict) or k not in node:
                return None
            node = node[k]
        return node

    def set(self, step_id, path, value):
        """Sets `path` of a step (or of the start, for step_id "start") to `value`,
        a quantity string as in the file ("420 degC") or a number for
        dimensionless inputs; None removes it. The project is re-read with the
        file's rules, so a bad value raises Error naming the step and path."""
        d = self.to_dict()
        node, _ = self._locate(d, step_id, path)
        keys = path.split(".")
        for k in keys[:-1]:
            node = node.setdefault(k, {})
            if not isinstance(node, dict):
                _raise("%s is not an object" % k, path)
        if value is None:
            node.pop(keys[-1], None)
        else:
            node[keys[-1]] = value
        self._core = _core.parse(_json.dumps(d, ensure_ascii=False, indent=2), self.file or "")

    def _locate(self, d, step_id, path):
        if not path or any(not k for k in path.split(".")):
            _raise("empty input path %s" % _json.dumps(path))
        if step_id == "start":
            return d.setdefault("start", {}), "start"
        for i, s in enumerate(d.get("steps", [])):
            if s.get("id") == step_id:
                return s, "steps[%d]" % i
        _raise("no step %s; steps: %s" % (_json.dumps(step_id), ", ".join(s.get("id", "?") for s in d.get("steps", []))),
               "steps")

    # ---- computing
    def solve(self, check=True):
        """Solves the sequence. Returns a dict with the keys and SI units of
        `heatchain-cli compute --json`; each step also has "curve": NumPy
        arrays T_K, s_J_per_kgK, Q, P_Pa, h_J_per_kg along its path. When a
        step cannot be computed, raises Error (check=False returns the partial
        results, with the step's "error" as in the CLI's JSON)."""
        text, curves, first = _core.solve(self._core)
        results = _json.loads(text)
        for step, curve in zip(results["steps"], curves):
            step["curve"] = curve
        if first is not None and check:
            err = Error(*first, file=self.file or "")
            err.results = results
            raise err
        return results

    def uncertainty(self, method="linear", samples=10000, seed=1, contributions=None):
        """Propagates the tolerances typed on the worksheet's quantities (and
        the property model's, when the worksheet switches that on), as
        `heatchain-cli compute --json --uncertainty METHOD [--samples N]
        [--seed S] [--contributions OUTPUT]`: returns that JSON's
        "uncertainty" object (method "linear" or "montecarlo")."""
        text = _core.uncertainty(self._core, str(method), int(samples), int(seed), contributions or "")
        return _json.loads(text)

    def sweep(self, step, input, from_, to, points=11, outputs=None):
        """Varies one input of one step (or of the start, step="start") linearly
        from `from_` to `to` over `points` points and solves at each, as
        `heatchain-cli sweep --json`. Adds NumPy arrays: "x" (the input, SI)
        and "values" {output key: array, NaN where a point was not computed}."""
        if outputs is None:
            outputs = []
        elif isinstance(outputs, str):
            outputs = [o.strip() for o in outputs.split(",") if o.strip()]
        result = _json.loads(_core.sweep(self._core, step, input, str(from_), str(to), int(points), list(outputs)))
        pts = result["points"]
        result["x"] = _np.array([p["x"] for p in pts], dtype=float)
        result["values"] = {
            o["key"]: _np.array([_math.nan if p["values"][o["key"]] is None else p["values"][o["key"]] for p in pts],
                                dtype=float)
            for o in result["outputs"]
        }
        return result


def load(source):
    """A Project from a path, a JSON string or a dict."""
    return Project(source)


def state(substance, model="reference", **properties):
    """One state of a built-in substance from two properties given as in the
    CLI: state("water", T="180 degC", P="20 bar"). Keys and SI units as
    `heatchain-cli state --json`."""
    return _json.loads(_core.state(substance, {k: str(v) for k, v in properties.items()}, model))


def substances():
    """The built-in substance library, as `heatchain-cli substances --json`."""
    return _json.loads(_core.substances())
