# Shared by the module's tests: where the sources, the samples and the built
# heatchain-cli are (ctest passes them in the environment), and a runner for
# the CLI the module is compared with.
import json
import os
import subprocess

import pytest

SOURCE_DIR = os.environ.get("HEATCHAIN_SOURCE_DIR",
                            os.path.abspath(os.path.join(os.path.dirname(__file__), "..", "..")))
CLI = os.environ.get("HEATCHAIN_CLI", "heatchain-cli")


def sample(name):
    return os.path.join(SOURCE_DIR, "sample-projects", name + ".hchain")


def cli(*args, stdin=None):
    return subprocess.run([CLI, *args], input=stdin, capture_output=True, text=True)


def cli_json(*args):
    r = cli(*args)
    assert r.returncode == 0, r.stderr
    return json.loads(r.stdout)


@pytest.fixture
def boiler():
    import heatchain
    return heatchain.Project(sample("boiler-feed"))
