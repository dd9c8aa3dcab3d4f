"""Shared set-up for the Python kernel checks: build-free install of our kernelspec into a temporary prefix.

The kernel runs from the esbuild bundle (packages/cli/dist/multiplet.js, made by `npm run build`); the
kernelspec is written by our own `multiplet kernel install --prefix`, and JUPYTER_PATH points Debian's
jupyter_client at it, so these tests exercise the installed-kernel path a user takes.
"""
import json
import os
import shutil
import subprocess
import tempfile
from pathlib import Path

REPO = Path(__file__).resolve().parents[2]
CLI = REPO / "packages" / "cli" / "bin" / "multiplet.mjs"
BUNDLE = REPO / "packages" / "cli" / "dist" / "multiplet.js"
KERNEL_NAME = "multiplet-test"


class InstalledKernel:
    """Install the kernelspec under a temporary prefix and expose it through JUPYTER_PATH until `remove()`."""

    def __init__(self, name=KERNEL_NAME):
        if not BUNDLE.exists():
            raise RuntimeError(f"{BUNDLE} is missing: run `npm run build` first")
        node = shutil.which("node")
        if node is None:
            raise RuntimeError("node is not on PATH")
        self.name = name
        self.prefix = tempfile.mkdtemp(prefix="multiplet-kernelspec-")
        subprocess.run(
            [node, str(CLI), "kernel", "install", "--prefix", self.prefix, "--name", name],
            check=True, capture_output=True, text=True,
        )
        self.spec_dir = Path(self.prefix) / "share" / "jupyter" / "kernels" / name
        self.spec = json.loads((self.spec_dir / "kernel.json").read_text())
        self._old_path = os.environ.get("JUPYTER_PATH")
        data_dir = str(Path(self.prefix) / "share" / "jupyter")
        os.environ["JUPYTER_PATH"] = data_dir + (os.pathsep + self._old_path if self._old_path else "")

    def remove(self):
        if self._old_path is None:
            os.environ.pop("JUPYTER_PATH", None)
        else:
            os.environ["JUPYTER_PATH"] = self._old_path
        shutil.rmtree(self.prefix, ignore_errors=True)


def shell_reply(kc, msg_id, timeout=15):
    """The shell reply to msg_id, skipping others (start_new_kernel can leave extra kernel_info replies)."""
    while True:
        msg = kc.get_shell_msg(timeout=timeout)
        if msg["parent_header"].get("msg_id") == msg_id:
            return msg


def iopub_until_idle(kc, msg_id, timeout=15):
    """IOPub messages parented to msg_id, up to and including its idle status."""
    seen = []
    while True:
        msg = kc.get_iopub_msg(timeout=timeout)
        if msg["parent_header"].get("msg_id") != msg_id:
            continue
        seen.append(msg)
        if msg["msg_type"] == "status" and msg["content"]["execution_state"] == "idle":
            return seen
