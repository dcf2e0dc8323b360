"""Results store of a sweep or uncertainty run: one SQLite file, written as cases finish.

``DIR/results.sqlite`` holds

* table ``cases``: ``case_id INTEGER PRIMARY KEY``, one ``REAL`` column per varied
  parameter named by its dotted path (value in SI), then ``status``,
  ``hot_spot_temperature_K``, ``hot_spot_position_m``, ``outlet_conversion``,
  ``outlet_temperature_K``, ``outlet_pressure_Pa``, ``error``;
* table ``meta``: ``key TEXT PRIMARY KEY, value TEXT`` (JSON values): the varied paths,
  the command, the seed, a fingerprint of the base case and of the case list, the
  creation time.

Every batch of rows is written in one transaction, so a run killed at any moment
leaves whole batches only, and a rerun with the same ``--out`` skips every stored
case. A rerun whose plan differs from the stored one (other paths, ranges, samples,
seed or base case) is refused, because its case_ids would mean different cases.
Only the parent process writes; workers return rows.
"""
import csv
import io
import json
import math
import sqlite3
from datetime import datetime, timezone
from pathlib import Path

from simulator.errors import SimulatorError
from simulator.fileio import atomic_write_text

#: Result columns after the varied parameters, in table order, with their SQL types.
RESULT_COLUMNS = (
    ("status", "TEXT"),
    ("hot_spot_temperature_K", "REAL"),
    ("hot_spot_position_m", "REAL"),
    ("outlet_conversion", "REAL"),
    ("outlet_temperature_K", "REAL"),
    ("outlet_pressure_Pa", "REAL"),
    ("error", "TEXT"),
)
RESULT_FIELDS = tuple(name for name, _ in RESULT_COLUMNS)


class ResumeError(SimulatorError, ValueError):
    """An output folder holds results of a different plan (paths, ranges, seed, case)."""


def quote_identifier(name):
    """SQLite identifier in double quotes, inner quotes doubled (paths contain dots).

    Examples
    --------
    >>> quote_identifier('heat.medium.temperature')
    '"heat.medium.temperature"'
    """
    if not isinstance(name, str) or not name or "\x00" in name:
        raise ValueError(f"column name {name!r}: must be non-empty text without NUL characters")
    return '"' + name.replace('"', '""') + '"'


class ResultsStore:
    """SQLite table of case results with resume support.

    Parameters
    ----------
    path : str or Path
        The ``results.sqlite`` file; created with its folder if missing.
    varied_paths : sequence of str
        Dotted case paths varied in this run, one ``REAL`` column each (SI values).
    meta : dict, optional
        JSON-serialisable facts of the plan (``command``, ``seed``, ``plan_sha256``, ...).
        On a resume every given key must equal the stored value, else :class:`ResumeError`.

    Raises
    ------
    ResumeError
        If the file holds a run with other varied paths or other ``meta`` values.
    """

    def __init__(self, path, varied_paths, meta=None):
        self.path = Path(path)
        self.varied_paths = list(varied_paths)
        clash = sorted(set(self.varied_paths) & (set(RESULT_FIELDS) | {"case_id"}))
        if clash:
            raise ValueError(f"varied path {clash[0]!r} clashes with a result column name")
        if len(set(self.varied_paths)) != len(self.varied_paths):
            raise ValueError(f"varied paths repeat: {self.varied_paths}")
        self.path.parent.mkdir(parents=True, exist_ok=True)
        self._conn = sqlite3.connect(self.path)
        try:
            self._prepare(dict(meta or {}))
        except BaseException:
            self._conn.close()
            raise

    # -- set-up ---------------------------------------------------------------------------------
    @property
    def columns(self):
        """Column names of table ``cases`` in order."""
        return ["case_id", *self.varied_paths, *RESULT_FIELDS]

    def _prepare(self, meta):
        conn = self._conn
        existing = {row[0] for row in conn.execute("SELECT name FROM sqlite_master WHERE type='table'")}
        stored = self.read_meta_from(conn) if "meta" in existing else {}
        where = f"{self.path}"
        if "cases" in existing:
            have = [row[1] for row in conn.execute("PRAGMA table_info(cases)")]
            if have != self.columns:
                before = stored.get("varied_paths", have[1:len(have) - len(RESULT_FIELDS)])
                raise ResumeError(
                    f"{where}: holds a run varying {before}, this run varies {self.varied_paths}; "
                    "use a new --out folder, or rerun with the original options to resume"
                )
        for key, value in meta.items():
            value = json.loads(json.dumps(value))  # compare as stored (tuples -> lists)
            if key in stored and stored[key] != value:
                raise ResumeError(
                    f"{where}: meta {key} = {_short(value)} differs from the stored run "
                    f"({_short(stored[key])}); use a new --out folder, or rerun with the original options "
                    f"and the unchanged case file to resume"
                )
        with conn:
            conn.execute("CREATE TABLE IF NOT EXISTS meta (key TEXT PRIMARY KEY, value TEXT NOT NULL)")
            columns = ", ".join(
                ["case_id INTEGER PRIMARY KEY"]
                + [f"{quote_identifier(p)} REAL" for p in self.varied_paths]
                + [f"{quote_identifier(name)} {kind}" for name, kind in RESULT_COLUMNS]
            )
            conn.execute(f"CREATE TABLE IF NOT EXISTS cases ({columns})")
            fresh = {"varied_paths": self.varied_paths, **meta}
            if "created" not in stored:
                fresh["created"] = datetime.now(timezone.utc).isoformat(timespec="seconds")
            conn.executemany(
                "INSERT OR IGNORE INTO meta (key, value) VALUES (?, ?)",
                [(k, json.dumps(v)) for k, v in fresh.items()],
            )

    @staticmethod
    def read_meta_from(conn):
        return {key: json.loads(value) for key, value in conn.execute("SELECT key, value FROM meta")}

    @staticmethod
    def read_meta(path):
        """Stored ``meta`` of an existing store, or ``{}`` if the file or table is missing."""
        path = Path(path)
        if not path.exists():
            return {}
        conn = sqlite3.connect(path)
        try:
            tables = {row[0] for row in conn.execute("SELECT name FROM sqlite_master WHERE type='table'")}
            return ResultsStore.read_meta_from(conn) if "meta" in tables else {}
        finally:
            conn.close()

    def meta(self):
        """The stored ``meta`` table as a dict."""
        return self.read_meta_from(self._conn)

    # -- reading and writing ----------------------------------------------------------------
    def done_ids(self):
        """Set of case_ids already stored (any status)."""
        return {row[0] for row in self._conn.execute("SELECT case_id FROM cases")}

    def write_rows(self, rows):
        """Insert finished cases in one transaction (all or none).

        Parameters
        ----------
        rows : iterable of dict
            Each with ``case_id``, every varied path (SI value) and the result fields;
            missing result fields are stored as NULL, NaN as NULL.

        Raises
        ------
        sqlite3.IntegrityError
            If a case_id is already stored (a case must never be computed twice).
        """
        columns = self.columns
        sql = (f"INSERT INTO cases ({', '.join(quote_identifier(c) for c in columns)}) "
               f"VALUES ({', '.join('?' for _ in columns)})")
        values = [tuple(_sql_value(row.get(c)) for c in columns) for row in rows]
        with self._conn:
            self._conn.executemany(sql, values)

    def rows(self):
        """All stored rows as dicts ordered by case_id (NULL -> None)."""
        cursor = self._conn.execute(
            f"SELECT {', '.join(quote_identifier(c) for c in self.columns)} FROM cases ORDER BY case_id"
        )
        return [dict(zip(self.columns, values)) for values in cursor]

    def count(self, status=None):
        """Number of stored cases, or of those with the given status."""
        if status is None:
            return self._conn.execute("SELECT COUNT(*) FROM cases").fetchone()[0]
        return self._conn.execute("SELECT COUNT(*) FROM cases WHERE status = ?", (status,)).fetchone()[0]

    def forget(self, status="failed"):
        """Delete the rows with this status (one transaction) so a rerun computes them again.

        Returns
        -------
        int
            Rows deleted.
        """
        with self._conn:
            return self._conn.execute("DELETE FROM cases WHERE status = ?", (status,)).rowcount

    def export_csv(self, path):
        """Write every stored row to a CSV file atomically (header = column names).

        Parameters
        ----------
        path : str or Path
            Output file, e.g. ``DIR/results.csv``.

        Returns
        -------
        Path
            The written file.
        """
        buffer = io.StringIO()
        writer = csv.writer(buffer, lineterminator="\n")
        writer.writerow(self.columns)
        for row in self.rows():
            writer.writerow(["" if row[c] is None else row[c] for c in self.columns])
        return atomic_write_text(path, buffer.getvalue())

    def close(self):
        """Close the database connection."""
        self._conn.close()

    def __enter__(self):
        return self

    def __exit__(self, *exc):
        self.close()


def _sql_value(value):
    if value is None or isinstance(value, str):
        return value
    if isinstance(value, bool):
        return int(value)
    value = float(value)
    return value if math.isfinite(value) else None


def _short(value, limit=120):
    text = json.dumps(value)
    return text if len(text) <= limit else text[: limit - 3] + "..."
