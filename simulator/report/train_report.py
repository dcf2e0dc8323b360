"""``tubesim report`` on a reactor train: report.html (and report.pdf) of the train run.

Runs the train (:func:`simulator.solve.train.simulate_train`), builds the display context
(:func:`simulator.report.context_train.train_context`) and renders ``templates/train_report.html.j2``
through the same renderer, CSS and data-only PDF path as the single-tube report
(:func:`simulator.report.pdf.write_report`). A failed train has no report (it would be no design basis):
the error says which bed failed, where and why.
"""
from simulator.errors import IntegrationError

TEMPLATE = "train_report.html.j2"


def write_train_report(case, out_dir, pdf=True, command_line=""):
    """Run a train case and write its report.

    Parameters
    ----------
    case : simulator.case.schema.Case
        A validated case with ``train`` set, [-]
    out_dir : str or pathlib.Path
        Output folder, created if needed, [-]
    pdf : bool
        Also write ``report.pdf``, [-]
    command_line : str
        Command that asked for the report, for provenance, [-]

    Returns
    -------
    dict of str to pathlib.Path
        ``{"html": path}`` and, with ``pdf``, ``{"pdf": path}``, [-]
    """
    from simulator.report.context_train import train_context
    from simulator.report.pdf import write_report
    from simulator.solve.train import simulate_train

    train = simulate_train(case)
    if train.status == "failed":
        raise IntegrationError(train.termination)
    return write_report(train_context(case, train, command_line), out_dir, pdf=pdf, template=TEMPLATE)
