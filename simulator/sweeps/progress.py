"""Progress of a sweep: a one-line bar on a terminal, plain periodic lines otherwise.

On an interactive terminal the line is redrawn in place (carriage return) at most
ten times a second::

    cases [##########----------]  1250/2500  50%  173.2 cases/s  left 0:00:07  failed 3

Otherwise (log files, CI, pipes) a plain line is printed every ``interval`` seconds
or at every 10 % step, whichever comes first, and once at the end. The rate counts
only cases computed in this session, so a resumed run does not claim the skipped
cases as speed. No dependency beyond the standard library.
"""
import sys
import time


def format_duration(seconds):
    """``H:MM:SS`` for a duration in seconds, ``?`` if unknown.

    Examples
    --------
    >>> format_duration(3725.4)
    '1:02:05'
    """
    if seconds is None or seconds != seconds or seconds == float("inf"):
        return "?"
    seconds = int(round(seconds))
    return f"{seconds // 3600}:{seconds % 3600 // 60:02d}:{seconds % 60:02d}"


class Progress:
    """Progress reporter used by :func:`simulator.sweeps.execute.run_cases`.

    Parameters
    ----------
    stream : file-like, optional
        Where to write; default ``sys.stderr`` (looked up when the run starts).
    interactive : bool, optional
        Redraw one line in place; default: ``stream.isatty()``.
    interval : float
        Seconds between plain lines when not interactive, [s]
    label : str
        Word in front of the line.
    width : int
        Number of characters of the bar.
    clock : callable
        Monotonic clock in seconds (tests pass a fake one), [s]
    """

    def __init__(self, stream=None, interactive=None, interval=5.0, label="cases", width=20,
                 clock=time.monotonic):
        self.stream = stream
        self.interactive = interactive
        self.interval = float(interval)
        self.label = label
        self.width = int(width)
        self.clock = clock
        self.total = 0
        self.done = 0
        self.failed = 0
        self._start_done = 0
        self._t0 = None
        self._last_draw = None
        self._last_decile = -1
        self._last_done = None

    def start(self, total, done=0, failed=0):
        """Begin a run of ``total`` cases of which ``done`` are already stored."""
        if self.stream is None:
            self.stream = sys.stderr
        if self.interactive is None:
            isatty = getattr(self.stream, "isatty", None)
            self.interactive = bool(isatty and isatty())
        self.total, self.done, self.failed = int(total), int(done), int(failed)
        self._start_done = self.done
        self._t0 = self.clock()
        self._last_draw = None
        self._last_decile = self._decile()
        if not self.interactive:         # a line at once, so a long run never starts silent
            self._write_line(f"{self.label}: resuming, {self.done}/{self.total} already stored" if self.done
                             else f"{self.label}: starting, {self.total} to run")
        self._maybe_draw(force=self.interactive)

    def update(self, n, failed=0):
        """Record ``n`` more finished cases, ``failed`` of them failed."""
        self.done += int(n)
        self.failed += int(failed)
        self._maybe_draw()

    def close(self):
        """Draw the final state and end the line."""
        if self._t0 is None:
            return
        if self.interactive:
            self.stream.write("\r" + self.line() + "\n")
        elif self._last_done != self.done:  # no repeat of a line just printed
            self._write_line(self.line())
        self.stream.flush()
        self._t0 = None

    # -- text -------------------------------------------------------------------------------
    def rate(self):
        """Cases per second computed in this session, or None before any finished, [1/s]"""
        elapsed = self.clock() - self._t0
        new = self.done - self._start_done
        return new / elapsed if new > 0 and elapsed > 0 else None

    def line(self):
        """The current progress text (without line ending)."""
        total = max(self.total, 1)
        fraction = min(self.done / total, 1.0)
        rate = self.rate()
        left = (self.total - self.done) / rate if rate else None
        parts = [f"{self.label}"]
        if self.interactive:
            filled = int(round(fraction * self.width))
            parts.append("[" + "#" * filled + "-" * (self.width - filled) + "]")
        parts.append(f"{self.done:>{len(str(self.total))}}/{self.total}")
        parts.append(f"{100 * fraction:3.0f}%")
        parts.append(f"{rate:.3g} cases/s" if rate else "- cases/s")
        parts.append(f"left {format_duration(left) if rate else '?'}")
        if self.failed:
            parts.append(f"failed {self.failed}")
        return "  ".join(parts)

    def _decile(self):
        return int(10 * self.done / self.total) if self.total else 10

    def _maybe_draw(self, force=False):
        now = self.clock()
        if self.interactive:
            if force or self._last_draw is None or now - self._last_draw >= 0.1:
                self.stream.write("\r" + self.line())
                self.stream.flush()
                self._last_draw = now
            return
        decile = self._decile()
        due = self._last_draw is None or now - self._last_draw >= self.interval
        if force or decile > self._last_decile or (due and self.done > self._start_done):
            self._write_line(self.line())
            self._last_decile = decile
            self._last_draw = now

    def _write_line(self, text):
        self._last_done = self.done
        self.stream.write(text + "\n")
        self.stream.flush()
