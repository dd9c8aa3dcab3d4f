"""The same notebook through two hosts of the cells session must give the same outputs, cell by cell:
Debian's nbclient driving our ZeroMQ kernel, and `multiplet run` executing in-process (issue 5, part 3).
Compared after dropping what is host-specific by design: `transient` (display ids) and cell metadata
(the runner records provenance there); consecutive stream outputs of one name are joined on both sides."""
import json
import shutil
import subprocess
import unittest
from pathlib import Path

import nbformat

from kernel_env import CLI, InstalledKernel, fixture_workdir
from test_nbclient import execute_with_nbclient


def comparable_outputs(nb):
    cells = []
    for cell in nb.cells:
        if cell.cell_type != "code":
            continue
        outputs = []
        for out in cell.outputs:
            out = {k: v for k, v in out.items() if k != "transient"}
            if out["output_type"] == "stream" and outputs and outputs[-1]["output_type"] == "stream" and outputs[-1]["name"] == out["name"]:
                outputs[-1] = {**outputs[-1], "text": outputs[-1]["text"] + out["text"]}
                continue
            outputs.append(out)
        cells.append({"id": cell.get("id"), "execution_count": cell.execution_count, "outputs": json.loads(json.dumps(outputs))})
    return cells


class RunnerParityTests(unittest.TestCase):
    @classmethod
    def setUpClass(cls):
        cls.installed = InstalledKernel()

    @classmethod
    def tearDownClass(cls):
        cls.installed.remove()

    def run_headless(self, notebook_name, *flags, expect_status=0):
        workdir = fixture_workdir("multiplet-runner-")
        try:
            out = Path(workdir) / "executed.ipynb"
            done = subprocess.run(
                [shutil.which("node"), str(CLI), "run", str(Path(workdir) / notebook_name), "--out", str(out), *flags],
                capture_output=True, text=True, timeout=120,
            )
            self.assertEqual(done.returncode, expect_status, done.stderr)
            self.last_stderr = done.stderr
            nb = nbformat.read(str(out), as_version=4)
            nbformat.validate(nb)
            return nb
        finally:
            shutil.rmtree(workdir, ignore_errors=True)

    def test_bench_notebook_same_outputs_from_kernel_and_runner(self):
        via_kernel = comparable_outputs(execute_with_nbclient("bench.ipynb", self.installed.name))
        via_runner = comparable_outputs(self.run_headless("bench.ipynb"))
        self.assertEqual([c["id"] for c in via_kernel], [c["id"] for c in via_runner])
        self.assertTrue(all(c["outputs"] for c in via_kernel), "every fixture cell has output")
        for kernel_cell, runner_cell in zip(via_kernel, via_runner):
            with self.subTest(cell=kernel_cell["id"]):
                self.assertEqual(kernel_cell, runner_cell)


    def test_error_notebook_same_outputs_from_kernel_and_runner(self):
        via_kernel = comparable_outputs(execute_with_nbclient("errors.ipynb", self.installed.name, allow_errors=True))
        via_runner = comparable_outputs(self.run_headless("errors.ipynb", "--allow-errors", expect_status=1))
        errors = [c["id"] for c in via_kernel if any(o["output_type"] == "error" for o in c["outputs"])]
        self.assertEqual(errors, ["forbidden-parameter", "unknown-ion", "script-error"])
        for kernel_cell, runner_cell in zip(via_kernel, via_runner):
            with self.subTest(cell=kernel_cell["id"]):
                self.assertEqual(kernel_cell, runner_cell)
        self.assertEqual(len(via_kernel), len(via_runner))


if __name__ == "__main__":
    unittest.main()
