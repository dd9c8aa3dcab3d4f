"""Interrupts through Debian's jupyter_client: interrupt_kernel() with our kernelspec's interrupt_mode "message"
sends interrupt_request on control; a running cell must end with an error reply within a second, the kernel must
stay up, and the next cell must run normally. SIGINT to the process is the fallback and must not kill it."""
import os
import signal
import time
import unittest

from jupyter_client.manager import KernelManager

from kernel_env import InstalledKernel, iopub_until_idle, shell_reply

# A script cell that never finishes on its own: synchronous, so only an interrupt can end it.
ENDLESS = "let spins = 0\nwhile (true) { spins++ }"
# A long loop written the cooperative way: progress through task.report, task.checkpoint() in the loop.
COOPERATIVE = "const total = 1e12\nfor (let i = 0; i < total; i++) {\n  if (i % 100000 === 0) { task.report(i, total); task.checkpoint() }\n}"


class InterruptTests(unittest.TestCase):
    @classmethod
    def setUpClass(cls):
        cls.installed = InstalledKernel()
        cls.km = KernelManager(kernel_name=cls.installed.name)
        cls.km.start_kernel()
        cls.kc = cls.km.client()
        cls.kc.start_channels()
        cls.kc.wait_for_ready(timeout=30)

    @classmethod
    def tearDownClass(cls):
        cls.kc.stop_channels()
        cls.km.shutdown_kernel(now=True)
        cls.installed.remove()

    def run_cell(self, code):
        msg_id = self.kc.execute(code)
        reply = shell_reply(self.kc, msg_id)
        return reply, iopub_until_idle(self.kc, msg_id)

    def interrupt_endless_cell(self, interrupt, code=ENDLESS):
        self.run_cell('[sample] before\ncompound: Yb2Ti2O7\nion: Yb3+')
        msg_id = self.kc.execute(code)
        # Wait until the cell is running (its execute_input is out), then let it spin a little.
        while True:
            msg = self.kc.get_iopub_msg(timeout=10)
            if msg["parent_header"].get("msg_id") == msg_id and msg["msg_type"] == "execute_input":
                break
        time.sleep(0.3)
        started = time.monotonic()
        interrupt()
        reply = shell_reply(self.kc, msg_id, timeout=5)
        elapsed = time.monotonic() - started
        outputs = iopub_until_idle(self.kc, msg_id)
        self.assertLess(elapsed, 1.0, f"interrupt took {elapsed:.2f} s")
        self.assertEqual(reply["content"]["status"], "error")
        self.assertIn("interrupt", reply["content"]["evalue"].lower())
        # Exactly one error, last; a progress display before it is fine.
        kinds = [m["msg_type"] for m in outputs if m["msg_type"] not in ("status", "execute_input")]
        self.assertEqual(kinds.count("error"), 1)
        self.assertEqual(kinds[-1], "error")
        self.assertTrue(set(kinds) <= {"error", "display_data", "update_display_data"}, kinds)
        self.assertTrue(self.km.is_alive())
        # The next cell runs, and the state from before the interrupted cell is intact.
        reply, outputs = self.run_cell('state.sample.compound + " " + state.names.join(",")')
        self.assertEqual(reply["content"]["status"], "ok")
        result = [m for m in outputs if m["msg_type"] == "execute_result"][0]
        self.assertEqual(result["content"]["data"]["text/plain"], "Yb2Ti2O7 before")

    def test_interrupt_request_stops_a_blocking_cell(self):
        self.assertEqual(self.km.kernel_spec.interrupt_mode, "message")
        self.interrupt_endless_cell(self.km.interrupt_kernel)

    def test_interrupt_request_stops_a_cell_with_progress_and_checkpoints(self):
        self.interrupt_endless_cell(self.km.interrupt_kernel, code=COOPERATIVE)

    def test_sigint_interrupts_instead_of_killing(self):
        pid = self.km.provisioner.process.pid
        self.interrupt_endless_cell(lambda: os.kill(pid, signal.SIGINT))

    def test_interrupt_when_idle_changes_nothing(self):
        reply, _ = self.run_cell("1")
        count = reply["content"]["execution_count"]
        self.km.interrupt_kernel()
        time.sleep(0.3)
        reply, _ = self.run_cell("2")
        self.assertEqual(reply["content"]["status"], "ok")
        self.assertEqual(reply["content"]["execution_count"], count + 1)


if __name__ == "__main__":
    unittest.main()
