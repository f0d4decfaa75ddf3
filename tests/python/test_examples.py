# The example script and the README's "From Python" example run as written,
# so neither can rot.
import os
import re
import struct
import subprocess
import sys

from conftest import SOURCE_DIR


def png_size(path):
    with open(path, "rb") as f:
        head = f.read(24)
    assert head[:8] == b"\x89PNG\r\n\x1a\n", "not a PNG"
    return struct.unpack(">II", head[16:24])


def test_sweep_plot_example(tmp_path):
    out = tmp_path / "sweep.png"
    script = os.path.join(SOURCE_DIR, "python", "examples", "superheat_sweep.py")
    r = subprocess.run([sys.executable, script, "-o", str(out)], capture_output=True, text=True)
    assert r.returncode == 0, r.stderr
    assert "11 of 11 points computed" in r.stdout
    assert png_size(out) == (640, 400)


def test_readme_from_python_example():
    with open(os.path.join(SOURCE_DIR, "README.md"), encoding="utf-8") as f:
        readme = f.read()
    section = readme.split("## From Python", 1)[1].split("\n## ", 1)[0]
    code = re.search(r"```python\n(.*?)```", section, re.S).group(1)
    assert len(code.strip().splitlines()) == 5, code
    r = subprocess.run([sys.executable, "-c", code], cwd=SOURCE_DIR, capture_output=True, text=True)
    assert r.returncode == 0, r.stderr
    assert r.stdout.strip(), "the example prints its results"
