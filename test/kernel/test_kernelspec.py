"""`multiplet kernel install` against Debian's jupyter-client: `jupyter kernelspec list --json` must show the
installed spec (prefix and user installs), with argv running the bundled CLI and interrupt_mode "message"."""
import json
import os
import shutil
import subprocess
import tempfile
import unittest
from pathlib import Path

from kernel_env import BUNDLE, CLI

JUPYTER_KERNELSPEC = "/usr/bin/jupyter-kernelspec"


def kernelspecs(env):
    done = subprocess.run([JUPYTER_KERNELSPEC, "list", "--json"], capture_output=True, text=True, env=env, check=True)
    return json.loads(done.stdout)["kernelspecs"]


class KernelspecInstallTests(unittest.TestCase):
    def setUp(self):
        self.tmp = tempfile.mkdtemp(prefix="multiplet-kernelspec-test-")
        self.env = {k: v for k, v in os.environ.items() if k not in ("JUPYTER_PATH", "JUPYTER_DATA_DIR", "XDG_DATA_HOME")}
        self.env["HOME"] = str(Path(self.tmp) / "home")
        self.env["PYDEVD_DISABLE_FILE_VALIDATION"] = "1"

    def tearDown(self):
        shutil.rmtree(self.tmp, ignore_errors=True)

    def install(self, *args):
        return subprocess.run([shutil.which("node"), str(CLI), "kernel", "install", *args], capture_output=True, text=True, env=self.env)

    def test_prefix_install_is_listed(self):
        prefix = Path(self.tmp) / "prefix"
        done = self.install("--prefix", str(prefix), "--name", "multiplet-prefix")
        self.assertEqual(done.returncode, 0, done.stderr)
        self.env["JUPYTER_PATH"] = str(prefix / "share" / "jupyter")
        specs = kernelspecs(self.env)
        self.assertIn("multiplet-prefix", specs)
        spec = specs["multiplet-prefix"]["spec"]
        self.assertEqual(spec["display_name"], "Multiplet")
        self.assertEqual(spec["language"], "multiplet-cells")
        self.assertEqual(spec["interrupt_mode"], "message")
        self.assertEqual(spec["argv"][1:], [str(BUNDLE), "kernel", "start", "--connection-file", "{connection_file}"])
        self.assertTrue(os.path.isabs(spec["argv"][0]) and os.access(spec["argv"][0], os.X_OK))

    def test_user_install_is_listed(self):
        done = self.install("--user")
        self.assertEqual(done.returncode, 0, done.stderr)
        specs = kernelspecs(self.env)
        self.assertIn("multiplet", specs)
        self.assertEqual(
            Path(specs["multiplet"]["resource_dir"]),
            Path(self.env["HOME"]) / ".local" / "share" / "jupyter" / "kernels" / "multiplet",
        )

    def test_bad_arguments_exit_2_and_write_nothing(self):
        for args in (["--prefix"], ["--user", "--prefix", self.tmp], ["--name", "bad name!"], ["--bogus"]):
            with self.subTest(args=args):
                done = self.install(*args)
                self.assertNotEqual(done.returncode, 0)
                self.assertIn("multiplet kernel install", done.stderr)
        self.assertFalse((Path(self.env["HOME"]) / ".local").exists())


if __name__ == "__main__":
    unittest.main()
