"""Atomic file output: write to a temporary file in the same folder, then rename.

An interrupted run therefore never leaves a half-written result or report.
"""
import json
import os
import tempfile
from pathlib import Path


def _umask():
    mask = os.umask(0)
    os.umask(mask)
    return mask


def atomic_write_bytes(path, data):
    """Write ``data`` (bytes) to ``path`` atomically; create the folder if needed."""
    path = Path(path)
    path.parent.mkdir(parents=True, exist_ok=True)
    fd, tmp = tempfile.mkstemp(prefix=f".{path.name}.", suffix=".tmp", dir=path.parent)
    try:
        with os.fdopen(fd, "wb") as handle:
            handle.write(data)
            handle.flush()
            os.fsync(handle.fileno())
        os.chmod(tmp, 0o666 & ~_umask())   # mkstemp makes 0600; give the usual file mode
        os.replace(tmp, path)
    except BaseException:
        if os.path.exists(tmp):
            os.unlink(tmp)
        raise
    return path


def atomic_write_text(path, text):
    """Write ``text`` (UTF-8) to ``path`` atomically."""
    return atomic_write_bytes(path, text.encode("utf-8"))


def atomic_write_json(path, obj):
    """Write ``obj`` as indented JSON to ``path`` atomically (NaN is refused)."""
    return atomic_write_text(path, json.dumps(obj, indent=2, allow_nan=False) + "\n")
