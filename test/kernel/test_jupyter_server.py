"""Debian's jupyter-server 1.23 hosting our kernel: the kernelspec appears in /api/kernelspecs, a kernel starts
through the REST API and runs a cell over the kernel websocket (the path JupyterLab takes), and is deleted."""
import asyncio
import json
import os
import socket
import subprocess
import tempfile
import shutil
import time
import unittest
import urllib.request
import uuid

from tornado.websocket import websocket_connect

from kernel_env import InstalledKernel

TOKEN = "multiplet-test-token"


def free_port():
    with socket.socket() as s:
        s.bind(("127.0.0.1", 0))
        return s.getsockname()[1]


class JupyterServerTests(unittest.TestCase):
    @classmethod
    def setUpClass(cls):
        cls.installed = InstalledKernel()
        cls.root = tempfile.mkdtemp(prefix="multiplet-server-")
        cls.port = free_port()
        env = dict(os.environ, PYDEVD_DISABLE_FILE_VALIDATION="1", JUPYTER_RUNTIME_DIR=os.path.join(cls.root, "runtime"),
                   JUPYTER_CONFIG_DIR=os.path.join(cls.root, "config"))
        args = ["/usr/bin/jupyter-server", "--no-browser", f"--port={cls.port}", "--ip=127.0.0.1",
                f"--ServerApp.token={TOKEN}", f"--ServerApp.root_dir={cls.root}", "--ServerApp.port_retries=0"]
        if os.geteuid() == 0:
            args.append("--allow-root")
        cls.log = open(os.path.join(cls.root, "server.log"), "w")
        cls.server = subprocess.Popen(args, env=env, stdout=cls.log, stderr=subprocess.STDOUT)
        deadline = time.monotonic() + 60
        while True:
            try:
                cls.api("GET", "/api/status")
                break
            except OSError:
                if time.monotonic() > deadline or cls.server.poll() is not None:
                    cls.tearDownClass()
                    raise RuntimeError("jupyter-server did not come up")
                time.sleep(0.3)

    @classmethod
    def tearDownClass(cls):
        if cls.server.poll() is None:
            cls.server.terminate()
            try:
                cls.server.wait(timeout=15)
            except subprocess.TimeoutExpired:
                cls.server.kill()
                cls.server.wait()
        cls.log.close()
        shutil.rmtree(cls.root, ignore_errors=True)
        cls.installed.remove()

    @classmethod
    def api(cls, method, path, body=None):
        request = urllib.request.Request(
            f"http://127.0.0.1:{cls.port}{path}", method=method,
            data=None if body is None else json.dumps(body).encode(),
            headers={"Authorization": f"token {TOKEN}", "Content-Type": "application/json"},
        )
        with urllib.request.urlopen(request, timeout=30) as response:
            text = response.read().decode()
            return json.loads(text) if text else None

    def test_kernel_runs_a_cell_over_the_websocket(self):
        specs = self.api("GET", "/api/kernelspecs")["kernelspecs"]
        self.assertEqual(specs[self.installed.name]["spec"]["display_name"], "Multiplet")
        kernel = self.api("POST", "/api/kernels", {"name": self.installed.name})
        try:
            replies = asyncio.run(self.execute_over_websocket(kernel["id"], 'console.log("via server")\n6 * 7'))
            self.assertEqual(replies["reply"]["content"]["status"], "ok")
            self.assertEqual(replies["stream"], "via server\n")
            self.assertEqual(replies["result"]["text/plain"], "42")
            # The server follows the kernel's IOPub status on its own SUB socket, which can connect after the cell
            # above ran (ZeroMQ drops what a PUB sends before a subscriber joins: the server then still says
            # "starting"). Run a trivial cell again until the server has seen a status message.
            deadline = time.monotonic() + 10
            while self.api("GET", f"/api/kernels/{kernel['id']}")["execution_state"] != "idle" and time.monotonic() < deadline:
                time.sleep(0.5)
                asyncio.run(self.execute_over_websocket(kernel["id"], "1"))
            self.assertEqual(self.api("GET", f"/api/kernels/{kernel['id']}")["execution_state"], "idle")
        finally:
            self.api("DELETE", f"/api/kernels/{kernel['id']}")
        self.assertEqual(self.api("GET", "/api/kernels"), [])

    async def execute_over_websocket(self, kernel_id, code):
        url = f"ws://127.0.0.1:{self.port}/api/kernels/{kernel_id}/channels?token={TOKEN}"
        ws = await websocket_connect(url)
        try:
            msg_id = uuid.uuid4().hex
            await ws.write_message(json.dumps({
                "channel": "shell",
                "header": {"msg_id": msg_id, "msg_type": "execute_request", "username": "test", "session": uuid.uuid4().hex,
                           "date": "", "version": "5.3"},
                "parent_header": {}, "metadata": {},
                "content": {"code": code, "silent": False, "store_history": True, "user_expressions": {}, "allow_stdin": False,
                            "stop_on_error": True},
            }))
            found = {"stream": ""}
            deadline = time.monotonic() + 30
            while time.monotonic() < deadline:
                raw = await asyncio.wait_for(ws.read_message(), timeout=30)
                if raw is None:
                    break
                msg = json.loads(raw)
                if msg.get("parent_header", {}).get("msg_id") != msg_id:
                    continue
                kind = msg["msg_type"]
                if kind == "execute_reply":
                    found["reply"] = msg
                elif kind == "stream":
                    found["stream"] += msg["content"]["text"]
                elif kind == "execute_result":
                    found["result"] = msg["content"]["data"]
                elif kind == "status" and msg["content"]["execution_state"] == "idle":
                    found["idle"] = True
                # Shell and IOPub are merged on the websocket: the reply and the idle status may come in either order.
                if "reply" in found and found.get("idle"):
                    return found
            raise AssertionError(f"no reply and idle over the websocket: {found}")
        finally:
            ws.close()


if __name__ == "__main__":
    unittest.main()
