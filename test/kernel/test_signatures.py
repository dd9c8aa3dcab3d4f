"""Signing checks with Debian's jupyter_client against the running kernel: a message signed with the wrong key,
an unsigned one, a tampered one and a replayed one get no reply, publish nothing and change no state; a shutdown
request with a bad signature does not stop the kernel."""
import time
from queue import Empty
import unittest

import zmq
from jupyter_client.session import Session

from kernel_env import KernelPerClass, iopub_until_idle, shell_reply


class SignatureTests(KernelPerClass, unittest.TestCase):
    @classmethod
    def setUpClass(cls):
        super().setUpClass()
        cls.context = zmq.Context()

    @classmethod
    def tearDownClass(cls):
        cls.context.destroy(linger=0)
        super().tearDownClass()

    def raw_socket(self, port_name):
        info = self.km.get_connection_info()
        sock = self.context.socket(zmq.DEALER)
        sock.linger = 0
        sock.connect(f"{info['transport']}://{info['ip']}:{info[port_name]}")
        return sock

    def assert_silent(self, sock, msg_ids, seconds=1.5):
        """No reply on the raw socket and no IOPub message parented to any of msg_ids for `seconds`."""
        deadline = time.monotonic() + seconds
        while time.monotonic() < deadline:
            self.assertEqual(sock.poll(50), 0, "the kernel answered a message it should have dropped")
            try:
                msg = self.kc.get_iopub_msg(timeout=0.05)
            except Empty:
                continue
            self.assertNotIn(msg["parent_header"].get("msg_id"), msg_ids)

    def test_wrong_unsigned_and_tampered_messages_change_nothing(self):
        reply, _ = self.run_cell("state.names.length")
        count_before = reply["content"]["execution_count"]
        forged_code = "[sample] forged\ncompound: Forged\nion: Yb3+"

        sock = self.raw_socket("shell_port")
        wrong = Session(key=b"not-the-kernel-key")
        unsigned = Session(key=b"")
        right = Session(key=self.km.session.key)
        ids = []
        m = wrong.msg("execute_request", {"code": forged_code, "silent": False})
        wrong.send(sock, m)
        ids.append(m["header"]["msg_id"])
        m = unsigned.msg("execute_request", {"code": forged_code, "silent": False})
        unsigned.send(sock, m)
        ids.append(m["header"]["msg_id"])
        # Correctly signed, then the content changed on the way.
        m = right.msg("execute_request", {"code": "1", "silent": False})
        frames = right.serialize(m)
        frames[-1] = frames[-1].replace(b'"1"', b'"[sample] forged\\ncompound: Forged\\nion: Yb3+"')
        sock.send_multipart(frames)
        ids.append(m["header"]["msg_id"])
        self.assert_silent(sock, ids)
        sock.close()

        reply, outputs = self.run_cell("state.names.length")
        self.assertEqual(reply["content"]["execution_count"], count_before + 1)
        results = [o for o in outputs if o["msg_type"] == "execute_result"]
        self.assertEqual(results[0]["content"]["data"]["text/plain"], "0")

    def test_a_replayed_message_runs_once(self):
        reply, _ = self.run_cell("state.names.length")
        count_before = reply["content"]["execution_count"]
        sock = self.raw_socket("shell_port")
        session = Session(key=self.km.session.key)
        m = session.msg("execute_request", {"code": "1 + 1", "silent": False, "store_history": True})
        frames = session.serialize(m)
        sock.send_multipart(frames)
        self.assertEqual(sock.poll(10000), zmq.POLLIN)
        first = session.deserialize(session.feed_identities(sock.recv_multipart())[1])
        self.assertEqual(first["content"]["execution_count"], count_before + 1)
        sock.send_multipart(frames)
        self.assertEqual(sock.poll(1500), 0, "a replayed message was executed")
        sock.close()
        reply, _ = self.run_cell("1")
        self.assertEqual(reply["content"]["execution_count"], count_before + 2)

    def test_badly_signed_shutdown_does_not_stop_the_kernel(self):
        sock = self.raw_socket("control_port")
        wrong = Session(key=b"not-the-kernel-key")
        m = wrong.msg("shutdown_request", {"restart": False})
        wrong.send(sock, m)
        self.assert_silent(sock, [m["header"]["msg_id"]], seconds=1.0)
        sock.close()
        self.assertTrue(self.km.is_alive())
        reply, _ = self.run_cell("2 * 21")
        self.assertEqual(reply["content"]["status"], "ok")


if __name__ == "__main__":
    unittest.main()
