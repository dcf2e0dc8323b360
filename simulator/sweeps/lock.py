"""One run at a time per output folder: a lock file holding the owner's process id.

A sweep or uncertainty run writes ``results.sqlite`` as cases finish; a second run
into the same ``--out`` would insert the same case ids (and, before this lock, died
with an integrity error). :func:`folder_lock` creates ``DIR/.tubesim.lock`` with
``O_CREAT | O_EXCL`` (atomic on local file systems) holding the process id, host name
and start time. A second run finds it and stops with :class:`FolderInUseError`
("in use by process N"). A lock whose process is gone (killed with SIGKILL, machine
restarted), or whose PID now belongs to a process started later (the recorded
process start time differs), is stale: it is removed and taken over. A lock written on another host
cannot be checked from here and is never taken over; the message says so and how to
remove it by hand.
"""
import json
import os
import socket
from contextlib import contextmanager
from datetime import datetime, timezone
from pathlib import Path

from simulator.errors import SimulatorError

#: Name of the lock file inside the output folder.
LOCK_NAME = ".tubesim.lock"


class FolderInUseError(SimulatorError, ValueError):
    """Another running tubesim process writes into this output folder (a usage error, exit 2)."""


def _alive(pid):
    """True if a process with this id exists on this host (signal 0 checks without sending)."""
    if pid <= 0:
        return False
    try:
        os.kill(pid, 0)
    except ProcessLookupError:
        return False
    except PermissionError:       # exists, owned by another user
        return True
    return True


def _start_ticks(pid):
    """Start time of a process in clock ticks since boot (Linux ``/proc``), or None where unknown.

    Stored with the PID, so a lock whose process ended and whose PID was reused by
    another process is still recognised as stale.
    """
    try:
        text = Path(f"/proc/{int(pid)}/stat").read_text(encoding="ascii", errors="replace")
        return int(text.rsplit(")", 1)[1].split()[19])      # field 22 counted after the command name
    except (OSError, ValueError, IndexError):
        return None


def _read(path):
    try:
        info = json.loads(path.read_text(encoding="utf-8"))
        return info if isinstance(info, dict) else {}
    except (OSError, ValueError):
        return {}


def _try_create(path, info):
    try:
        fd = os.open(path, os.O_CREAT | os.O_EXCL | os.O_WRONLY, 0o644)
    except FileExistsError:
        return False
    with os.fdopen(fd, "w", encoding="utf-8") as handle:
        json.dump(info, handle)
    return True


@contextmanager
def folder_lock(out_dir, command="sweep"):
    """Hold the output folder's lock for the duration of a ``with`` block.

    Parameters
    ----------
    out_dir : str or Path
        Output folder (created if missing).
    command : str
        Verb holding the lock, recorded in the lock file.

    Yields
    ------
    Path
        The lock file.

    Raises
    ------
    FolderInUseError
        If a live process (or a process on another host) holds the lock.
    """
    out = Path(out_dir)
    created = not out.exists()
    out.mkdir(parents=True, exist_ok=True)
    path = out / LOCK_NAME
    host = socket.gethostname()
    mine = {"pid": os.getpid(), "host": host, "command": command, "process_start": _start_ticks(os.getpid()),
            "started": datetime.now(timezone.utc).isoformat(timespec="seconds")}
    for _ in range(3):       # create; or remove a stale lock and try again (another may win the race)
        if _try_create(path, mine):
            break
        held = _read(path)
        pid = held.get("pid")
        if not isinstance(pid, int):
            if not path.exists():
                continue         # released meanwhile
            raise FolderInUseError(f"--out {out}: locked by {path}, which does not name a process; "
                                   "if no tubesim run writes there, delete that file and rerun")
        if held.get("host", host) != host:
            raise FolderInUseError(f"--out {out}: in use by process {pid} on host {held['host']} "
                                   f"({held.get('command', 'a run')} since {held.get('started', '?')}); "
                                   f"if that run has ended, delete {path} and rerun")
        recorded = held.get("process_start")
        reused = recorded is not None and _start_ticks(pid) not in (None, recorded)
        if _alive(pid) and not reused:   # this process included: a nested run into the same folder
            raise FolderInUseError(f"--out {out}: in use by process {pid} "
                                   f"({held.get('command', 'a run')} since {held.get('started', '?')}); "
                                   "wait for it to finish or give another --out")
        try:                     # stale: its process is gone
            path.unlink()
        except FileNotFoundError:
            pass
    else:
        raise FolderInUseError(f"--out {out}: could not take the lock {path}; rerun when no other run starts there")
    try:
        yield path
    finally:
        if _read(path).get("pid") == os.getpid():
            try:
                path.unlink()
            except FileNotFoundError:
                pass
        if created:              # a run refused before writing anything leaves no empty folder behind
            try:
                out.rmdir()
            except OSError:      # not empty: results were written
                pass
