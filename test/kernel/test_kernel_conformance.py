"""Debian's python3-jupyter-kernel-test 0.4.5 (`jupyter_kernel_test.KernelTests`) against our installed kernel.

Every sample the 0.4.5 suite supports is filled in except `code_page_something`: test_pager stays skipped
because Multiplet cells never send pager payloads, by design (documentation shows as inspection, Shift+Tab, and
as rich output, never in a pager); the execute_reply payload list is always empty.
"""
import unittest

import jupyter_kernel_test

from kernel_env import InstalledKernel, KERNEL_NAME

_installed = None


def setUpModule():
    global _installed
    _installed = InstalledKernel()


def tearDownModule():
    if _installed is not None:
        _installed.remove()


class MultipletKernelTests(jupyter_kernel_test.KernelTests):
    kernel_name = KERNEL_NAME
    language_name = "multiplet"
    file_extension = ".multiplet"

    code_hello_world = 'console.log("hello, world")'
    code_stderr = 'console.error("to stderr")'

    completion_samples = [
        {"text": "[sa", "matches": {"sample"}},
        {"text": "[sample] s\nio", "matches": {"ion", "ionsPerFormulaUnit"}},
        {"text": "[sample] s\nion: Yb", "matches": {"Yb3+"}},
        {"text": "physics.un", "matches": {"units"}},
    ]

    complete_code_samples = ["console.log(1)", "[sample] s\ncompound: YbQ-2\nion: Yb3+"]
    incomplete_code_samples = ["function f() {", "let x = (", "[sample] s\nion: \"Yb"]
    invalid_code_samples = ["let x = )", '"unterminated']

    code_generate_error = 'throw new Error("on purpose")'

    code_execute_result = [
        {"code": "1 + 2", "result": "3"},
        {"code": "[1, 2, 3].length * 2", "result": "6"},
    ]

    code_display_data = [
        {"code": 'display({"text/html": "<b>bench</b>", "text/plain": "bench"})', "mime": "text/html"},
        {"code": 'display("plain words")', "mime": "text/plain"},
    ]

    # clearOutput(wait?) in script cells sends IOPub clear_output.
    code_clear_output = 'console.log("before");\nclearOutput()'

    code_history_pattern = "1 + ?"
    supported_history_operations = ("tail", "range", "search")

    code_inspect_sample = "[sample] s\nion"

    @classmethod
    def setUpClass(cls):
        # setUpModule has installed the kernelspec; start the kernel through jupyter_client as the suite does.
        super().setUpClass()


if __name__ == "__main__":
    unittest.main()
