"""Exception and warning classes of tubesim (imports nothing from the package).

Message shape: ``<where>: <what> = <value as given>: <problem>; <expected>. <hint>``
"""


class SimulatorError(Exception):
    """Base class of every error tubesim raises on purpose."""


class CaseError(SimulatorError, ValueError):
    """Bad or missing case content.

    ``problems`` holds one line per problem found, so every problem in a case
    is reported at once.
    """

    def __init__(self, problems):
        if isinstance(problems, str):
            problems = [problems]
        self.problems = list(problems)
        super().__init__("\n".join(self.problems))


class UnitError(CaseError):
    """A value with an unparseable unit or the wrong dimension."""


class ThermoError(SimulatorError):
    """Thermodynamic data could not be found or evaluated (wraps Cantera errors)."""


class IntegrationError(SimulatorError, RuntimeError):
    """The integrator failed (not a design event such as a temperature limit)."""


class ReportError(SimulatorError):
    """A report could not be rendered or written."""


class SimulatorWarning(UserWarning):
    """Base class of tubesim warnings."""


class OutOfRangeWarning(SimulatorWarning):
    """A correlation, data set or criterion was used outside its stated range."""
