"""Keep numba's on-disk cache consistent with the source files compiled code depends on.

numba invalidates a cached function only when the file that defines it changes. A
compiled function that calls compiled code from another file (the sweep integrator
calls the kernel, the kernel calls the NASA-7 and friction functions) would keep
running the old callee after that other file changed. So each compiled module
registers its dispatchers with the files they depend on; when the SHA-256 of those
files differs from the one recorded next to the cache, the dispatchers' caches are
flushed before anything is loaded from them.
"""
import hashlib
from pathlib import Path


def sources_digest(paths):
    """SHA-256 over the bytes of the given files, in order."""
    digest = hashlib.sha256()
    for path in paths:
        digest.update(Path(path).read_bytes())
    return digest.hexdigest()


def refresh_if_sources_changed(name, dispatchers, sources):
    """Flush the on-disk caches of ``dispatchers`` when ``sources`` changed since they were cached.

    Parameters
    ----------
    name : str
        Name of the group (the marker file is ``tubesim-<name>.sha256`` in the cache folder), [-]
    dispatchers : list
        numba dispatchers compiled with ``cache=True``, [-]
    sources : list of str
        Files the compiled code depends on, [-]

    Returns
    -------
    flushed : bool
        True when the caches were flushed, [-]
    """
    try:
        cache_dir = Path(dispatchers[0]._cache._cache_path)
        marker = cache_dir / f"tubesim-{name}.sha256"
        digest = sources_digest(sources)
        if marker.exists() and marker.read_text().strip() == digest:
            return False
        for dispatcher in dispatchers:
            dispatcher._cache.flush()
        cache_dir.mkdir(parents=True, exist_ok=True)
        marker.write_text(digest + "\n")
        return True
    except (OSError, AttributeError, IndexError):   # read-only location or numba internals changed
        return False
