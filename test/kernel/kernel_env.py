"""Shared set-up for the Python kernel checks: build-free install of our kernelspec into a temporary prefix, a
started kernel with its client, one cell run, and a scratch copy of the fixtures.

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

from jupyter_client.manager import KernelManager

REPO = Path(__file__).resolve().parents[2]
CLI = REPO / "packages" / "cli" / "bin" / "multiplet.mjs"
BUNDLE = REPO / "packages" / "cli" / "dist" / "multiplet.js"
KERNEL_NAME = "multiplet-test"
FIXTURES = Path(__file__).resolve().parent / "fixtures"


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


def run_cell(kc, code):
    """Execute code: the shell reply and the IOPub messages parented to it, up to idle."""
    msg_id = kc.execute(code)
    reply = shell_reply(kc, msg_id)
    return reply, iopub_until_idle(kc, msg_id)


def start_kernel(kernel_name):
    """Start the kernel through jupyter_client's KernelManager; returns (km, kc) with the client's channels ready."""
    km = KernelManager(kernel_name=kernel_name)
    km.start_kernel()
    kc = km.client()
    kc.start_channels()
    kc.wait_for_ready(timeout=30)
    return km, kc


def stop_kernel(km, kc):
    """Close the client's channels and shut the kernel down at once (unless it was shut down already)."""
    kc.stop_channels()
    if km.has_kernel:
        km.shutdown_kernel(now=True)


class KernelPerClass:
    """Mixin for a unittest.TestCase: one installed kernelspec and one running kernel (cls.km, cls.kc) per class."""

    @classmethod
    def setUpClass(cls):
        cls.installed = InstalledKernel()
        cls.km, cls.kc = start_kernel(cls.installed.name)

    @classmethod
    def tearDownClass(cls):
        stop_kernel(cls.km, cls.kc)
        cls.installed.remove()

    def run_cell(self, code):
        return run_cell(self.kc, code)


def fixture_workdir(prefix):
    """A new temporary directory holding a copy of the fixture files (the caller removes it)."""
    workdir = tempfile.mkdtemp(prefix=prefix)
    for f in FIXTURES.iterdir():
        if f.is_file():
            shutil.copy(f, workdir)
    return workdir
