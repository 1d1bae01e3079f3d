"""Shared set-up: the `travertine` program the results are compared with.

The program is the one built by `cargo build --release` in this repository
(scripts/test-all builds it first); TRAVERTINE_BIN names another.
"""

import json
import os
import pathlib
import subprocess

import pytest

ROOT = pathlib.Path(__file__).resolve().parents[3]


def program() -> str:
    path = os.environ.get("TRAVERTINE_BIN") or str(ROOT / "target" / "release" / "travertine")
    if not pathlib.Path(path).exists():
        raise RuntimeError(f"{path} does not exist: run `cargo build --release` (scripts/test-all does)")
    return path


def run(*args: str) -> dict:
    """The JSON the program prints for these arguments."""
    out = subprocess.run([program(), *args], capture_output=True, text=True)
    assert out.returncode == 0, f"travertine {' '.join(args)}: {out.stderr}"
    return json.loads(out.stdout)


@pytest.fixture(scope="session")
def cli():
    program()
    return run
