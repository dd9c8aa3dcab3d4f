"""Comms through Debian's jupyter_client against the running kernel: comm_open to the session's targets,
comm_info, comm_msg answered on IOPub, snapshots pushed after an execute (parented to that execute), an unknown
target answered with comm_close, and comm_close."""
import unittest
from queue import Empty

from kernel_env import KernelPerClass, iopub_until_idle, shell_reply


class CommTests(KernelPerClass, unittest.TestCase):
    def send_shell(self, msg_type, content):
        msg = self.kc.session.msg(msg_type, content)
        self.kc.shell_channel.send(msg)
        return msg["header"]["msg_id"]

    def comm_info(self, target=None):
        msg_id = self.kc.comm_info(target)
        return shell_reply(self.kc, msg_id)["content"]

    def test_state_comm_round_trip(self):
        msg_id = self.kc.execute("[sample] host\ncompound: YbQ-2\nion: Yb3+")
        self.assertEqual(shell_reply(self.kc, msg_id)["content"]["status"], "ok")
        iopub_until_idle(self.kc, msg_id)

        opened = self.send_shell("comm_open", {"comm_id": "state-1", "target_name": "multiplet.state", "data": {}})
        iopub_until_idle(self.kc, opened)
        info = self.comm_info("multiplet.state")
        self.assertEqual(info["status"], "ok")
        self.assertEqual(info["comms"], {"state-1": {"target_name": "multiplet.state"}})

        asked = self.send_shell("comm_msg", {"comm_id": "state-1", "data": {"action": "snapshot"}})
        replies = [m for m in iopub_until_idle(self.kc, asked) if m["msg_type"] == "comm_msg"]
        self.assertEqual(len(replies), 1)
        self.assertEqual(replies[0]["content"]["comm_id"], "state-1")
        data = replies[0]["content"]["data"]
        self.assertEqual(data["action"], "snapshot")
        self.assertEqual(data["sample"]["name"], "host")

        # An execute pushes a fresh snapshot to the open state comm, parented to that execute.
        run = self.kc.execute("[sample] second\ncompound: DyQ-1\nion: Dy3+")
        pushed = [m for m in iopub_until_idle(self.kc, run) if m["msg_type"] == "comm_msg"]
        self.assertTrue(pushed)
        self.assertEqual(pushed[-1]["content"]["data"]["sample"]["name"], "second")

        closed = self.send_shell("comm_close", {"comm_id": "state-1", "data": {}})
        iopub_until_idle(self.kc, closed)
        self.assertEqual(self.comm_info()["comms"], {})

    def test_unknown_target_is_closed_at_once(self):
        opened = self.send_shell("comm_open", {"comm_id": "nobody-1", "target_name": "no.such.target", "data": {}})
        closes = [m for m in iopub_until_idle(self.kc, opened) if m["msg_type"] == "comm_close"]
        self.assertEqual([m["content"]["comm_id"] for m in closes], ["nobody-1"])
        self.assertNotIn("nobody-1", self.comm_info()["comms"])

    def test_messages_to_unknown_comms_change_nothing(self):
        before = self.comm_info()["comms"]
        asked = self.send_shell("comm_msg", {"comm_id": "never-opened", "data": {"action": "load", "path": "x.json"}})
        seen = iopub_until_idle(self.kc, asked)
        self.assertEqual([m["msg_type"] for m in seen], ["status", "status"])
        self.assertEqual(self.comm_info()["comms"], before)


if __name__ == "__main__":
    unittest.main()
