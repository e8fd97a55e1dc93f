"""A small headless-Chromium driver over the DevTools protocol on a pipe (test helper only).

Chromium is started with ``--remote-debugging-pipe``: it reads JSON commands, each ended by
a NUL byte, on its fd 3 and writes replies and events the same way on fd 4. No package is
needed beyond the standard library. The browser is one process started here and ended here
by its own pid.
"""

from __future__ import annotations

import base64
import json
import os
import shutil
import subprocess
import tempfile
import time
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

FLAGS = ("--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
         "--disable-background-networking", "--disable-component-update", "--disable-sync",
         "--disable-extensions", "--mute-audio", "--hide-scrollbars")


def find_chromium() -> str | None:
    for name in ("chromium", "chromium-browser", "google-chrome"):
        path = shutil.which(name)
        if path:
            return path
    return "/usr/bin/chromium" if Path("/usr/bin/chromium").exists() else None


class BrowserError(RuntimeError):
    pass


@dataclass
class PageReport:
    """What a page did while it loaded: console messages, exceptions, requests made."""

    console_errors: list[str] = field(default_factory=list)
    exceptions: list[str] = field(default_factory=list)
    requests: list[str] = field(default_factory=list)


class Browser:
    def __init__(self, executable: str, timeout_s: float = 30.0) -> None:
        self.timeout_s = timeout_s
        self._profile = tempfile.TemporaryDirectory(prefix="pintruss-chromium-")
        to_child_r, self._to_child_w = os.pipe()
        self._from_child_r, from_child_w = os.pipe()

        def wire() -> None:  # runs in the child before exec: our pipe ends become fds 3, 4
            r, w = os.dup(to_child_r), os.dup(from_child_w)  # never clobbered by the dup2s
            os.dup2(r, 3)
            os.dup2(w, 4)
            os.set_inheritable(3, True)
            os.set_inheritable(4, True)

        self.proc = subprocess.Popen(
            [executable, *FLAGS, f"--user-data-dir={self._profile.name}",
             "--remote-debugging-pipe", "about:blank"],
            stdin=subprocess.DEVNULL, stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL,
            preexec_fn=wire, close_fds=False)  # only fds 3 and 4 are inheritable
        os.close(to_child_r)
        os.close(from_child_w)
        os.set_blocking(self._from_child_r, False)
        self._buf = b""
        self._next_id = 0
        self._events: list[dict[str, Any]] = []

    # ------------------------------------------------------------------ protocol
    def _send(self, method: str, params: dict[str, Any] | None = None,
              session: str | None = None) -> int:
        self._next_id += 1
        msg: dict[str, Any] = {"id": self._next_id, "method": method, "params": params or {}}
        if session:
            msg["sessionId"] = session
        os.write(self._to_child_w, json.dumps(msg).encode() + b"\0")
        return self._next_id

    def _read(self, deadline: float) -> dict[str, Any] | None:
        while b"\0" not in self._buf:
            if time.monotonic() > deadline:
                raise BrowserError("Chromium did not answer in time")
            if self.proc.poll() is not None:
                raise BrowserError(f"Chromium exited with code {self.proc.returncode}")
            try:
                chunk = os.read(self._from_child_r, 1 << 20)
            except BlockingIOError:
                time.sleep(0.005)
                continue
            if not chunk:
                time.sleep(0.005)
            self._buf += chunk
        raw, _, self._buf = self._buf.partition(b"\0")
        return json.loads(raw)

    def call(self, method: str, params: dict[str, Any] | None = None,
             session: str | None = None) -> dict[str, Any]:
        mid = self._send(method, params, session)
        deadline = time.monotonic() + self.timeout_s
        while True:
            msg = self._read(deadline)
            if msg is None:
                continue
            if msg.get("id") == mid:
                if "error" in msg:
                    raise BrowserError(f"{method}: {msg['error']}")
                return msg.get("result", {})
            if "method" in msg:
                self._events.append(msg)

    def wait_event(self, method: str, session: str, timeout_s: float | None = None
                   ) -> dict[str, Any]:
        deadline = time.monotonic() + (timeout_s or self.timeout_s)
        for k, ev in enumerate(self._events):
            if ev.get("method") == method and ev.get("sessionId") == session:
                return self._events.pop(k)
        while True:
            msg = self._read(deadline)
            if msg is None:
                continue
            if msg.get("method") == method and msg.get("sessionId") == session:
                return msg
            if "method" in msg:
                self._events.append(msg)

    def drain(self, session: str) -> list[dict[str, Any]]:
        """Every event received so far for ``session`` (removed from the queue)."""
        mine = [e for e in self._events if e.get("sessionId") == session]
        self._events = [e for e in self._events if e.get("sessionId") != session]
        return mine

    # ------------------------------------------------------------------ pages
    def open(self, path: Path, width: int = 1000, height: int = 1400, print_media: bool = False
             ) -> Page:
        target = self.call("Target.createTarget", {"url": "about:blank"})["targetId"]
        session = self.call("Target.attachToTarget", {"targetId": target, "flatten": True}
                            )["sessionId"]
        for domain in ("Page", "Runtime", "Log", "Network"):
            self.call(f"{domain}.enable", {}, session)
        self.call("Emulation.setDeviceMetricsOverride",
                  {"width": width, "height": height, "deviceScaleFactor": 1, "mobile": False},
                  session)
        if print_media:
            self.call("Emulation.setEmulatedMedia", {"media": "print"}, session)
        self.call("Page.navigate", {"url": Path(path).resolve().as_uri()}, session)
        self.wait_event("Page.loadEventFired", session)
        return Page(self, target, session)

    def close(self) -> None:
        try:
            if self.proc.poll() is None:
                try:
                    self._send("Browser.close")
                    self.proc.wait(timeout=5)
                except (OSError, subprocess.TimeoutExpired):
                    self.proc.kill()  # our own child, by its handle
                    self.proc.wait(timeout=5)
        finally:
            for fd in (self._to_child_w, self._from_child_r):
                try:
                    os.close(fd)
                except OSError:
                    pass
            self._profile.cleanup()


@dataclass
class Page:
    browser: Browser
    target: str
    session: str

    def evaluate(self, expression: str) -> Any:
        res = self.browser.call("Runtime.evaluate", {"expression": expression,
                                                     "returnByValue": True}, self.session)
        if "exceptionDetails" in res:
            raise BrowserError(f"script failed: {res['exceptionDetails']}")
        return res["result"].get("value")

    def report(self) -> PageReport:
        out = PageReport()
        for ev in self.browser.drain(self.session):
            m, p = ev["method"], ev.get("params", {})
            if m == "Runtime.consoleAPICalled" and p.get("type") in ("error", "assert"):
                out.console_errors.append(" ".join(str(a.get("value", a.get("description", "")))
                                                   for a in p.get("args", [])))
            elif m == "Log.entryAdded" and p.get("entry", {}).get("level") == "error":
                out.console_errors.append(p["entry"].get("text", ""))
            elif m == "Runtime.exceptionThrown":
                out.exceptions.append(json.dumps(p.get("exceptionDetails", {}))[:300])
            elif m == "Network.requestWillBeSent":
                out.requests.append(p.get("request", {}).get("url", ""))
        return out

    def pdf(self) -> bytes:
        res = self.browser.call("Page.printToPDF", {"preferCSSPageSize": True,
                                                    "printBackground": True,
                                                    "displayHeaderFooter": False}, self.session)
        return base64.b64decode(res["data"])

    def screenshot(self) -> bytes:
        res = self.browser.call("Page.captureScreenshot", {"format": "png",
                                                           "captureBeyondViewport": True},
                                self.session)
        return base64.b64decode(res["data"])

    def close(self) -> None:
        self.browser.call("Target.closeTarget", {"targetId": self.target})
