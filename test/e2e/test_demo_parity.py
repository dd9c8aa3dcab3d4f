"""Every demo notebook gives the same outputs, cell by cell, through Debian's nbclient driving our ZeroMQ kernel and
through `multiplet run` in-process (issue 9). The runner's executed notebooks come from scripts/test-stages/demo.sh
(DEMO_RUNNER_OUT); the kernel runs each notebook in notebooks-demo/ itself. Compared as in
test/kernel/test_runner_parity.py: without `transient` (display ids) and cell metadata, with consecutive stream
outputs of one name joined."""
import os
import sys
import unittest
from pathlib import Path

import nbformat
from nbclient import NotebookClient

REPO = Path(__file__).resolve().parents[2]
sys.path.insert(0, str(REPO / "test" / "kernel"))
from kernel_env import InstalledKernel  # noqa: E402
from test_runner_parity import comparable_outputs  # noqa: E402

DEMO = REPO / "notebooks-demo"
NOTEBOOKS = sorted(p.name for p in DEMO.glob("0*.ipynb"))


class DemoParityTests(unittest.TestCase):
    @classmethod
    def setUpClass(cls):
        cls.runner_out = os.environ.get("DEMO_RUNNER_OUT")
        if not cls.runner_out:
            raise RuntimeError("DEMO_RUNNER_OUT is not set: run scripts/test-stages/demo.sh")
        cls.installed = InstalledKernel()

    @classmethod
    def tearDownClass(cls):
        cls.installed.remove()

    def test_six_demo_notebooks(self):
        self.assertEqual(len(NOTEBOOKS), 6, NOTEBOOKS)

    def test_kernel_and_runner_give_the_same_outputs(self):
        for name in NOTEBOOKS:
            with self.subTest(notebook=name):
                nb = nbformat.read(str(DEMO / name), as_version=4)
                NotebookClient(nb, kernel_name=self.installed.name, timeout=300, resources={"metadata": {"path": str(DEMO)}}).execute()
                runner = nbformat.read(str(Path(self.runner_out) / name), as_version=4)
                nbformat.validate(runner)
                via_kernel, via_runner = comparable_outputs(nb), comparable_outputs(runner)
                self.assertEqual([c["id"] for c in via_kernel], [c["id"] for c in via_runner])
                for kernel_cell, runner_cell in zip(via_kernel, via_runner):
                    self.assertTrue(kernel_cell["outputs"], f"{name} {kernel_cell['id']}: no output")
                    self.assertFalse([o for o in kernel_cell["outputs"] if o["output_type"] == "error"], f"{name} {kernel_cell['id']}: error")
                    self.assertEqual(kernel_cell, runner_cell, f"{name} {kernel_cell['id']}")


if __name__ == "__main__":
    unittest.main()
