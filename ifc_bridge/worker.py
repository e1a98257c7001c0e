"""Run one function in a forked worker process while the caller goes on.

The reader's largest costs (the geometry kernel pass, the IDS validation) need only the
open IFC file and give back plain data. On a machine with two or more cores each can
run in a child made with ``os.fork``: the parsed file is shared copy-on-write, not
parsed again, and the child's result comes back pickled through a pipe. Without
``fork`` (Windows; and macOS, whose system libraries are not fork-safe), with one
core, or when asked not to, the function runs in this process when its result is
first wanted. A worker that raises, dies or sends nothing readable is replaced by
running the function here (with a logged warning), so the answer, or the error, is
always the serial one.

Set ``SHEARLINE_WORKERS=0`` in the environment to run everything in one process.
"""

from __future__ import annotations

import contextlib
import logging
import os
import pickle
import signal
import struct
import sys
from collections.abc import Callable
from dataclasses import dataclass, field
from typing import Any, Generic, TypeVar

__all__ = ["PARALLEL_MIN", "PendingCall", "can_fork", "start_call", "usable_cpus"]

_LOG = logging.getLogger(__name__)

T = TypeVar("T")

# Fewer elements (walls, or walls + slabs + openings) than this: do it in this
# process. A fork costs ~10 ms and pays only when there is work to overlap.
PARALLEL_MIN = 500

# A worker's result is framed by its byte count, so a whole result is known as such
# without waiting for the worker's exit (tearing down a large forked process takes
# several milliseconds). Workers that sent a whole result and are still exiting are
# reaped later, without blocking, when the next worker starts or a result arrives.
_HEADER = struct.Struct("<Q")
_EXITING: list[int] = []


def _reap_exited() -> None:
    """Reap the workers of :data:`_EXITING` that have ended (never waits)."""
    for pid in tuple(_EXITING):
        try:
            done, _ = os.waitpid(pid, os.WNOHANG)
        except ChildProcessError:  # reaped already (by a caller's own wait)
            done = pid
        if done:
            _EXITING.remove(pid)


def usable_cpus() -> int:
    """Cores this process may run on."""
    try:
        return len(os.sched_getaffinity(0))
    except AttributeError:  # not on Linux
        return os.cpu_count() or 1


def can_fork() -> bool:
    """True when a worker process would run in parallel with this one."""
    if os.environ.get("SHEARLINE_WORKERS", "").strip() == "0":
        return False
    # fork is safe with the libraries here on Linux; macOS system frameworks are not
    # fork-safe (Python itself stopped forking there by default), Windows has none
    return sys.platform.startswith("linux") and usable_cpus() >= 2


@dataclass(slots=True, kw_only=True)
class PendingCall(Generic[T]):
    """A call under way in a worker process, or to be made here on demand.

    Attributes:
        name: What it computes, for log messages.
        fn: The function.
        args: Its positional arguments.
        encode: Applied to the function's value before it is pickled (identity).
        decode: Turns the encoded value into the result (identity default); the
            result is ``decode(encode(fn(*args)))`` wherever ``fn`` runs.
        pid: Worker process id, or 0 when there is none.
        fd: Read end of the worker's pipe, or -1.
    """

    name: str
    fn: Callable[..., Any]
    args: tuple[Any, ...] = ()
    encode: Callable[[Any], Any] | None = None
    decode: Callable[[Any], T] | None = None
    pid: int = 0
    fd: int = -1
    _value: Any = field(default=None)
    _done: bool = field(default=False)

    def result(self) -> T:
        """The function's result; waits for the worker (or runs the function here)."""
        if self._done:
            return self._value
        if self.pid:
            value, ok = self._collect()
            if ok:
                self._value, self._done = value, True
                return value
        value = self.fn(*self.args)
        if self.encode is not None:
            value = self.encode(value)
        if self.decode is not None:
            value = self.decode(value)
        self._value, self._done = value, True
        return value

    def _collect(self) -> tuple[Any, bool]:
        with os.fdopen(self.fd, "rb") as pipe:
            framed = pipe.read()
        pid, self.pid, self.fd = self.pid, 0, -1
        size = _HEADER.unpack_from(framed)[0] if len(framed) >= _HEADER.size else -1
        payload = framed[_HEADER.size :]
        if size != len(payload) or not payload:
            _, status = os.waitpid(pid, 0)  # it failed: its status says how
            _LOG.warning(
                "%s worker ended with status %s; running it in this process",
                self.name,
                status,
            )
            return None, False
        # a whole result: all the worker does after sending it is exit
        _EXITING.append(pid)
        _reap_exited()
        try:
            value = pickle.loads(payload)
            return (self.decode(value) if self.decode else value), True
        except Exception as exc:
            _LOG.warning("%s worker sent an unreadable result (%s)", self.name, exc)
            return None, False

    def cancel(self) -> None:
        """Stop a worker whose result is no longer wanted (the caller failed)."""
        if not self.pid:
            return
        with contextlib.suppress(ProcessLookupError):
            os.kill(self.pid, signal.SIGKILL)
        os.waitpid(self.pid, 0)
        os.close(self.fd)
        self.pid, self.fd = 0, -1


def start_call(
    name: str,
    fn: Callable[..., Any],
    *args: Any,
    encode: Callable[[Any], Any] | None = None,
    decode: Callable[[Any], T] | None = None,
    parallel: bool | None = None,
    nice: int = 0,
) -> PendingCall[T]:
    """Start ``fn(*args)`` in a forked worker; its result via ``.result()``.

    Args:
        name: What it computes, for log messages.
        fn: A function whose result pickles (after ``encode``).
        *args: Its arguments (shared with the worker by the fork, not pickled).
        encode: Applied to the result in the worker before pickling (compact form).
        decode: Applied to the unpickled value in this process; when ``fn`` runs
            here instead (no worker, or a failed one) the result is still
            ``decode(encode(fn(*args)))``.
        parallel: Force (True) or forbid (False) the worker; default :func:`can_fork`.
        nice: Added to the worker's scheduling niceness (POSIX ``nice``): a worker
            whose result is wanted last yields the cores to the others meanwhile.

    Returns:
        The pending call.
    """
    pending: PendingCall[T] = PendingCall(
        name=name, fn=fn, args=args, encode=encode, decode=decode
    )
    if parallel is None:
        parallel = can_fork()
    if not parallel or not hasattr(os, "fork"):
        return pending
    _reap_exited()
    read_fd, write_fd = os.pipe()
    try:
        pid = os.fork()
    except OSError as exc:  # no process to spare: run it here later
        os.close(read_fd)
        os.close(write_fd)
        _LOG.warning("cannot start the %s worker (%s)", name, exc)
        return pending
    if pid == 0:  # the worker: compute, send, leave without the parent's cleanup
        code = 1
        try:
            os.close(read_fd)
            if nice:
                os.nice(nice)
            value = fn(*args)
            payload = pickle.dumps(
                encode(value) if encode else value, protocol=pickle.HIGHEST_PROTOCOL
            )
            with os.fdopen(write_fd, "wb") as pipe:
                pipe.write(_HEADER.pack(len(payload)))
                pipe.write(payload)
            code = 0
        except BaseException:
            code = 1
        finally:
            os._exit(code)
    os.close(write_fd)
    pending.pid, pending.fd = pid, read_fd
    return pending
