"""Interrupts through Debian's jupyter_client: interrupt_kernel() with our kernelspec's interrupt_mode "message"
sends interrupt_request on control; a running cell must end with an error reply within a second, the kernel must
stay up, the state must be as before the cell, and the next cell must run normally. Covered: synchronous and
async script loops, and long typed cells (spin-ice-mc, cef-fit). SIGINT to the process is the fallback and must
not kill it."""
import os
import signal
import time
import unittest

from jupyter_client.manager import start_new_kernel

from kernel_env import KernelPerClass, iopub_until_idle, run_cell, shell_reply

# A script cell that never finishes on its own: synchronous, so only an interrupt can end it.
ENDLESS = "let spins = 0\nwhile (true) { spins++ }"
# A long loop written the cooperative way: progress through task.report, task.checkpoint() in the loop.
COOPERATIVE = "const total = 1e12\nfor (let i = 0; i < total; i++) {\n  if (i % 100000 === 0) { task.report(i, total); task.checkpoint() }\n}"
# Async script code that never calls task.checkpoint() and never lets the event loop turn (microtasks only):
# neither the control message handler nor a SIGINT listener could run; the checks the cells package puts into
# the cell's loops, functions and awaits see the cancel flag the control worker sets.
ASYNC_STARVING = {
    "await-loop": "let n = 0\nfor (;;) { await Promise.resolve(); n++ }",
    # Nothing handles the chain's rejection: the kernel logs it to its stderr, the cell shows only the error.
    "promise-chain": "const again = (): Promise<void> => Promise.resolve().then(again)\nagain()\nawait new Promise(() => {})",
    "sync-after-await": "await null\nwhile (true) {}",
    "never-settles": "await new Promise(() => {})",
}
# Real long typed cells (each would run for minutes): a parallel-tempering Monte Carlo (worker thread, the cell
# awaits it with ctx.yieldNow) and a multi-start CEF fit with MCMC (synchronous physics with task.checkpoint()).
ER_CELLS = [
    "[sample] host\ncompound: ErQ-3\nion: Er3+\nsiteSymmetry: D3d\nlatticeConstant: 10.07 angstrom\nionsPerFormulaUnit: 2",
    "[crystal-field] cefStart\nB:\n  B20: -0.03 meV\n  B40: 1e-3 meV\n  B43: -0.009 meV\n  B60: 1e-5 meV\n  B63: -5e-5 meV\n  B66: 1e-4 meV",
]
# Peaks of the D3d field B20 -0.04, B40 1.2e-3, B43 -1.1e-2, B60 8e-6, B63 -7e-5, B66 9e-5 meV (as in the cells tests).
ER_PEAKS = (
    "peaks:\n"
    "  - { energy: 3.679 meV, error: 0.1 meV, intensity: 17.461, intensityError: 0.883, temperature: 5 K }\n"
    "  - { energy: 12.835 meV, error: 0.1 meV, intensity: 6.506, intensityError: 0.335, temperature: 5 K }\n"
    "  - { energy: 54.055 meV, error: 0.1 meV, intensity: 1.567, intensityError: 0.088, temperature: 5 K }\n"
    "  - { energy: 38.557 meV, error: 0.1 meV, intensity: 0.619, intensityError: 0.041, temperature: 5 K }\n"
    "  - { energy: 25.687 meV, error: 0.1 meV, intensity: 0.531, intensityError: 0.037, temperature: 5 K }\n"
    "  - { energy: 9.156 meV, error: 0.1 meV, intensity: 2.886, intensityError: 0.154, temperature: 60 K }"
)
LONG_TYPED = {
    "spin-ice-mc": "[spin-ice-mc] mcLong\nL: 4\ntemperatures: 0.2 K .. 5 K / 16 log\nJ1: -3 K\nmoment: 10\nsweeps: 1000000\nsnapshots: 0",
    # 10000 random starts (one diagonalisation each, then a local fit each): the interrupt lands in the search.
    "cef-fit search": "[cef-fit] fitLong\nstart: cefStart\nstarts: 10000\n" + ER_PEAKS,
    # A local fit, then 10^6 MCMC steps: the interrupt lands in the sampler.
    "cef-fit mcmc": "[cef-fit] fitLong\nstart: cefStart\nmcmcSteps: 1000000\n" + ER_PEAKS,
}
# Everything a script cell can read of the state, as one string.
STATE_DUMP = "JSON.stringify({ sample: state.sample, names: state.names, results: state.results, info: state.info })"


class InterruptTests(KernelPerClass, unittest.TestCase):
    def interrupt_endless_cell(self, interrupt, code=ENDLESS):
        self.run_cell('[sample] before\ncompound: YbQ-2\nion: Yb3+')
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
        self.assertEqual(result["content"]["data"]["text/plain"], "YbQ-2 before")

    def test_interrupt_request_stops_async_loops_that_never_checkpoint(self):
        for name, code in ASYNC_STARVING.items():
            with self.subTest(cell=name):
                self.interrupt_endless_cell(self.km.interrupt_kernel, code=code)

    def test_interrupt_request_stops_long_typed_cells_and_keeps_the_state(self):
        # A kernel of its own: the other tests expect a state holding only their own sample.
        km, kc = start_new_kernel(kernel_name=self.installed.name)
        try:
            def value(outputs):
                return [m for m in outputs if m["msg_type"] == "execute_result"][0]["content"]["data"]["text/plain"]

            for cell in ER_CELLS:
                reply, _ = run_cell(kc, cell)
                self.assertEqual(reply["content"]["status"], "ok", reply["content"])
            reply, outputs = run_cell(kc, STATE_DUMP)
            before = value(outputs)
            self.assertIn("ErQ-3", before)
            self.assertIn("cefStart", before)
            for kind, code in LONG_TYPED.items():
                with self.subTest(kind=kind):
                    msg_id = kc.execute(code)
                    while True:
                        msg = kc.get_iopub_msg(timeout=10)
                        if msg["parent_header"].get("msg_id") == msg_id and msg["msg_type"] == "execute_input":
                            break
                    time.sleep(0.5)
                    started = time.monotonic()
                    km.interrupt_kernel()
                    reply = shell_reply(kc, msg_id, timeout=5)
                    elapsed = time.monotonic() - started
                    outputs = iopub_until_idle(kc, msg_id)
                    self.assertLess(elapsed, 1.0, f"interrupt of [{kind}] took {elapsed:.2f} s")
                    self.assertEqual(reply["content"]["status"], "error")
                    self.assertEqual(reply["content"]["ename"], "CellInterrupted")
                    kinds = [m["msg_type"] for m in outputs if m["msg_type"] not in ("status", "execute_input")]
                    self.assertEqual(kinds.count("error"), 1)
                    self.assertEqual(kinds[-1], "error")
                    # The next cell runs at once and reads exactly the state from before the interrupted cell.
                    reply, outputs = run_cell(kc, STATE_DUMP)
                    self.assertEqual(reply["content"]["status"], "ok")
                    self.assertEqual(value(outputs), before)
            self.assertTrue(km.is_alive())
        finally:
            kc.stop_channels()
            km.shutdown_kernel(now=True)

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
