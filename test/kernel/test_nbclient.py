"""Debian's python3-nbclient executes the fixture notebook with our installed kernel; nbformat validates it."""
import shutil
import tempfile
import unittest
from pathlib import Path

import nbformat
from nbclient import NotebookClient

from kernel_env import InstalledKernel, fixture_workdir


def execute_with_nbclient(notebook_name, kernel_name, timeout=60, allow_errors=False):
    """Run a fixture notebook in a scratch copy of the fixtures directory; returns the executed notebook."""
    workdir = fixture_workdir("multiplet-nbclient-")
    try:
        nb = nbformat.read(str(Path(workdir) / notebook_name), as_version=4)
        client = NotebookClient(nb, kernel_name=kernel_name, timeout=timeout, allow_errors=allow_errors, resources={"metadata": {"path": workdir}})
        client.execute()
        return nb
    finally:
        shutil.rmtree(workdir, ignore_errors=True)


class NbclientTests(unittest.TestCase):
    @classmethod
    def setUpClass(cls):
        cls.installed = InstalledKernel()

    @classmethod
    def tearDownClass(cls):
        cls.installed.remove()

    def test_fixture_notebook_executes_and_validates(self):
        nb = execute_with_nbclient("bench.ipynb", self.installed.name)
        nbformat.validate(nb)
        code_cells = {c.id: c for c in nb.cells if c.cell_type == "code"}
        for cell_id, cell in code_cells.items():
            with self.subTest(cell=cell_id):
                self.assertFalse([o for o in cell.outputs if o.output_type == "error"], cell.outputs)
                self.assertIsInstance(cell.execution_count, int)
        # Typed cells return their result bundle (text, HTML, our result type).
        sample = code_cells["sample"].outputs
        self.assertEqual([o.output_type for o in sample], ["execute_result"])
        self.assertIn("DyQ-1", sample[0].data["text/plain"])
        self.assertIn("application/vnd.multiplet.result+json", sample[0].data)
        # Script cells: a stream, a display, a value; and state carried across cells (the data file was read
        # relative to the notebook directory nbclient gave the kernel).
        log = code_cells["script-log"].outputs
        self.assertEqual(log[0].output_type, "stream")
        self.assertEqual(log[0].text, "ion: Dy3+ datasets: cp,cpFile\n")
        self.assertEqual(code_cells["script-display"].outputs[0].output_type, "display_data")
        self.assertEqual(code_cells["script-value"].outputs[0].data["text/plain"], "4")
        self.assertEqual(code_cells["script-names"].outputs[0].text, "host, cp, cpFile, cefDy\n")
        self.assertIn("application/vnd.vegalite.v5+json", code_cells["crystal-field"].outputs[0].data)
        # clearOutput(true) clears just before the next output, clearOutput() at once (nbclient's handling).
        cleared = code_cells["script-clear"].outputs
        self.assertEqual([o.output_type for o in cleared], ["display_data", "execute_result"])
        self.assertEqual(cleared[0].data["text/plain"], "final table")
        self.assertEqual(cleared[1].data["text/plain"], "done")
        self.assertEqual([c.execution_count for c in code_cells.values()], list(range(1, len(code_cells) + 1)))

    def test_a_failing_cell_stops_nbclient_with_the_cell_error(self):
        from nbclient.exceptions import CellExecutionError

        workdir = tempfile.mkdtemp(prefix="multiplet-nbclient-")
        try:
            nb = nbformat.v4.new_notebook(cells=[
                nbformat.v4.new_code_cell("[sample] bad\ncompound: X\nion: Xx3+"),
                nbformat.v4.new_code_cell('console.log("not reached")'),
            ])
            client = NotebookClient(nb, kernel_name=self.installed.name, timeout=60, resources={"metadata": {"path": workdir}})
            with self.assertRaises(CellExecutionError) as caught:
                client.execute()
            self.assertIn("ion", str(caught.exception))
            self.assertEqual(nb.cells[1].outputs, [])
        finally:
            shutil.rmtree(workdir, ignore_errors=True)


if __name__ == "__main__":
    unittest.main()
