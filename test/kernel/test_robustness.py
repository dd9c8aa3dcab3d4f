"""Cell code cannot end the kernel: an unhandled promise rejection from a script cell is logged, the kernel stays
up and the next cell runs with the state intact."""
import time
import unittest

from kernel_env import InstalledKernel, KernelPerClass, run_cell, start_kernel, stop_kernel


class RobustnessTests(KernelPerClass, unittest.TestCase):
    def test_unhandled_rejections_do_not_kill_the_kernel(self):
        self.run_cell("[sample] kept\ncompound: YbQ-2\nion: Yb3+")
        for code in ['Promise.reject(new Error("nobody catches this")); 1', 'new Promise((_, reject) => reject(new Error("later")))']:
            with self.subTest(code=code):
                self.run_cell(code)
                time.sleep(0.3)
                self.assertTrue(self.km.is_alive())
        reply, outputs = self.run_cell("state.names.join()")
        self.assertEqual(reply["content"]["status"], "ok")
        self.assertEqual([m["content"]["data"]["text/plain"] for m in outputs if m["msg_type"] == "execute_result"], ["kept"])


if __name__ == "__main__":
    unittest.main()


class LifecycleTests(unittest.TestCase):
    """Restart gives a fresh state in a new process; a shutdown_request ends the process promptly with status 0."""

    def setUp(self):
        self.installed = InstalledKernel()
        self.km, self.kc = start_kernel(self.installed.name)

    def tearDown(self):
        stop_kernel(self.km, self.kc)
        self.installed.remove()

    def run_cell(self, code):
        return run_cell(self.kc, code)

    def test_restart_then_shutdown(self):
        self.run_cell("[sample] before\ncompound: YbQ-2\nion: Yb3+")
        first = self.km.provisioner.process
        self.km.restart_kernel()
        self.assertEqual(first.poll(), 0, "the old kernel process should have exited by itself, with status 0")
        self.kc.wait_for_ready(timeout=30)
        reply, outputs = self.run_cell("state.names.length")
        self.assertEqual(reply["content"]["execution_count"], 1)
        self.assertEqual([m["content"]["data"]["text/plain"] for m in outputs if m["msg_type"] == "execute_result"], ["0"])

        process = self.km.provisioner.process
        started = time.monotonic()
        self.km.shutdown_kernel(now=False)
        self.assertEqual(process.poll(), 0)
        self.assertLess(time.monotonic() - started, 2.0)
