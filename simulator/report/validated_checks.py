"""Published checks of the test suite, as the report lists them (a data snapshot).

Made by :func:`simulator.report.validation.write_snapshot` from the
``@pytest.mark.published`` markers under ``tests/``, so that an installed copy
without ``tests/`` lists them too. ``tests/test_report_end_to_end.py`` fails when
this snapshot and the markers differ; after changing a marker, run
``python -c "from simulator.report.validation import write_snapshot; write_snapshot()"``.
"""
CHECKS = ({'check': 'Ideal branch equals Levenspiel volume with expansion',
  'source': 'O. Levenspiel, Chemical Reaction Engineering, 3rd ed., Wiley, 1999, ch. 5 (equation numbers '
            'from memory) — ch. 5, PFR performance equation with expansion, first order (eq. 5.21 from '
            'memory)',
  'key': 'levenspiel1999',
  'citation': 'O. Levenspiel, Chemical Reaction Engineering, 3rd ed., Wiley, 1999, ch. 5 (equation numbers '
              'from memory)',
  'where': 'ch. 5, PFR performance equation with expansion, first order (eq. 5.21 from memory)',
  'test': 'tests/test_assumptions.py::test_ideal_branch_equals_levenspiel_volume_with_expansion'},
 {'check': 'Lhhw rate equals the hand formula',
  'source': 'O.A. Hougen, K.M. Watson, Chemical Process Principles, Part III: Kinetics and Catalysis, Wiley, '
            '1947 (form of the Langmuir-Hinshelwood-Hougen-Watson rate; from memory) — LHHW rate form '
            'evaluated by hand',
  'key': 'hougen_watson1947',
  'citation': 'O.A. Hougen, K.M. Watson, Chemical Process Principles, Part III: Kinetics and Catalysis, '
              'Wiley, 1947 (form of the Langmuir-Hinshelwood-Hougen-Watson rate; from memory)',
  'where': 'LHHW rate form evaluated by hand',
  'test': 'tests/test_balances.py::test_lhhw_rate_equals_the_hand_formula'},
 {'check': 'Reversible rate runs to the equilibrium Cantera computes',
  'source': "D.G. Goodwin, H.K. Moffat, I. Schoegl, R.L. Speth, B.W. Weber, 'Cantera: An object-oriented "
            "software toolkit for chemical kinetics, thermodynamics, and transport processes', version 3.2, "
            "https://www.cantera.org — equilibrate('TP'): Gibbs minimisation on the same species data",
  'key': 'cantera',
  'citation': "D.G. Goodwin, H.K. Moffat, I. Schoegl, R.L. Speth, B.W. Weber, 'Cantera: An object-oriented "
              "software toolkit for chemical kinetics, thermodynamics, and transport processes', version "
              '3.2, https://www.cantera.org',
  'where': "equilibrate('TP'): Gibbs minimisation on the same species data",
  'test': 'tests/test_balances.py::test_reversible_rate_runs_to_the_equilibrium_cantera_computes'},
 {'check': 'Pipe friction gradient equals darcy weisbach with fluids',
  'source': 'C. Bell et al., fluids: fluid dynamics component of Chemical Engineering Design Library '
            "(ChEDL), PyPI package 'fluids' — fluids.friction.Clamond (Colebrook solved exactly) in "
            'Darcy-Weisbach',
  'key': 'fluids',
  'citation': 'C. Bell et al., fluids: fluid dynamics component of Chemical Engineering Design Library '
              "(ChEDL), PyPI package 'fluids'",
  'where': 'fluids.friction.Clamond (Colebrook solved exactly) in Darcy-Weisbach',
  'test': 'tests/test_balances.py::test_pipe_friction_gradient_equals_darcy_weisbach_with_fluids'},
 {'check': 'Adiabatic rise takes the worst case over several reactions',
  'source': "D.G. Goodwin, H.K. Moffat, I. Schoegl, R.L. Speth, B.W. Weber, 'Cantera: An object-oriented "
            "software toolkit for chemical kinetics, thermodynamics, and transport processes', version 3.2, "
            'https://www.cantera.org — enthalpy balance at fixed composition (HPX) on the same NASA data',
  'key': 'cantera',
  'citation': "D.G. Goodwin, H.K. Moffat, I. Schoegl, R.L. Speth, B.W. Weber, 'Cantera: An object-oriented "
              "software toolkit for chemical kinetics, thermodynamics, and transport processes', version "
              '3.2, https://www.cantera.org',
  'where': 'enthalpy balance at fixed composition (HPX) on the same NASA data',
  'test': 'tests/test_balances.py::test_adiabatic_rise_takes_the_worst_case_over_several_reactions'},
 {'check': 'Hot spot against published case',
  'source': "G.F. Froment, 'Fixed bed catalytic reactors - current design status', Ind. Eng. Chem. 59(2), "
            "18-27, 1967 (content from memory); parameters as reproduced in the project's reference notes "
            '(shared/reference/runaway.md, section 2), hot-spot values from an independent reproduction '
            'there (LSODA, rtol 1e-10) — published model and data; check values from an independent '
            'reproduction (not printed values), p0 = 0.011-0.0175 atm',
  'key': 'froment1967',
  'citation': "G.F. Froment, 'Fixed bed catalytic reactors - current design status', Ind. Eng. Chem. 59(2), "
              "18-27, 1967 (content from memory); parameters as reproduced in the project's reference notes "
              '(shared/reference/runaway.md, section 2), hot-spot values from an independent reproduction '
              'there (LSODA, rtol 1e-10)',
  'where': 'published model and data; check values from an independent reproduction (not printed values), p0 '
           '= 0.011-0.0175 atm',
  'test': 'tests/test_oxylene_published.py::test_hot_spot_against_published_case'},
 {'check': 'Hot spot jumps between 0.0175 and 0.018 atm',
  'source': "G.F. Froment, 'Fixed bed catalytic reactors - current design status', Ind. Eng. Chem. 59(2), "
            "18-27, 1967 (content from memory); parameters as reproduced in the project's reference notes "
            '(shared/reference/runaway.md, section 2), hot-spot values from an independent reproduction '
            'there (LSODA, rtol 1e-10) — runaway between p0 = 0.0175 and 0.018 atm (independent '
            "reproduction; the source's figure shows it just above 0.018 atm, from memory)",
  'key': 'froment1967',
  'citation': "G.F. Froment, 'Fixed bed catalytic reactors - current design status', Ind. Eng. Chem. 59(2), "
              "18-27, 1967 (content from memory); parameters as reproduced in the project's reference notes "
              '(shared/reference/runaway.md, section 2), hot-spot values from an independent reproduction '
              'there (LSODA, rtol 1e-10)',
  'where': "runaway between p0 = 0.0175 and 0.018 atm (independent reproduction; the source's figure shows "
           'it just above 0.018 atm, from memory)',
  'test': 'tests/test_oxylene_published.py::test_hot_spot_jumps_between_0_0175_and_0_018_atm'},
 {'check': 'Ergun 2a fluids docstring example',
  'source': "S. Ergun, 'Fluid flow through packed columns', Chem. Eng. Prog. 48(2), 89-94, 1952 — Ergun "
            'equation, k1 = 150, k2 = 1.75 (check-values 2a)',
  'key': 'ergun1952',
  'citation': "S. Ergun, 'Fluid flow through packed columns', Chem. Eng. Prog. 48(2), 89-94, 1952",
  'where': 'Ergun equation, k1 = 150, k2 = 1.75 (check-values 2a)',
  'test': 'tests/test_pressure_drop.py::test_ergun_2a_fluids_docstring_example'},
 {'check': 'Ergun 2a fluids docstring example',
  'source': 'C. Bell et al., fluids: fluid dynamics component of Chemical Engineering Design Library '
            "(ChEDL), PyPI package 'fluids' — fluids.packed_bed.Ergun docstring example, dp = 8e-4 m",
  'key': 'fluids',
  'citation': 'C. Bell et al., fluids: fluid dynamics component of Chemical Engineering Design Library '
              "(ChEDL), PyPI package 'fluids'",
  'where': 'fluids.packed_bed.Ergun docstring example, dp = 8e-4 m',
  'test': 'tests/test_pressure_drop.py::test_ergun_2a_fluids_docstring_example'},
 {'check': 'Ergun 2b hand value and split into terms',
  'source': "S. Ergun, 'Fluid flow through packed columns', Chem. Eng. Prog. 48(2), 89-94, 1952 — Ergun "
            'equation; hand value of check-values 2b',
  'key': 'ergun1952',
  'citation': "S. Ergun, 'Fluid flow through packed columns', Chem. Eng. Prog. 48(2), 89-94, 1952",
  'where': 'Ergun equation; hand value of check-values 2b',
  'test': 'tests/test_pressure_drop.py::test_ergun_2b_hand_value_and_split_into_terms'},
 {'check': 'Ergun liquid row two metres',
  'source': "S. Ergun, 'Fluid flow through packed columns', Chem. Eng. Prog. 48(2), 89-94, 1952 — Ergun "
            'equation; hand value of check-values 2, third row',
  'key': 'ergun1952',
  'citation': "S. Ergun, 'Fluid flow through packed columns', Chem. Eng. Prog. 48(2), 89-94, 1952",
  'where': 'Ergun equation; hand value of check-values 2, third row',
  'test': 'tests/test_pressure_drop.py::test_ergun_liquid_row_two_metres'},
 {'check': 'Ergun style example',
  'source': "S. Ergun, 'Fluid flow through packed columns', Chem. Eng. Prog. 48(2), 89-94, 1952 — Ergun "
            "equation evaluated by hand (the function's docstring example)",
  'key': 'ergun1952',
  'citation': "S. Ergun, 'Fluid flow through packed columns', Chem. Eng. Prog. 48(2), 89-94, 1952",
  'where': "Ergun equation evaluated by hand (the function's docstring example)",
  'test': 'tests/test_pressure_drop.py::test_ergun_style_example'},
 {'check': 'Ergun against fluids',
  'source': 'C. Bell et al., fluids: fluid dynamics component of Chemical Engineering Design Library '
            "(ChEDL), PyPI package 'fluids' — fluids.packed_bed.Ergun(dp, voidage, vs, rho, mu, L)",
  'key': 'fluids',
  'citation': 'C. Bell et al., fluids: fluid dynamics component of Chemical Engineering Design Library '
              "(ChEDL), PyPI package 'fluids'",
  'where': 'fluids.packed_bed.Ergun(dp, voidage, vs, rho, mu, L)',
  'test': 'tests/test_pressure_drop.py::test_ergun_against_fluids'},
 {'check': 'Isothermal ideal gas bed pressure profile 2c',
  'source': "S. Ergun, 'Fluid flow through packed columns', Chem. Eng. Prog. 48(2), 89-94, 1952 — Ergun "
            'equation; closed-form isothermal P/P0 (check-values 2c)',
  'key': 'ergun1952',
  'citation': "S. Ergun, 'Fluid flow through packed columns', Chem. Eng. Prog. 48(2), 89-94, 1952",
  'where': 'Ergun equation; closed-form isothermal P/P0 (check-values 2c)',
  'test': 'tests/test_pressure_drop.py::test_isothermal_ideal_gas_bed_pressure_profile_2c'},
 {'check': 'Laminar darcy weisbach is hagen poiseuille',
  'source': 'C. Bell et al., fluids: fluid dynamics component of Chemical Engineering Design Library '
            "(ChEDL), PyPI package 'fluids' — fluids.friction.friction_laminar and fluids.core.Reynolds",
  'key': 'fluids',
  'citation': 'C. Bell et al., fluids: fluid dynamics component of Chemical Engineering Design Library '
              "(ChEDL), PyPI package 'fluids'",
  'where': 'fluids.friction.friction_laminar and fluids.core.Reynolds',
  'test': 'tests/test_pressure_drop.py::test_laminar_darcy_weisbach_is_hagen_poiseuille'},
 {'check': 'Colebrook check values',
  'source': "C.F. Colebrook, 'Turbulent flow in pipes, with particular reference to the transition region "
            "between the smooth and rough pipe laws', J. ICE 11(4), 133-156, 1939 — Colebrook equation "
            'solved exactly; check-values 3a-3c and rows without id',
  'key': 'colebrook1939',
  'citation': "C.F. Colebrook, 'Turbulent flow in pipes, with particular reference to the transition region "
              "between the smooth and rough pipe laws', J. ICE 11(4), 133-156, 1939",
  'where': 'Colebrook equation solved exactly; check-values 3a-3c and rows without id',
  'test': 'tests/test_pressure_drop.py::test_colebrook_check_values'},
 {'check': 'Colebrook fully rough limit',
  'source': "C.F. Colebrook, 'Turbulent flow in pipes, with particular reference to the transition region "
            "between the smooth and rough pipe laws', J. ICE 11(4), 133-156, 1939 — fully rough limit of the "
            'Colebrook equation',
  'key': 'colebrook1939',
  'citation': "C.F. Colebrook, 'Turbulent flow in pipes, with particular reference to the transition region "
              "between the smooth and rough pipe laws', J. ICE 11(4), 133-156, 1939",
  'where': 'fully rough limit of the Colebrook equation',
  'test': 'tests/test_pressure_drop.py::test_colebrook_fully_rough_limit'},
 {'check': 'Colebrook fluids docstring example',
  'source': 'C. Bell et al., fluids: fluid dynamics component of Chemical Engineering Design Library '
            "(ChEDL), PyPI package 'fluids' — fluids.friction.Colebrook docstring example (1e5, 1e-4)",
  'key': 'fluids',
  'citation': 'C. Bell et al., fluids: fluid dynamics component of Chemical Engineering Design Library '
              "(ChEDL), PyPI package 'fluids'",
  'where': 'fluids.friction.Colebrook docstring example (1e5, 1e-4)',
  'test': 'tests/test_pressure_drop.py::test_colebrook_fluids_docstring_example'},
 {'check': 'Colebrook against fluids clamond',
  'source': 'C. Bell et al., fluids: fluid dynamics component of Chemical Engineering Design Library '
            "(ChEDL), PyPI package 'fluids' — fluids.friction.Clamond: Colebrook solved to machine precision",
  'key': 'fluids',
  'citation': 'C. Bell et al., fluids: fluid dynamics component of Chemical Engineering Design Library '
              "(ChEDL), PyPI package 'fluids'",
  'where': 'fluids.friction.Clamond: Colebrook solved to machine precision',
  'test': 'tests/test_pressure_drop.py::test_colebrook_against_fluids_clamond'},
 {'check': 'Colebrook residual is zero',
  'source': "C.F. Colebrook, 'Turbulent flow in pipes, with particular reference to the transition region "
            "between the smooth and rough pipe laws', J. ICE 11(4), 133-156, 1939 — the Colebrook equation "
            'itself (residual)',
  'key': 'colebrook1939',
  'citation': "C.F. Colebrook, 'Turbulent flow in pipes, with particular reference to the transition region "
              "between the smooth and rough pipe laws', J. ICE 11(4), 133-156, 1939",
  'where': 'the Colebrook equation itself (residual)',
  'test': 'tests/test_pressure_drop.py::test_colebrook_residual_is_zero'},
 {'check': 'Churchill check values',
  'source': "S.W. Churchill, 'Friction-factor equation spans all fluid-flow regimes', Chem. Eng. 84(24), "
            "91-92, 1977 (journal details from memory) — Churchill equation; check-values 3 'other forms' "
            'column',
  'key': 'churchill1977',
  'citation': "S.W. Churchill, 'Friction-factor equation spans all fluid-flow regimes', Chem. Eng. 84(24), "
              '91-92, 1977 (journal details from memory)',
  'where': "Churchill equation; check-values 3 'other forms' column",
  'test': 'tests/test_pressure_drop.py::test_churchill_check_values'},
 {'check': 'Churchill against fluids',
  'source': 'C. Bell et al., fluids: fluid dynamics component of Chemical Engineering Design Library '
            "(ChEDL), PyPI package 'fluids' — fluids.friction.Churchill_1977 (docstring example 1e5, 1e-4 "
            'and all regimes)',
  'key': 'fluids',
  'citation': 'C. Bell et al., fluids: fluid dynamics component of Chemical Engineering Design Library '
              "(ChEDL), PyPI package 'fluids'",
  'where': 'fluids.friction.Churchill_1977 (docstring example 1e5, 1e-4 and all regimes)',
  'test': 'tests/test_pressure_drop.py::test_churchill_against_fluids'},
 {'check': 'Churchill transition 3i',
  'source': 'C. Bell et al., fluids: fluid dynamics component of Chemical Engineering Design Library '
            "(ChEDL), PyPI package 'fluids' — fluids.friction.Churchill_1977, transition value of "
            'check-values 3i',
  'key': 'fluids',
  'citation': 'C. Bell et al., fluids: fluid dynamics component of Chemical Engineering Design Library '
              "(ChEDL), PyPI package 'fluids'",
  'where': 'fluids.friction.Churchill_1977, transition value of check-values 3i',
  'test': 'tests/test_pressure_drop.py::test_churchill_transition_3i'},
 {'check': 'Churchill close to Colebrook in turbulent flow',
  'source': "C.F. Colebrook, 'Turbulent flow in pipes, with particular reference to the transition region "
            "between the smooth and rough pipe laws', J. ICE 11(4), 133-156, 1939 — Colebrook equation",
  'key': 'colebrook1939',
  'citation': "C.F. Colebrook, 'Turbulent flow in pipes, with particular reference to the transition region "
              "between the smooth and rough pipe laws', J. ICE 11(4), 133-156, 1939",
  'where': 'Colebrook equation',
  'test': 'tests/test_pressure_drop.py::test_churchill_close_to_colebrook_in_turbulent_flow'},
 {'check': 'Churchill close to Colebrook in turbulent flow',
  'source': "S.W. Churchill, 'Friction-factor equation spans all fluid-flow regimes', Chem. Eng. 84(24), "
            '91-92, 1977 (journal details from memory) — Churchill equation',
  'key': 'churchill1977',
  'citation': "S.W. Churchill, 'Friction-factor equation spans all fluid-flow regimes', Chem. Eng. 84(24), "
              '91-92, 1977 (journal details from memory)',
  'where': 'Churchill equation',
  'test': 'tests/test_pressure_drop.py::test_churchill_close_to_colebrook_in_turbulent_flow'},
 {'check': 'Blasius check values',
  'source': "H. Blasius, 'Das Aehnlichkeitsgesetz bei Reibungsvorgaengen in Fluessigkeiten', Mitt. "
            'Forschungsarb. Geb. Ingenieurwes. 131, 1-41, 1913 — f = 0.3164 Re^-0.25 (check-values 3d, 3e '
            'and row Re = 1e5)',
  'key': 'blasius1913',
  'citation': "H. Blasius, 'Das Aehnlichkeitsgesetz bei Reibungsvorgaengen in Fluessigkeiten', Mitt. "
              'Forschungsarb. Geb. Ingenieurwes. 131, 1-41, 1913',
  'where': 'f = 0.3164 Re^-0.25 (check-values 3d, 3e and row Re = 1e5)',
  'test': 'tests/test_pressure_drop.py::test_blasius_check_values'},
 {'check': 'Blasius and laminar against fluids',
  'source': 'C. Bell et al., fluids: fluid dynamics component of Chemical Engineering Design Library '
            "(ChEDL), PyPI package 'fluids' — fluids.friction.Blasius and fluids.friction.friction_laminar",
  'key': 'fluids',
  'citation': 'C. Bell et al., fluids: fluid dynamics component of Chemical Engineering Design Library '
              "(ChEDL), PyPI package 'fluids'",
  'where': 'fluids.friction.Blasius and fluids.friction.friction_laminar',
  'test': 'tests/test_pressure_drop.py::test_blasius_and_laminar_against_fluids'},
 {'check': 'Haaland against fluids and close to Colebrook',
  'source': 'C. Bell et al., fluids: fluid dynamics component of Chemical Engineering Design Library '
            "(ChEDL), PyPI package 'fluids' — fluids.friction.Haaland (docstring example 1e5, 1e-4)",
  'key': 'fluids',
  'citation': 'C. Bell et al., fluids: fluid dynamics component of Chemical Engineering Design Library '
              "(ChEDL), PyPI package 'fluids'",
  'where': 'fluids.friction.Haaland (docstring example 1e5, 1e-4)',
  'test': 'tests/test_pressure_drop.py::test_haaland_against_fluids_and_close_to_colebrook'},
 {'check': 'Pr departure against direct cubic and Cantera',
  'source': "D.-Y. Peng, D.B. Robinson, 'A new two-constant equation of state', Ind. Eng. Chem. Fundam. "
            '15(1), 59-64, 1976 (equations from memory) — PR cubic, a = 0.45724 R^2 Tc^2/Pc, b = 0.07780 R '
            'Tc/Pc, kappa(omega), eqs. from memory',
  'key': 'peng_robinson1976',
  'citation': "D.-Y. Peng, D.B. Robinson, 'A new two-constant equation of state', Ind. Eng. Chem. Fundam. "
              '15(1), 59-64, 1976 (equations from memory)',
  'where': 'PR cubic, a = 0.45724 R^2 Tc^2/Pc, b = 0.07780 R Tc/Pc, kappa(omega), eqs. from memory',
  'test': 'tests/test_real_gas.py::test_pr_departure_against_direct_cubic_and_cantera'},
 {'check': 'Pr z of a run within 3 percent of reference eos',
  'source': "U. Setzmann, W. Wagner, 'A new equation of state and tables of thermodynamic properties for "
            "methane covering the range from the melting line to 625 K at pressures up to 1000 MPa', J. "
            'Phys. Chem. Ref. Data 20(6), 1061-1155, 1991 (title from memory), evaluated through CoolProp — '
            'methane reference EOS through CoolProp, Z at the states of check-values section 7',
  'key': 'setzmann_wagner1991',
  'citation': "U. Setzmann, W. Wagner, 'A new equation of state and tables of thermodynamic properties for "
              "methane covering the range from the melting line to 625 K at pressures up to 1000 MPa', J. "
              'Phys. Chem. Ref. Data 20(6), 1061-1155, 1991 (title from memory), evaluated through CoolProp',
  'where': 'methane reference EOS through CoolProp, Z at the states of check-values section 7',
  'test': 'tests/test_real_gas.py::test_pr_z_of_a_run_within_3_percent_of_reference_eos'},
 {'check': 'Pr z of a run within 3 percent of reference eos',
  'source': "R. Span, E.W. Lemmon, R.T. Jacobsen, W. Wagner, A. Yokozeki, 'A reference equation of state for "
            'the thermodynamic properties of nitrogen for temperatures from 63.151 to 1000 K and pressures '
            "to 2200 MPa', J. Phys. Chem. Ref. Data 29(6), 1361-1433, 2000 (title from memory), evaluated "
            'through CoolProp — nitrogen reference EOS through CoolProp, Z at the states of check-values '
            'section 7',
  'key': 'span2000',
  'citation': "R. Span, E.W. Lemmon, R.T. Jacobsen, W. Wagner, A. Yokozeki, 'A reference equation of state "
              'for the thermodynamic properties of nitrogen for temperatures from 63.151 to 1000 K and '
              "pressures to 2200 MPa', J. Phys. Chem. Ref. Data 29(6), 1361-1433, 2000 (title from memory), "
              'evaluated through CoolProp',
  'where': 'nitrogen reference EOS through CoolProp, Z at the states of check-values section 7',
  'test': 'tests/test_real_gas.py::test_pr_z_of_a_run_within_3_percent_of_reference_eos'},
 {'check': 'Pr z of a run within 3 percent of reference eos',
  'source': "I.H. Bell, J. Wronski, S. Quoilin, V. Lemort, 'Pure and pseudo-pure fluid thermophysical "
            "property evaluation and the open-source thermophysical property library CoolProp', Ind. Eng. "
            "Chem. Res. 53(6), 2498-2508, 2014 — PropsSI('Z', 'T', T, 'P', P, fluid)",
  'key': 'coolprop',
  'citation': "I.H. Bell, J. Wronski, S. Quoilin, V. Lemort, 'Pure and pseudo-pure fluid thermophysical "
              "property evaluation and the open-source thermophysical property library CoolProp', Ind. Eng. "
              'Chem. Res. 53(6), 2498-2508, 2014',
  'where': "PropsSI('Z', 'T', T, 'P', P, fluid)",
  'test': 'tests/test_real_gas.py::test_pr_z_of_a_run_within_3_percent_of_reference_eos'},
 {'check': 'Ideal gas run reports pr z in profile and summary',
  'source': "D.-Y. Peng, D.B. Robinson, 'A new two-constant equation of state', Ind. Eng. Chem. Fundam. "
            '15(1), 59-64, 1976 (equations from memory) — Z of the ideal-gas check computed with PR',
  'key': 'peng_robinson1976',
  'citation': "D.-Y. Peng, D.B. Robinson, 'A new two-constant equation of state', Ind. Eng. Chem. Fundam. "
              '15(1), 59-64, 1976 (equations from memory)',
  'where': 'Z of the ideal-gas check computed with PR',
  'test': 'tests/test_real_gas.py::test_ideal_gas_run_reports_pr_z_in_profile_and_summary'},
 {'check': 'Pr throttling against reference eos',
  'source': "U. Setzmann, W. Wagner, 'A new equation of state and tables of thermodynamic properties for "
            "methane covering the range from the melting line to 625 K at pressures up to 1000 MPa', J. "
            'Phys. Chem. Ref. Data 20(6), 1061-1155, 1991 (title from memory), evaluated through CoolProp — '
            'isenthalpic throttling of methane, reference EOS through CoolProp',
  'key': 'setzmann_wagner1991',
  'citation': "U. Setzmann, W. Wagner, 'A new equation of state and tables of thermodynamic properties for "
              "methane covering the range from the melting line to 625 K at pressures up to 1000 MPa', J. "
              'Phys. Chem. Ref. Data 20(6), 1061-1155, 1991 (title from memory), evaluated through CoolProp',
  'where': 'isenthalpic throttling of methane, reference EOS through CoolProp',
  'test': 'tests/test_real_gas.py::test_pr_throttling_against_reference_eos'},
 {'check': 'Pr throttling against reference eos',
  'source': "I.H. Bell, J. Wronski, S. Quoilin, V. Lemort, 'Pure and pseudo-pure fluid thermophysical "
            "property evaluation and the open-source thermophysical property library CoolProp', Ind. Eng. "
            "Chem. Res. 53(6), 2498-2508, 2014 — PropsSI('Hmolar', ...) for methane",
  'key': 'coolprop',
  'citation': "I.H. Bell, J. Wronski, S. Quoilin, V. Lemort, 'Pure and pseudo-pure fluid thermophysical "
              "property evaluation and the open-source thermophysical property library CoolProp', Ind. Eng. "
              'Chem. Res. 53(6), 2498-2508, 2014',
  'where': "PropsSI('Hmolar', ...) for methane",
  'test': 'tests/test_real_gas.py::test_pr_throttling_against_reference_eos'},
 {'check': 'Methanator adiabatic rise against hand enthalpy balance',
  'source': 'M.W. Chase, NIST-JANAF Thermochemical Tables, 4th ed., J. Phys. Chem. Ref. Data Monograph 9, '
            "1998 (values read from the 'chemicals' package data) — CO + 3 H2 -> CH4 + H2O, dH_r(573.15 K) "
            'from JANAF dfH and Cp (check-values 6a)',
  'key': 'chase1998',
  'citation': 'M.W. Chase, NIST-JANAF Thermochemical Tables, 4th ed., J. Phys. Chem. Ref. Data Monograph 9, '
              "1998 (values read from the 'chemicals' package data)",
  'where': 'CO + 3 H2 -> CH4 + H2O, dH_r(573.15 K) from JANAF dfH and Cp (check-values 6a)',
  'test': 'tests/test_real_gas.py::test_methanator_adiabatic_rise_against_hand_enthalpy_balance'},
 {'check': 'Methanator adiabatic rise against hand enthalpy balance',
  'source': "I.H. Bell, J. Wronski, S. Quoilin, V. Lemort, 'Pure and pseudo-pure fluid thermophysical "
            "property evaluation and the open-source thermophysical property library CoolProp', Ind. Eng. "
            'Chem. Res. 53(6), 2498-2508, 2014 — ideal-gas Cp0molar of Hydrogen, Nitrogen, Methane, Water',
  'key': 'coolprop',
  'citation': "I.H. Bell, J. Wronski, S. Quoilin, V. Lemort, 'Pure and pseudo-pure fluid thermophysical "
              "property evaluation and the open-source thermophysical property library CoolProp', Ind. Eng. "
              'Chem. Res. 53(6), 2498-2508, 2014',
  'where': 'ideal-gas Cp0molar of Hydrogen, Nitrogen, Methane, Water',
  'test': 'tests/test_real_gas.py::test_methanator_adiabatic_rise_against_hand_enthalpy_balance'},
 {'check': 'Reversible reaction on Peng Robinson reaches fugacity equilibrium',
  'source': "D.G. Goodwin, H.K. Moffat, I. Schoegl, R.L. Speth, B.W. Weber, 'Cantera: An object-oriented "
            "software toolkit for chemical kinetics, thermodynamics, and transport processes', version 3.2, "
            "https://www.cantera.org — Peng-Robinson chemical potentials of Cantera's own PR phase",
  'key': 'cantera',
  'citation': "D.G. Goodwin, H.K. Moffat, I. Schoegl, R.L. Speth, B.W. Weber, 'Cantera: An object-oriented "
              "software toolkit for chemical kinetics, thermodynamics, and transport processes', version "
              '3.2, https://www.cantera.org',
  'where': "Peng-Robinson chemical potentials of Cantera's own PR phase",
  'test': 'tests/test_real_gas.py::test_reversible_reaction_on_peng_robinson_reaches_fugacity_equilibrium'},
 {'check': 'Semenov critical against closed form table',
  'source': "N.N. Semenov, 'Zur Theorie des Verbrennungsprozesses', Z. Phys. 48, 571, 1928 (from memory); "
            'psi_c = 1/e at gamma = inf confirmed in F.A. Williams, Combustion Theory, 2nd ed., App. B — '
            'critical condition (tangency); psi_c = 1/e at gamma = inf as in Williams, Combustion Theory, '
            'App. B; finite-gamma table of the project notes (closed form)',
  'key': 'semenov1928',
  'citation': "N.N. Semenov, 'Zur Theorie des Verbrennungsprozesses', Z. Phys. 48, 571, 1928 (from memory); "
              'psi_c = 1/e at gamma = inf confirmed in F.A. Williams, Combustion Theory, 2nd ed., App. B',
  'where': 'critical condition (tangency); psi_c = 1/e at gamma = inf as in Williams, Combustion Theory, '
           'App. B; finite-gamma table of the project notes (closed form)',
  'test': 'tests/test_runaway_criteria.py::test_semenov_critical_against_closed_form_table'},
 {'check': 'Semenov no criticality for gamma at most 4',
  'source': "N.N. Semenov, 'Zur Theorie des Verbrennungsprozesses', Z. Phys. 48, 571, 1928 (from memory); "
            'psi_c = 1/e at gamma = inf confirmed in F.A. Williams, Combustion Theory, 2nd ed., App. B — no '
            'critical point for gamma <= 4 (closed form: double root at 4)',
  'key': 'semenov1928',
  'citation': "N.N. Semenov, 'Zur Theorie des Verbrennungsprozesses', Z. Phys. 48, 571, 1928 (from memory); "
              'psi_c = 1/e at gamma = inf confirmed in F.A. Williams, Combustion Theory, 2nd ed., App. B',
  'where': 'no critical point for gamma <= 4 (closed form: double root at 4)',
  'test': 'tests/test_runaway_criteria.py::test_semenov_no_criticality_for_gamma_at_most_4'},
 {'check': 'Critical N over B Morbidelli Varma',
  'source': "M. Morbidelli, A. Varma, 'A generalized criterion for parametric sensitivity: application to "
            "thermal explosion theory', Chem. Eng. Sci. 43, 91, 1988 (from memory); also AIChE J. 28, 705, "
            '1982 (from memory) — criterion: maximum of the normalized hot-spot sensitivity, phi = N; '
            'numbers: regression of the reproduction in the project notes (runaway.md table 1.7), not digits '
            'printed in the paper',
  'key': 'morbidelli_varma1988',
  'citation': "M. Morbidelli, A. Varma, 'A generalized criterion for parametric sensitivity: application to "
              "thermal explosion theory', Chem. Eng. Sci. 43, 91, 1988 (from memory); also AIChE J. 28, 705, "
              '1982 (from memory)',
  'where': 'criterion: maximum of the normalized hot-spot sensitivity, phi = N; numbers: regression of the '
           'reproduction in the project notes (runaway.md table 1.7), not digits printed in the paper',
  'test': 'tests/test_runaway_criteria.py::test_critical_N_over_B_morbidelli_varma'},
 {'check': 'Sensitivity peak size grows with B',
  'source': "M. Morbidelli, A. Varma, 'A generalized criterion for parametric sensitivity: application to "
            "thermal explosion theory', Chem. Eng. Sci. 43, 91, 1988 (from memory); also AIChE J. 28, 705, "
            '1982 (from memory) — size of the sensitivity peak: regression of the reproduction in runaway.md '
            'section 1.7 (|s|max = 1.5, 8, 70 at B = 5, 10, 15)',
  'key': 'morbidelli_varma1988',
  'citation': "M. Morbidelli, A. Varma, 'A generalized criterion for parametric sensitivity: application to "
              "thermal explosion theory', Chem. Eng. Sci. 43, 91, 1988 (from memory); also AIChE J. 28, 705, "
              '1982 (from memory)',
  'where': 'size of the sensitivity peak: regression of the reproduction in runaway.md section 1.7 (|s|max = '
           '1.5, 8, 70 at B = 5, 10, 15)',
  'test': 'tests/test_runaway_criteria.py::test_sensitivity_peak_size_grows_with_B'},
 {'check': 'Critical N over B Van Welsenaere Froment maxima',
  'source': "R.J. Van Welsenaere, G.F. Froment, 'Parametric sensitivity and runaway in fixed bed catalytic "
            "reactors', Chem. Eng. Sci. 25, 1503-1516, 1970 (title page and abstract seen; statements of "
            'criteria I and II from memory) — criterion I (hot spot = extremum of the maxima curve); '
            'numbers: regression of runaway.md table 1.7, not printed in the paper',
  'key': 'van_welsenaere_froment1970',
  'citation': "R.J. Van Welsenaere, G.F. Froment, 'Parametric sensitivity and runaway in fixed bed catalytic "
              "reactors', Chem. Eng. Sci. 25, 1503-1516, 1970 (title page and abstract seen; statements of "
              'criteria I and II from memory)',
  'where': 'criterion I (hot spot = extremum of the maxima curve); numbers: regression of runaway.md table '
           '1.7, not printed in the paper',
  'test': 'tests/test_runaway_criteria.py::test_critical_N_over_B_van_welsenaere_froment_maxima'},
 {'check': 'Critical N over B Thomas Bowes',
  'source': "P.H. Thomas, P.C. Bowes, 'Some aspects of the self-heating and ignition of solid cellulosic "
            "materials', Br. J. Appl. Phys. 12, 222, 1961 (from memory) — inflection (convexity before the "
            'hot spot) applied to T(z)',
  'key': 'thomas_bowes1961',
  'citation': "P.H. Thomas, P.C. Bowes, 'Some aspects of the self-heating and ignition of solid cellulosic "
              "materials', Br. J. Appl. Phys. 12, 222, 1961 (from memory)",
  'where': 'inflection (convexity before the hot spot) applied to T(z)',
  'test': 'tests/test_runaway_criteria.py::test_critical_N_over_B_thomas_bowes'},
 {'check': 'Critical N over B Thomas Bowes',
  'source': "R.J. Van Welsenaere, G.F. Froment, 'Parametric sensitivity and runaway in fixed bed catalytic "
            "reactors', Chem. Eng. Sci. 25, 1503-1516, 1970 (title page and abstract seen; statements of "
            'criteria I and II from memory) — criterion II; numbers: regression of runaway.md table 1.7, not '
            'printed in the paper',
  'key': 'van_welsenaere_froment1970',
  'citation': "R.J. Van Welsenaere, G.F. Froment, 'Parametric sensitivity and runaway in fixed bed catalytic "
              "reactors', Chem. Eng. Sci. 25, 1503-1516, 1970 (title page and abstract seen; statements of "
              'criteria I and II from memory)',
  'where': 'criterion II; numbers: regression of runaway.md table 1.7, not printed in the paper',
  'test': 'tests/test_runaway_criteria.py::test_critical_N_over_B_thomas_bowes'},
 {'check': 'Critical N over B Adler Enig',
  'source': "J. Adler, J.W. Enig, 'The critical conditions in thermal explosion theory with reactant "
            "consumption', Combust. Flame 8, 97, 1964 (from memory) — convexity of the "
            'temperature-conversion curve before the maximum; numbers: regression of runaway.md table 1.7, '
            'not printed in the paper',
  'key': 'adler_enig1964',
  'citation': "J. Adler, J.W. Enig, 'The critical conditions in thermal explosion theory with reactant "
              "consumption', Combust. Flame 8, 97, 1964 (from memory)",
  'where': 'convexity of the temperature-conversion curve before the maximum; numbers: regression of '
           'runaway.md table 1.7, not printed in the paper',
  'test': 'tests/test_runaway_criteria.py::test_critical_N_over_B_adler_enig'},
 {'check': 'Ordering of criteria and approach to Semenov',
  'source': "N.N. Semenov, 'Zur Theorie des Verbrennungsprozesses', Z. Phys. 48, 571, 1928 (from memory); "
            'psi_c = 1/e at gamma = inf confirmed in F.A. Williams, Combustion Theory, 2nd ed., App. B — N/B '
            'bound 1/psi_c(gamma)',
  'key': 'semenov1928',
  'citation': "N.N. Semenov, 'Zur Theorie des Verbrennungsprozesses', Z. Phys. 48, 571, 1928 (from memory); "
              'psi_c = 1/e at gamma = inf confirmed in F.A. Williams, Combustion Theory, 2nd ed., App. B',
  'where': 'N/B bound 1/psi_c(gamma)',
  'test': 'tests/test_runaway_criteria.py::test_ordering_of_criteria_and_approach_to_semenov'},
 {'check': 'Ordering of criteria and approach to Semenov',
  'source': "M. Morbidelli, A. Varma, 'A generalized criterion for parametric sensitivity: application to "
            "thermal explosion theory', Chem. Eng. Sci. 43, 91, 1988 (from memory); also AIChE J. 28, 705, "
            '1982 (from memory) — ordering of the criteria: regression of the structural facts stated with '
            'runaway.md table 1.7',
  'key': 'morbidelli_varma1988',
  'citation': "M. Morbidelli, A. Varma, 'A generalized criterion for parametric sensitivity: application to "
              "thermal explosion theory', Chem. Eng. Sci. 43, 91, 1988 (from memory); also AIChE J. 28, 705, "
              '1982 (from memory)',
  'where': 'ordering of the criteria: regression of the structural facts stated with runaway.md table 1.7',
  'test': 'tests/test_runaway_criteria.py::test_ordering_of_criteria_and_approach_to_semenov'},
 {'check': 'Morbidelli Varma critical feed fraction',
  'source': "M. Morbidelli, A. Varma, 'A generalized criterion for parametric sensitivity: application to "
            "thermal explosion theory', Chem. Eng. Sci. 43, 91, 1988 (from memory); also AIChE J. 28, 705, "
            '1982 (from memory) — criterion applied to the Froment (1967) tube; 0.01777 atm from an '
            'independent reproduction, not a printed value',
  'key': 'morbidelli_varma1988',
  'citation': "M. Morbidelli, A. Varma, 'A generalized criterion for parametric sensitivity: application to "
              "thermal explosion theory', Chem. Eng. Sci. 43, 91, 1988 (from memory); also AIChE J. 28, 705, "
              '1982 (from memory)',
  'where': 'criterion applied to the Froment (1967) tube; 0.01777 atm from an independent reproduction, not '
           'a printed value',
  'test': 'tests/test_screening.py::test_morbidelli_varma_critical_feed_fraction'},
 {'check': 'Van Welsenaere Froment maxima curve',
  'source': "R.J. Van Welsenaere, G.F. Froment, 'Parametric sensitivity and runaway in fixed bed catalytic "
            "reactors', Chem. Eng. Sci. 25, 1503-1516, 1970 (title page and abstract seen; statements of "
            'criteria I and II from memory) — maxima-curve criterion on the Froment (1967) tube; 0.01614 atm '
            'from an independent reproduction, T_m - Tw = 31.62 K derived',
  'key': 'van_welsenaere_froment1970',
  'citation': "R.J. Van Welsenaere, G.F. Froment, 'Parametric sensitivity and runaway in fixed bed catalytic "
              "reactors', Chem. Eng. Sci. 25, 1503-1516, 1970 (title page and abstract seen; statements of "
              'criteria I and II from memory)',
  'where': 'maxima-curve criterion on the Froment (1967) tube; 0.01614 atm from an independent reproduction, '
           'T_m - Tw = 31.62 K derived',
  'test': 'tests/test_screening.py::test_van_welsenaere_froment_maxima_curve'},
 {'check': 'Inflection criterion',
  'source': "P.H. Thomas, P.C. Bowes, 'Some aspects of the self-heating and ignition of solid cellulosic "
            "materials', Br. J. Appl. Phys. 12, 222, 1961 (from memory) — inflection test on the Froment "
            '(1967) tube; 0.01761 atm from an independent reproduction',
  'key': 'thomas_bowes1961',
  'citation': "P.H. Thomas, P.C. Bowes, 'Some aspects of the self-heating and ignition of solid cellulosic "
              "materials', Br. J. Appl. Phys. 12, 222, 1961 (from memory)",
  'where': 'inflection test on the Froment (1967) tube; 0.01761 atm from an independent reproduction',
  'test': 'tests/test_screening.py::test_inflection_criterion'},
 {'check': 'Groups of the published tube',
  'source': "G.F. Froment, 'Fixed bed catalytic reactors - current design status', Ind. Eng. Chem. 59(2), "
            "18-27, 1967 (content from memory); parameters as reproduced in the project's reference notes "
            '(shared/reference/runaway.md, section 2), hot-spot values from an independent reproduction '
            'there (LSODA, rtol 1e-10) — groups derived from the published tube data (independent '
            'derivation)',
  'key': 'froment1967',
  'citation': "G.F. Froment, 'Fixed bed catalytic reactors - current design status', Ind. Eng. Chem. 59(2), "
              "18-27, 1967 (content from memory); parameters as reproduced in the project's reference notes "
              '(shared/reference/runaway.md, section 2), hot-spot values from an independent reproduction '
              'there (LSODA, rtol 1e-10)',
  'where': 'groups derived from the published tube data (independent derivation)',
  'test': 'tests/test_screening.py::test_groups_of_the_published_tube'},
 {'check': 'Critical feed fraction near the remembered published value',
  'source': "G.F. Froment, 'Fixed bed catalytic reactors - current design status', Ind. Eng. Chem. 59(2), "
            "18-27, 1967 (content from memory); parameters as reproduced in the project's reference notes "
            '(shared/reference/runaway.md, section 2), hot-spot values from an independent reproduction '
            "there (LSODA, rtol 1e-10) — runaway appears just above p0 = 0.018 atm in the source's profile "
            'figure (from memory): +-3 %',
  'key': 'froment1967',
  'citation': "G.F. Froment, 'Fixed bed catalytic reactors - current design status', Ind. Eng. Chem. 59(2), "
              "18-27, 1967 (content from memory); parameters as reproduced in the project's reference notes "
              '(shared/reference/runaway.md, section 2), hot-spot values from an independent reproduction '
              'there (LSODA, rtol 1e-10)',
  'where': "runaway appears just above p0 = 0.018 atm in the source's profile figure (from memory): +-3 %",
  'test': 'tests/test_screening.py::test_critical_feed_fraction_near_the_remembered_published_value'},
 {'check': 'Sweep boundary matches the Morbidelli Varma critical value',
  'source': "M. Morbidelli, A. Varma, 'A generalized criterion for parametric sensitivity: application to "
            "thermal explosion theory', Chem. Eng. Sci. 43, 91, 1988 (from memory); also AIChE J. 28, 705, "
            '1982 (from memory) — boundary on a sweep grid of the Froment (1967) tube; 0.01777 atm from an '
            'independent reproduction',
  'key': 'morbidelli_varma1988',
  'citation': "M. Morbidelli, A. Varma, 'A generalized criterion for parametric sensitivity: application to "
              "thermal explosion theory', Chem. Eng. Sci. 43, 91, 1988 (from memory); also AIChE J. 28, 705, "
              '1982 (from memory)',
  'where': 'boundary on a sweep grid of the Froment (1967) tube; 0.01777 atm from an independent '
           'reproduction',
  'test': 'tests/test_sweep_cli.py::test_sweep_boundary_matches_the_morbidelli_varma_critical_value'},
 {'check': 'Pure ethanol compressibility at 560 K and 40 bar against Coolprop Peng Robinson',
  'source': "I.H. Bell, J. Wronski, S. Quoilin, V. Lemort, 'Pure and pseudo-pure fluid thermophysical "
            "property evaluation and the open-source thermophysical property library CoolProp', Ind. Eng. "
            'Chem. Res. 53(6), 2498-2508, 2014 — Peng-Robinson compressibility factor of pure ethanol at 560 '
            'K and 40 bar',
  'key': 'coolprop',
  'citation': "I.H. Bell, J. Wronski, S. Quoilin, V. Lemort, 'Pure and pseudo-pure fluid thermophysical "
              "property evaluation and the open-source thermophysical property library CoolProp', Ind. Eng. "
              'Chem. Res. 53(6), 2498-2508, 2014',
  'where': 'Peng-Robinson compressibility factor of pure ethanol at 560 K and 40 bar',
  'test': 'tests/test_thermo_critical.py::test_pure_ethanol_compressibility_at_560_K_and_40_bar_against_coolprop_peng_robinson'},
 {'check': 'Critical constants of water ammonia and other common species against reference equations of '
           'state',
  'source': "W. Wagner, A. Pruss, 'The IAPWS formulation 1995 for the thermodynamic properties of ordinary "
            "water substance for general and scientific use', J. Phys. Chem. Ref. Data 31(2), 387-535, 2002 "
            '(title from memory) — critical point of water, Tc = 647.096 K, pc = 22.064 MPa',
  'key': 'iapws95',
  'citation': "W. Wagner, A. Pruss, 'The IAPWS formulation 1995 for the thermodynamic properties of ordinary "
              "water substance for general and scientific use', J. Phys. Chem. Ref. Data 31(2), 387-535, "
              '2002 (title from memory)',
  'where': 'critical point of water, Tc = 647.096 K, pc = 22.064 MPa',
  'test': 'tests/test_thermo_critical.py::test_critical_constants_of_water_ammonia_and_other_common_species_against_reference_equations_of_state'},
 {'check': 'Critical constants of water ammonia and other common species against reference equations of '
           'state',
  'source': "I.H. Bell, J. Wronski, S. Quoilin, V. Lemort, 'Pure and pseudo-pure fluid thermophysical "
            "property evaluation and the open-source thermophysical property library CoolProp', Ind. Eng. "
            'Chem. Res. 53(6), 2498-2508, 2014 — critical temperature, critical pressure and acentric factor '
            'of the reference equations of state',
  'key': 'coolprop',
  'citation': "I.H. Bell, J. Wronski, S. Quoilin, V. Lemort, 'Pure and pseudo-pure fluid thermophysical "
              "property evaluation and the open-source thermophysical property library CoolProp', Ind. Eng. "
              'Chem. Res. 53(6), 2498-2508, 2014',
  'where': 'critical temperature, critical pressure and acentric factor of the reference equations of state',
  'test': 'tests/test_thermo_critical.py::test_critical_constants_of_water_ammonia_and_other_common_species_against_reference_equations_of_state'},
 {'check': 'Formation enthalpy against JANAF',
  'source': 'M.W. Chase, NIST-JANAF Thermochemical Tables, 4th ed., J. Phys. Chem. Ref. Data Monograph 9, '
            "1998 (values read from the 'chemicals' package data) — standard enthalpies of formation at "
            '298.15 K (ideal gas)',
  'key': 'chase1998',
  'citation': 'M.W. Chase, NIST-JANAF Thermochemical Tables, 4th ed., J. Phys. Chem. Ref. Data Monograph 9, '
              "1998 (values read from the 'chemicals' package data)",
  'where': 'standard enthalpies of formation at 298.15 K (ideal gas)',
  'test': 'tests/test_thermo_janaf.py::test_formation_enthalpy_against_janaf'},
 {'check': 'Heat of reaction against JANAF',
  'source': 'M.W. Chase, NIST-JANAF Thermochemical Tables, 4th ed., J. Phys. Chem. Ref. Data Monograph 9, '
            "1998 (values read from the 'chemicals' package data) — heats of reaction at 298.15 K from JANAF "
            'enthalpies of formation',
  'key': 'chase1998',
  'citation': 'M.W. Chase, NIST-JANAF Thermochemical Tables, 4th ed., J. Phys. Chem. Ref. Data Monograph 9, '
              "1998 (values read from the 'chemicals' package data)",
  'where': 'heats of reaction at 298.15 K from JANAF enthalpies of formation',
  'test': 'tests/test_thermo_janaf.py::test_heat_of_reaction_against_janaf'},
 {'check': 'Heat capacity against JANAF',
  'source': 'M.W. Chase, NIST-JANAF Thermochemical Tables, 4th ed., J. Phys. Chem. Ref. Data Monograph 9, '
            "1998 (values read from the 'chemicals' package data) — ideal-gas heat capacity tables",
  'key': 'chase1998',
  'citation': 'M.W. Chase, NIST-JANAF Thermochemical Tables, 4th ed., J. Phys. Chem. Ref. Data Monograph 9, '
              "1998 (values read from the 'chemicals' package data)",
  'where': 'ideal-gas heat capacity tables',
  'test': 'tests/test_thermo_janaf.py::test_heat_capacity_against_janaf'},
 {'check': 'Levenspiel first order volume',
  'source': 'O. Levenspiel, Chemical Reaction Engineering, 3rd ed., Wiley, 1999, ch. 5 (equation numbers '
            'from memory) — ch. 5, PFR performance equation with expansion, first order (eq. 5.21 from '
            'memory)',
  'key': 'levenspiel1999',
  'citation': 'O. Levenspiel, Chemical Reaction Engineering, 3rd ed., Wiley, 1999, ch. 5 (equation numbers '
              'from memory)',
  'where': 'ch. 5, PFR performance equation with expansion, first order (eq. 5.21 from memory)',
  'test': 'tests/test_validation_closed_forms.py::test_levenspiel_first_order_volume'},
 {'check': 'Levenspiel second order volume',
  'source': 'O. Levenspiel, Chemical Reaction Engineering, 3rd ed., Wiley, 1999, ch. 5 (equation numbers '
            'from memory) — ch. 5, PFR performance equation with expansion, second order (eq. 5.23 from '
            'memory)',
  'key': 'levenspiel1999',
  'citation': 'O. Levenspiel, Chemical Reaction Engineering, 3rd ed., Wiley, 1999, ch. 5 (equation numbers '
              'from memory)',
  'where': 'ch. 5, PFR performance equation with expansion, second order (eq. 5.23 from memory)',
  'test': 'tests/test_validation_closed_forms.py::test_levenspiel_second_order_volume'},
 {'check': 'Packed bed pressure profile',
  'source': "S. Ergun, 'Fluid flow through packed columns', Chem. Eng. Prog. 48(2), 89-94, 1952 — Ergun "
            'equation; closed form P/P0 = (1 - alpha W)^(1/2) derived from it (isothermal, eps = 0, ideal '
            'gas; textbook section from memory)',
  'key': 'ergun1952',
  'citation': "S. Ergun, 'Fluid flow through packed columns', Chem. Eng. Prog. 48(2), 89-94, 1952",
  'where': 'Ergun equation; closed form P/P0 = (1 - alpha W)^(1/2) derived from it (isothermal, eps = 0, '
           'ideal gas; textbook section from memory)',
  'test': 'tests/test_validation_closed_forms.py::test_packed_bed_pressure_profile'},
 {'check': 'Packed bed first order conversion with pressure drop',
  'source': "S. Ergun, 'Fluid flow through packed columns', Chem. Eng. Prog. 48(2), 89-94, 1952 — "
            "first-order conversion with Ergun pressure drop, ln(1/(1-X)) = 2k'/(3 alpha v0) [1 - (1 - alpha "
            'W)^(3/2)], derived from it',
  'key': 'ergun1952',
  'citation': "S. Ergun, 'Fluid flow through packed columns', Chem. Eng. Prog. 48(2), 89-94, 1952",
  'where': "first-order conversion with Ergun pressure drop, ln(1/(1-X)) = 2k'/(3 alpha v0) [1 - (1 - alpha "
           'W)^(3/2)], derived from it',
  'test': 'tests/test_validation_closed_forms.py::test_packed_bed_first_order_conversion_with_pressure_drop'},
 {'check': 'Adiabatic profile on closed form line',
  'source': 'Steady-flow enthalpy balance (first law) with constant heat capacity: T = T0 + (-dH) X / '
            'sum(Theta_i Cp_i); e.g. H.S. Fogler, Elements of Chemical Reaction Engineering, 4th ed., 2006, '
            'ch. 8 (equation number from memory) — adiabatic T-X line with constant Cp (Fogler 2006 ch. 8, '
            'eq. 8-29 from memory)',
  'key': 'energy_balance',
  'citation': 'Steady-flow enthalpy balance (first law) with constant heat capacity: T = T0 + (-dH) X / '
              'sum(Theta_i Cp_i); e.g. H.S. Fogler, Elements of Chemical Reaction Engineering, 4th ed., '
              '2006, ch. 8 (equation number from memory)',
  'where': 'adiabatic T-X line with constant Cp (Fogler 2006 ch. 8, eq. 8-29 from memory)',
  'test': 'tests/test_validation_closed_forms.py::test_adiabatic_profile_on_closed_form_line'},
 {'check': 'Adiabatic temperature rise at complete conversion',
  'source': 'Steady-flow enthalpy balance (first law) with constant heat capacity: T = T0 + (-dH) X / '
            'sum(Theta_i Cp_i); e.g. H.S. Fogler, Elements of Chemical Reaction Engineering, 4th ed., 2006, '
            'ch. 8 (equation number from memory) — adiabatic T-X line at X = 1 (complete conversion)',
  'key': 'energy_balance',
  'citation': 'Steady-flow enthalpy balance (first law) with constant heat capacity: T = T0 + (-dH) X / '
              'sum(Theta_i Cp_i); e.g. H.S. Fogler, Elements of Chemical Reaction Engineering, 4th ed., '
              '2006, ch. 8 (equation number from memory)',
  'where': 'adiabatic T-X line at X = 1 (complete conversion)',
  'test': 'tests/test_validation_closed_forms.py::test_adiabatic_temperature_rise_at_complete_conversion'})
