"""Critical constants: the fast line scan of Cantera's critical-properties.yaml equals a full YAML parse."""
from simulator.thermo.critical import _critical_table, _critical_table_yaml, _formula_key


def test_line_scan_equals_yaml_parse():
    fast = _critical_table()
    assert fast == _critical_table_yaml()
    assert len(fast) > 600


def test_formula_keys_follow_the_table_convention():
    # the table is keyed by formula with C and H first (e.g. methanol is CH4O)
    assert _formula_key({"C": 1, "H": 4, "O": 1}) == "CH4O"
    assert _formula_key({"N": 2}) == "N2"
    assert "CH4O" in _critical_table() and "N2" in _critical_table()
