"""Generic conformance tests for the loligo kernel (fakesession language).

Runs Debian's jupyter_kernel_test (python3-jupyter-kernel-test) against the
kernelspec named in LOLIGO_KERNEL_NAME. Driven by kernel/e2e_test.go.
"""
import os
import sys
import unittest

import jupyter_kernel_test


class LoligoConformance(jupyter_kernel_test.KernelTests):
    kernel_name = os.environ.get("LOLIGO_KERNEL_NAME", "loligo-test")
    language_name = "fakesession"
    file_extension = ".fake"
    code_hello_world = "print hello, world"
    code_stderr = "eprint oops"
    completion_samples = [{"text": "pri", "matches": {"print"}}]
    complete_code_samples = ["print a", "42"]
    incomplete_code_samples = ["print a \\"]
    invalid_code_samples = ["} x"]
    code_generate_error = "fail on purpose"
    code_execute_result = [{"code": "6*7", "result": "6*7"}]
    code_display_data = [{"code": "display hi", "mime": "text/plain"}]
    code_history_pattern = "6*"
    supported_history_operations = ("tail", "range", "search")
    code_inspect_sample = "print"
    code_clear_output = "clear"


if __name__ == "__main__":
    result = unittest.main(argv=[sys.argv[0], "-v"], exit=False).result
    sys.exit(0 if result.wasSuccessful() else 1)
