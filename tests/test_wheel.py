"""The wheel carries everything a build needs: build it from a copy of the source tree, install it into
a fresh virtual environment and build a sheet there from a clean working directory, so a template or
data file that only the checkout has shows up as a failure (DESIGN.md §2).

Reference: the wheel format (PEP 427) and pip's install of it; the PDF is checked with pypdf.
The fresh environment sees the test run's own site-packages (for numpy, reportlab, ...) through a
.pth file, but not the checkout: buildsheet must come from the installed wheel.
"""

from __future__ import annotations

import importlib.util
import io
import os
import pathlib
import shutil
import subprocess
import sys
import sysconfig
import zipfile

import pypdf
import pytest

ROOT = pathlib.Path(__file__).resolve().parent.parent
SKIP = shutil.ignore_patterns(".git", ".venv", "out", "build", "dist", "*.egg-info", "__pycache__",
                              ".pytest_cache", ".hypothesis", ".benchmarks", "tests", "bench")


def _can_build_offline() -> bool:
    """setuptools builds a wheel without an isolated build environment when it has bdist_wheel: the
    `wheel` package, or setuptools 70.1 and later (which carry it)."""
    if importlib.util.find_spec("wheel") is not None:
        return True
    import setuptools
    major, minor = (int(p) for p in setuptools.__version__.split(".")[:2])
    return (major, minor) >= (70, 1)


@pytest.fixture(scope="module")
def wheel(tmp_path_factory) -> pathlib.Path:
    tmp = tmp_path_factory.mktemp("wheel")
    src = tmp / "src"
    shutil.copytree(ROOT, src, ignore=SKIP)
    command = [sys.executable, "-m", "pip", "wheel", "--no-deps", "-q", "-w", str(tmp / "dist"), str(src)]
    if _can_build_offline():
        command.insert(5, "--no-build-isolation")
    done = subprocess.run(command, capture_output=True, text=True, timeout=300)
    assert done.returncode == 0, done.stderr
    (built,) = (tmp / "dist").glob("buildsheet-*.whl")
    return built


def test_wheel_holds_the_templates_and_the_catalogue(wheel):
    names = set(zipfile.ZipFile(wheel).namelist())
    templates = {p.name for p in (ROOT / "templates").glob("*.j2")}
    assert templates and {f"buildsheet/templates/{t}" for t in templates} <= names
    assert "buildsheet/data/catalog.yaml" in names


def test_installed_wheel_builds_a_sheet_in_a_clean_directory(wheel, tmp_path):
    venv = tmp_path / "venv"
    subprocess.run([sys.executable, "-m", "venv", "--without-pip", str(venv)], check=True, timeout=120)
    python = venv / ("Scripts/python.exe" if os.name == "nt" else "bin/python")
    site = subprocess.run([str(python), "-c", "import sysconfig; print(sysconfig.get_paths()['purelib'])"],
                          capture_output=True, text=True, check=True).stdout.strip()
    # the dependencies from this test run's environment, after the venv's own site-packages
    ours = dict.fromkeys(sysconfig.get_paths()[k] for k in ("purelib", "platlib"))
    pathlib.Path(site, "_test_dependencies.pth").write_text("\n".join(ours) + "\n")
    env = {k: v for k, v in os.environ.items() if k not in ("PYTHONPATH", "PYTHONHOME")}
    env["SOURCE_DATE_EPOCH"] = "1740787200"          # 2025-03-01
    # pip 22.3 and later install into another environment with --python, so the venv needs no pip
    # --ignore-installed: where the test run's own environment has buildsheet installed (CI does),
    # the .pth above makes it visible, and pip would otherwise skip the wheel as already there
    install = subprocess.run([sys.executable, "-m", "pip", "--python", str(python), "install", "-q",
                              "--no-deps", "--no-index", "--ignore-installed", str(wheel)],
                             capture_output=True, text=True,
                             timeout=300, env=env)
    assert install.returncode == 0, install.stderr
    work = tmp_path / "work"
    work.mkdir()
    shutil.copy(ROOT / "designs" / "oak-yard-20m.yaml", work)
    where = subprocess.run([str(python), "-c", "import buildsheet; print(buildsheet.__file__)"], cwd=work,
                           capture_output=True, text=True, env=env, check=True).stdout.strip()
    assert pathlib.Path(where).resolve().is_relative_to(venv.resolve()), where
    done = subprocess.run([str(python), "-m", "buildsheet", "build", "oak-yard-20m.yaml"], cwd=work,
                          capture_output=True, text=True, env=env, timeout=300)
    assert done.returncode == 0, done.stderr
    pdf = (work / "out" / "oak-yard-20m" / "oak-yard-20m.pdf").read_bytes()
    reader = pypdf.PdfReader(io.BytesIO(pdf))
    text = " ".join(page.extract_text() for page in reader.pages)
    assert "Tuning procedure" in text and "Local codes and licensed practice" in text
    assert "revised 2025-03-01" in text
