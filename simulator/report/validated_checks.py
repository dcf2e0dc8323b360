"""Published checks of the test suite, as the report lists them (a data snapshot).

Made by :func:`simulator.report.validation.write_snapshot` from the
``@pytest.mark.published`` markers under ``tests/``, so that an installed copy
without ``tests/`` lists them too. ``tests/test_report_end_to_end.py`` fails when
this snapshot and the markers differ; after changing a marker, run
``python -c "from simulator.report.validation import write_snapshot; write_snapshot()"``.
"""
CHECKS = ({'key': 'levenspiel1999',
  'citation': 'O. Levenspiel, Chemical Reaction Engineering, 3rd ed., Wiley, 1999, ch. 5',
  'compared': 'Volume of an isothermal plug-flow reactor with change in moles (first and second order), and '
              'the ideal design of the assumption check, against the closed-form performance equations',
  'where': 'ch. 5, PFR performance equation with expansion, first order (eq. 5.21 from memory)',
  'test': 'tests/test_assumptions.py::test_ideal_branch_equals_levenspiel_volume_with_expansion'},
 {'key': 'hougen_watson1947',
  'citation': 'O.A. Hougen, K.M. Watson, Chemical Process Principles, Part III: Kinetics and Catalysis, '
              'Wiley, 1947',
  'compared': 'Rate of a Hougen-Watson (adsorption-inhibited) rate law with temperature-dependent adsorption '
              'constants against the published rate form evaluated directly',
  'where': 'LHHW rate form evaluated by hand',
  'test': 'tests/test_balances.py::test_lhhw_rate_equals_the_hand_formula'},
 {'key': 'cantera',
  'citation': "D.G. Goodwin, H.K. Moffat, I. Schoegl, R.L. Speth, B.W. Weber, 'Cantera: An object-oriented "
              "software toolkit for chemical kinetics, thermodynamics, and transport processes', version "
              '3.2, https://www.cantera.org',
  'compared': 'Equilibrium reached by reversible rates (ideal gas and Peng-Robinson fugacities) against '
              'Gibbs-energy minimisation on the same species data; adiabatic temperature rise against an '
              'enthalpy balance on the same data; mixture viscosity (Wilke rule on pure-species fits) '
              'against its mixture-averaged transport; a detailed-mechanism tube (adiabatic, isobaric, '
              'hydrogen/air on GRI-Mech 3.0 species) against its constant-pressure reactor marched in time '
              '(outlet temperature and composition, ignition position) and against its equilibrium at '
              'constant enthalpy and pressure; a cooled mechanism tube with friction against its extensible '
              'reactor carrying the wall heat and pressure drop',
  'where': "equilibrate('TP'): Gibbs minimisation on the same species data",
  'test': 'tests/test_balances.py::test_reversible_rate_runs_to_the_equilibrium_cantera_computes'},
 {'key': 'fluids',
  'citation': 'C. Bell et al., fluids: fluid dynamics component of the Chemical Engineering Design Library '
              "(ChEDL), Python package 'fluids'",
  'compared': 'Friction factors (Colebrook, Churchill, Blasius, Haaland, laminar), pipe and packed-bed '
              '(Ergun) pressure gradients against an independent open-source implementation',
  'where': 'fluids.friction.Clamond (Colebrook solved exactly) in Darcy-Weisbach',
  'test': 'tests/test_balances.py::test_pipe_friction_gradient_equals_darcy_weisbach_with_fluids'},
 {'key': 'cantera',
  'citation': "D.G. Goodwin, H.K. Moffat, I. Schoegl, R.L. Speth, B.W. Weber, 'Cantera: An object-oriented "
              "software toolkit for chemical kinetics, thermodynamics, and transport processes', version "
              '3.2, https://www.cantera.org',
  'compared': 'Equilibrium reached by reversible rates (ideal gas and Peng-Robinson fugacities) against '
              'Gibbs-energy minimisation on the same species data; adiabatic temperature rise against an '
              'enthalpy balance on the same data; mixture viscosity (Wilke rule on pure-species fits) '
              'against its mixture-averaged transport; a detailed-mechanism tube (adiabatic, isobaric, '
              'hydrogen/air on GRI-Mech 3.0 species) against its constant-pressure reactor marched in time '
              '(outlet temperature and composition, ignition position) and against its equilibrium at '
              'constant enthalpy and pressure; a cooled mechanism tube with friction against its extensible '
              'reactor carrying the wall heat and pressure drop',
  'where': 'enthalpy balance at fixed composition (HPX) on the same NASA data',
  'test': 'tests/test_balances.py::test_adiabatic_rise_takes_the_worst_case_over_several_reactions'},
 {'key': 'kays_london1984',
  'citation': 'W.M. Kays, A.L. London, Compact Heat Exchangers, 3rd ed., McGraw-Hill, 1984; F.P. Incropera, '
              'D.P. DeWitt, T.L. Bergman, A.S. Lavine, Fundamentals of Heat and Mass Transfer, 6th ed., '
              'Wiley, 2007',
  'compared': 'Gas outlet temperature of a tube without reaction with a counter-current and with a '
              'co-current medium (NTU = 1, Cr = 0.6) against the effectiveness-NTU closed forms',
  'where': 'counter-current effectiveness, NTU = 1, Cr = 0.6',
  'test': 'tests/test_counter_current.py::test_counter_current_exchanger_matches_epsilon_ntu'},
 {'key': 'kays_london1984',
  'citation': 'W.M. Kays, A.L. London, Compact Heat Exchangers, 3rd ed., McGraw-Hill, 1984; F.P. Incropera, '
              'D.P. DeWitt, T.L. Bergman, A.S. Lavine, Fundamentals of Heat and Mass Transfer, 6th ed., '
              'Wiley, 2007',
  'compared': 'Gas outlet temperature of a tube without reaction with a counter-current and with a '
              'co-current medium (NTU = 1, Cr = 0.6) against the effectiveness-NTU closed forms',
  'where': 'parallel-flow effectiveness, NTU = 1, Cr = 0.6',
  'test': 'tests/test_counter_current.py::test_co_current_exchanger_matches_epsilon_ntu'},
 {'key': 'van_heerden1953',
  'citation': "C. van Heerden, 'Autothermic processes: properties and reactor design', Ind. Eng. Chem. "
              '45(6), 1242-1247, 1953',
  'compared': 'Three steady states of an autothermal tube found by the counter-current shooting, with the '
              'overall adiabatic balance and T - Tc = dT_ad of the ignited state',
  'where': 'autothermal tube with three steady states (configuration; identities derived)',
  'test': 'tests/test_counter_current.py::test_autothermal_tube_has_three_steady_states_with_exact_identities'},
 {'key': 'levenspiel1999',
  'citation': 'O. Levenspiel, Chemical Reaction Engineering, 3rd ed., Wiley, 1999, ch. 5',
  'compared': 'Volume of an isothermal plug-flow reactor with change in moles (first and second order), and '
              'the ideal design of the assumption check, against the closed-form performance equations',
  'where': 'isothermal first-order plug flow, X = 1 - exp(-k tau)',
  'test': 'tests/test_counter_current.py::test_length_to_target_with_a_counter_current_medium_matches_the_closed_form'},
 {'key': 'ht_library',
  'citation': 'C. Bell et al., ht (Chemical Engineering Design Library), version 1.2.0',
  'compared': "Tube-side Nusselt numbers of Gnielinski and Dittus-Boelter against ht's documented examples "
              '(Re 1e5, Pr 1.2) and against ht over the turbulent range; the inside coefficient along a '
              "heated empty tube against ht's Gnielinski with Cantera's viscosity, conductivity and heat "
              'capacity at each point',
  'where': 'ht.conv_internal.turbulent_Gnielinski docstring example',
  'test': 'tests/test_heat_coefficient.py::test_gnielinski_against_ht_docstring_example'},
 {'key': 'ht_library',
  'citation': 'C. Bell et al., ht (Chemical Engineering Design Library), version 1.2.0',
  'compared': "Tube-side Nusselt numbers of Gnielinski and Dittus-Boelter against ht's documented examples "
              '(Re 1e5, Pr 1.2) and against ht over the turbulent range; the inside coefficient along a '
              "heated empty tube against ht's Gnielinski with Cantera's viscosity, conductivity and heat "
              'capacity at each point',
  'where': 'ht.conv_internal.turbulent_Dittus_Boelter docstring examples',
  'test': 'tests/test_heat_coefficient.py::test_dittus_boelter_against_ht_docstring_examples'},
 {'key': 'ht_library',
  'citation': 'C. Bell et al., ht (Chemical Engineering Design Library), version 1.2.0',
  'compared': "Tube-side Nusselt numbers of Gnielinski and Dittus-Boelter against ht's documented examples "
              '(Re 1e5, Pr 1.2) and against ht over the turbulent range; the inside coefficient along a '
              "heated empty tube against ht's Gnielinski with Cantera's viscosity, conductivity and heat "
              'capacity at each point',
  'where': 'ht.conv_internal.turbulent_Gnielinski over the turbulent range',
  'test': 'tests/test_heat_coefficient.py::test_guarded_empty_tube_nusselt_equals_ht_in_the_turbulent_range'},
 {'key': 'froment1967',
  'citation': "G.F. Froment, 'Fixed bed catalytic reactors - current design status', Ind. Eng. Chem. 59(2), "
              '18-27, 1967',
  'compared': 'Hot-spot temperature of the published o-xylene oxidation tube for inlet partial pressures of '
              '0.011-0.0175 atm, against an independent reproduction of the published model and data (not '
              'values printed in the paper); the jump to runaway between 0.0175 and 0.018 atm, within 3 % of '
              'where the published profiles run away; the dimensionless groups of the published tube; the '
              "published overall U (96 W/(m^2 K)) against U from Leva's packed-bed wall correlation with a "
              'steel wall and a shell-side coefficient, and from the Li-Finlayson wall coefficient lumped '
              'with a radial conductivity (plausibility, within 20 %)',
  'where': 'overall U of the o-xylene tube, 0.096 kJ/(m^2 s K) (plausibility, +-20 %)',
  'test': 'tests/test_heat_coefficient_wiring.py::test_oxylene_tube_u_from_leva_is_within_the_spread_of_the_published_u'},
 {'key': 'ht_library',
  'citation': 'C. Bell et al., ht (Chemical Engineering Design Library), version 1.2.0',
  'compared': "Tube-side Nusselt numbers of Gnielinski and Dittus-Boelter against ht's documented examples "
              '(Re 1e5, Pr 1.2) and against ht over the turbulent range; the inside coefficient along a '
              "heated empty tube against ht's Gnielinski with Cantera's viscosity, conductivity and heat "
              'capacity at each point',
  'where': 'ht.conv_internal.turbulent_Gnielinski with Cantera transport at each point',
  'test': 'tests/test_heat_coefficient_wiring.py::test_empty_tube_inside_coefficient_follows_gnielinski_with_cantera_properties'},
 {'key': 'ht_library',
  'citation': 'C. Bell et al., ht (Chemical Engineering Design Library), version 1.2.0',
  'compared': "Tube-side Nusselt numbers of Gnielinski and Dittus-Boelter against ht's documented examples "
              '(Re 1e5, Pr 1.2) and against ht over the turbulent range; the inside coefficient along a '
              "heated empty tube against ht's Gnielinski with Cantera's viscosity, conductivity and heat "
              'capacity at each point',
  'where': 'ht.conv_tube_bank.Nu_Zukauskas_Bejan (tube bank in crossflow)',
  'test': 'tests/test_heat_coefficient_wiring.py::test_zukauskas_bank_against_ht_and_a_shell_side_case'},
 {'key': 'froment1967',
  'citation': "G.F. Froment, 'Fixed bed catalytic reactors - current design status', Ind. Eng. Chem. 59(2), "
              '18-27, 1967',
  'compared': 'Hot-spot temperature of the published o-xylene oxidation tube for inlet partial pressures of '
              '0.011-0.0175 atm, against an independent reproduction of the published model and data (not '
              'values printed in the paper); the jump to runaway between 0.0175 and 0.018 atm, within 3 % of '
              'where the published profiles run away; the dimensionless groups of the published tube; the '
              "published overall U (96 W/(m^2 K)) against U from Leva's packed-bed wall correlation with a "
              'steel wall and a shell-side coefficient, and from the Li-Finlayson wall coefficient lumped '
              'with a radial conductivity (plausibility, within 20 %)',
  'where': 'overall U of the o-xylene tube (plausibility, +-20 %) from Li-Finlayson lumped',
  'test': 'tests/test_heat_coefficient_wiring.py::test_li_finlayson_lumped_with_the_radial_conductivity_matches_the_published_u'},
 {'key': 'levenspiel1999',
  'citation': 'O. Levenspiel, Chemical Reaction Engineering, 3rd ed., Wiley, 1999, ch. 5',
  'compared': 'Volume of an isothermal plug-flow reactor with change in moles (first and second order), and '
              'the ideal design of the assumption check, against the closed-form performance equations',
  'where': 'ch. 5, first-order plug flow of constant density (chapter from memory)',
  'test': 'tests/test_liquid.py::test_isothermal_first_order_liquid_matches_closed_form'},
 {'key': 'levenspiel1999',
  'citation': 'O. Levenspiel, Chemical Reaction Engineering, 3rd ed., Wiley, 1999, ch. 5',
  'compared': 'Volume of an isothermal plug-flow reactor with change in moles (first and second order), and '
              'the ideal design of the assumption check, against the closed-form performance equations',
  'where': 'ch. 9, adiabatic operating line T - T0 = dT_ad X (chapter from memory)',
  'test': 'tests/test_liquid.py::test_adiabatic_liquid_follows_the_straight_line'},
 {'key': 'andrade1930',
  'citation': "E.N. da C. Andrade, 'The viscosity of liquids', Nature 125, 309, 1930",
  'compared': "The kernel's liquid viscosity at three temperatures against the Andrade law, and the "
              'pipe-friction pressure drop of an isothermal liquid tube against the same tube with the '
              'constant viscosity the law gives',
  'where': 'mu = A exp(B/T) of a liquid',
  'test': 'tests/test_liquid_extras.py::test_andrade_viscosity_follows_the_law_and_moves_the_friction'},
 {'key': 'smith_van_ness2005',
  'citation': 'J.M. Smith, H.C. Van Ness, M.M. Abbott, Introduction to Chemical Engineering Thermodynamics, '
              '7th ed., 2005',
  'compared': "The boiling check's bubble pressure at the inlet of a liquid tube against Raoult's law with "
              'Clausius-Clapeyron vapour pressures worked by hand',
  'where': "Raoult's law bubble pressure with Clausius-Clapeyron vapour pressures",
  'test': 'tests/test_liquid_extras.py::test_boiling_check_warns_where_the_bubble_pressure_exceeds_the_pressure'},
 {'key': 'cantera',
  'citation': "D.G. Goodwin, H.K. Moffat, I. Schoegl, R.L. Speth, B.W. Weber, 'Cantera: An object-oriented "
              "software toolkit for chemical kinetics, thermodynamics, and transport processes', version "
              '3.2, https://www.cantera.org',
  'compared': 'Equilibrium reached by reversible rates (ideal gas and Peng-Robinson fugacities) against '
              'Gibbs-energy minimisation on the same species data; adiabatic temperature rise against an '
              'enthalpy balance on the same data; mixture viscosity (Wilke rule on pure-species fits) '
              'against its mixture-averaged transport; a detailed-mechanism tube (adiabatic, isobaric, '
              'hydrogen/air on GRI-Mech 3.0 species) against its constant-pressure reactor marched in time '
              '(outlet temperature and composition, ignition position) and against its equilibrium at '
              'constant enthalpy and pressure; a cooled mechanism tube with friction against its extensible '
              'reactor carrying the wall heat and pressure drop',
  'where': 'IdealGasConstPressureReactor marched in time, the same species and reactions',
  'test': 'tests/test_mechanism.py::test_adiabatic_isobaric_tube_outlet_equals_cantera_reactor_marched_in_time'},
 {'key': 'cantera',
  'citation': "D.G. Goodwin, H.K. Moffat, I. Schoegl, R.L. Speth, B.W. Weber, 'Cantera: An object-oriented "
              "software toolkit for chemical kinetics, thermodynamics, and transport processes', version "
              '3.2, https://www.cantera.org',
  'compared': 'Equilibrium reached by reversible rates (ideal gas and Peng-Robinson fugacities) against '
              'Gibbs-energy minimisation on the same species data; adiabatic temperature rise against an '
              'enthalpy balance on the same data; mixture viscosity (Wilke rule on pure-species fits) '
              'against its mixture-averaged transport; a detailed-mechanism tube (adiabatic, isobaric, '
              'hydrogen/air on GRI-Mech 3.0 species) against its constant-pressure reactor marched in time '
              '(outlet temperature and composition, ignition position) and against its equilibrium at '
              'constant enthalpy and pressure; a cooled mechanism tube with friction against its extensible '
              'reactor carrying the wall heat and pressure drop',
  'where': 'IdealGasConstPressureReactor marched in time: largest dT/dz',
  'test': 'tests/test_mechanism.py::test_ignition_position_within_one_percent_of_cantera_reactor'},
 {'key': 'cantera',
  'citation': "D.G. Goodwin, H.K. Moffat, I. Schoegl, R.L. Speth, B.W. Weber, 'Cantera: An object-oriented "
              "software toolkit for chemical kinetics, thermodynamics, and transport processes', version "
              '3.2, https://www.cantera.org',
  'compared': 'Equilibrium reached by reversible rates (ideal gas and Peng-Robinson fugacities) against '
              'Gibbs-energy minimisation on the same species data; adiabatic temperature rise against an '
              'enthalpy balance on the same data; mixture viscosity (Wilke rule on pure-species fits) '
              'against its mixture-averaged transport; a detailed-mechanism tube (adiabatic, isobaric, '
              'hydrogen/air on GRI-Mech 3.0 species) against its constant-pressure reactor marched in time '
              '(outlet temperature and composition, ignition position) and against its equilibrium at '
              'constant enthalpy and pressure; a cooled mechanism tube with friction against its extensible '
              'reactor carrying the wall heat and pressure drop',
  'where': "equilibrate('HP') on the same species",
  'test': 'tests/test_mechanism.py::test_long_adiabatic_tube_reaches_cantera_equilibrium'},
 {'key': 'cantera',
  'citation': "D.G. Goodwin, H.K. Moffat, I. Schoegl, R.L. Speth, B.W. Weber, 'Cantera: An object-oriented "
              "software toolkit for chemical kinetics, thermodynamics, and transport processes', version "
              '3.2, https://www.cantera.org',
  'compared': 'Equilibrium reached by reversible rates (ideal gas and Peng-Robinson fugacities) against '
              'Gibbs-energy minimisation on the same species data; adiabatic temperature rise against an '
              'enthalpy balance on the same data; mixture viscosity (Wilke rule on pure-species fits) '
              'against its mixture-averaged transport; a detailed-mechanism tube (adiabatic, isobaric, '
              'hydrogen/air on GRI-Mech 3.0 species) against its constant-pressure reactor marched in time '
              '(outlet temperature and composition, ignition position) and against its equilibrium at '
              'constant enthalpy and pressure; a cooled mechanism tube with friction against its extensible '
              'reactor carrying the wall heat and pressure drop',
  'where': 'ExtensibleIdealGasConstPressureReactor with wall and pressure hooks',
  'test': 'tests/test_mechanism.py::test_cooled_tube_with_friction_equals_cantera_reactor_with_wall_and_pressure_hooks'},
 {'key': 'levenspiel1999',
  'citation': 'O. Levenspiel, Chemical Reaction Engineering, 3rd ed., Wiley, 1999, ch. 5',
  'compared': 'Volume of an isothermal plug-flow reactor with change in moles (first and second order), and '
              'the ideal design of the assumption check, against the closed-form performance equations',
  'where': 'ch. 8, reactions in series A -> R -> S, plug flow: tau_max and C_R,max/C_A0 = '
           '(k1/k2)^(k2/(k2-k1)) (equation numbers from memory)',
  'test': 'tests/test_network.py::test_series_yield_maximum_against_closed_form'},
 {'key': 'levenspiel1999',
  'citation': 'O. Levenspiel, Chemical Reaction Engineering, 3rd ed., Wiley, 1999, ch. 5',
  'compared': 'Volume of an isothermal plug-flow reactor with change in moles (first and second order), and '
              'the ideal design of the assumption check, against the closed-form performance equations',
  'where': 'ch. 8, first-order reactions in series A -> B -> C in plug flow (chapter from memory)',
  'test': 'tests/test_network_run.py::test_series_yields_match_the_closed_form_in_a_run'},
 {'key': 'froment1967',
  'citation': "G.F. Froment, 'Fixed bed catalytic reactors - current design status', Ind. Eng. Chem. 59(2), "
              '18-27, 1967',
  'compared': 'Hot-spot temperature of the published o-xylene oxidation tube for inlet partial pressures of '
              '0.011-0.0175 atm, against an independent reproduction of the published model and data (not '
              'values printed in the paper); the jump to runaway between 0.0175 and 0.018 atm, within 3 % of '
              'where the published profiles run away; the dimensionless groups of the published tube; the '
              "published overall U (96 W/(m^2 K)) against U from Leva's packed-bed wall correlation with a "
              'steel wall and a shell-side coefficient, and from the Li-Finlayson wall coefficient lumped '
              'with a radial conductivity (plausibility, within 20 %)',
  'where': 'published model and data; check values from an independent reproduction (not printed values), p0 '
           '= 0.011-0.0175 atm',
  'test': 'tests/test_oxylene_published.py::test_hot_spot_against_published_case'},
 {'key': 'froment1967',
  'citation': "G.F. Froment, 'Fixed bed catalytic reactors - current design status', Ind. Eng. Chem. 59(2), "
              '18-27, 1967',
  'compared': 'Hot-spot temperature of the published o-xylene oxidation tube for inlet partial pressures of '
              '0.011-0.0175 atm, against an independent reproduction of the published model and data (not '
              'values printed in the paper); the jump to runaway between 0.0175 and 0.018 atm, within 3 % of '
              'where the published profiles run away; the dimensionless groups of the published tube; the '
              "published overall U (96 W/(m^2 K)) against U from Leva's packed-bed wall correlation with a "
              'steel wall and a shell-side coefficient, and from the Li-Finlayson wall coefficient lumped '
              'with a radial conductivity (plausibility, within 20 %)',
  'where': "runaway between p0 = 0.0175 and 0.018 atm (independent reproduction; the source's figure shows "
           'it just above 0.018 atm, from memory)',
  'test': 'tests/test_oxylene_published.py::test_hot_spot_jumps_between_0_0175_and_0_018_atm'},
 {'key': 'aris1975',
  'citation': 'R. Aris, The Mathematical Theory of Diffusion and Reaction in Permeable Catalysts, vol. 1, '
              'Clarendon Press, Oxford, 1975; E.W. Thiele, Ind. Eng. Chem. 31, 916-920, 1939',
  'compared': 'Effectiveness factors of first-order reactions in three pellet shapes and of a zero-order '
              'reaction in a slab against the closed forms',
  'where': 'first-order closed forms, slab, cylinder and sphere',
  'test': 'tests/test_pellet.py::test_first_order_closed_forms'},
 {'key': 'aris1975',
  'citation': 'R. Aris, The Mathematical Theory of Diffusion and Reaction in Permeable Catalysts, vol. 1, '
              'Clarendon Press, Oxford, 1975; E.W. Thiele, Ind. Eng. Chem. 31, 916-920, 1939',
  'compared': 'Effectiveness factors of first-order reactions in three pellet shapes and of a zero-order '
              'reaction in a slab against the closed forms',
  'where': 'large-modulus asymptote eta -> 1/Phi with L = V_p/S_p',
  'test': 'tests/test_pellet.py::test_first_order_asymptote'},
 {'key': 'aris1975',
  'citation': 'R. Aris, The Mathematical Theory of Diffusion and Reaction in Permeable Catalysts, vol. 1, '
              'Clarendon Press, Oxford, 1975; E.W. Thiele, Ind. Eng. Chem. 31, 916-920, 1939',
  'compared': 'Effectiveness factors of first-order reactions in three pellet shapes and of a zero-order '
              'reaction in a slab against the closed forms',
  'where': 'zero order in a slab: eta = 1 up to Phi_0 = 1, 1/Phi_0 beyond',
  'test': 'tests/test_pellet.py::test_zero_order_slab'},
 {'key': 'bischoff1965',
  'citation': "K.B. Bischoff, 'Effectiveness factors for general reaction rate forms', AIChE J. 11, 351-355, "
              '1965',
  'compared': 'Generalized modulus of n-th order reactions against its definition and the first-order Thiele '
              'modulus',
  'where': 'generalized modulus Phi_n = L sqrt((n+1)/2 k c_s^(n-1)/D_e)',
  'test': 'tests/test_pellet.py::test_generalized_modulus_reduces_to_aris_for_first_order_and_scales_for_other_orders'},
 {'key': 'weisz_prater1954',
  'citation': "P.B. Weisz, C.D. Prater, 'Interpretation of measurements in experimental catalysis', Adv. "
              'Catal. 6, 143-196, 1954',
  'compared': 'Weisz-Prater number by hand and its identity eta Phi^2 for a first-order reaction',
  'where': 'N_WP = r_obs L^2/(D_e c_s), by hand',
  'test': 'tests/test_pellet.py::test_weisz_prater_number_by_hand_and_first_order_identity'},
 {'key': 'aris1975',
  'citation': 'R. Aris, The Mathematical Theory of Diffusion and Reaction in Permeable Catalysts, vol. 1, '
              'Clarendon Press, Oxford, 1975; E.W. Thiele, Ind. Eng. Chem. 31, 916-920, 1939',
  'compared': 'Effectiveness factors of first-order reactions in three pellet shapes and of a zero-order '
              'reaction in a slab against the closed forms',
  'where': 'isothermal first-order effectiveness factors (closed forms, Aris-normalised)',
  'test': 'tests/test_pellet_run.py::test_isothermal_first_order_tube_is_the_closed_form_with_eta_k'},
 {'key': 'cantera',
  'citation': "D.G. Goodwin, H.K. Moffat, I. Schoegl, R.L. Speth, B.W. Weber, 'Cantera: An object-oriented "
              "software toolkit for chemical kinetics, thermodynamics, and transport processes', version "
              '3.2, https://www.cantera.org',
  'compared': 'Equilibrium reached by reversible rates (ideal gas and Peng-Robinson fugacities) against '
              'Gibbs-energy minimisation on the same species data; adiabatic temperature rise against an '
              'enthalpy balance on the same data; mixture viscosity (Wilke rule on pure-species fits) '
              'against its mixture-averaged transport; a detailed-mechanism tube (adiabatic, isobaric, '
              'hydrogen/air on GRI-Mech 3.0 species) against its constant-pressure reactor marched in time '
              '(outlet temperature and composition, ignition position) and against its equilibrium at '
              'constant enthalpy and pressure; a cooled mechanism tube with friction against its extensible '
              'reactor carrying the wall heat and pressure drop',
  'where': "equilibrate('TP') on the same 1-bar species file",
  'test': 'tests/test_physics_fixes.py::test_equilibrium_uses_the_reference_pressure_of_the_species_file'},
 {'key': 'cantera',
  'citation': "D.G. Goodwin, H.K. Moffat, I. Schoegl, R.L. Speth, B.W. Weber, 'Cantera: An object-oriented "
              "software toolkit for chemical kinetics, thermodynamics, and transport processes', version "
              '3.2, https://www.cantera.org',
  'compared': 'Equilibrium reached by reversible rates (ideal gas and Peng-Robinson fugacities) against '
              'Gibbs-energy minimisation on the same species data; adiabatic temperature rise against an '
              'enthalpy balance on the same data; mixture viscosity (Wilke rule on pure-species fits) '
              'against its mixture-averaged transport; a detailed-mechanism tube (adiabatic, isobaric, '
              'hydrogen/air on GRI-Mech 3.0 species) against its constant-pressure reactor marched in time '
              '(outlet temperature and composition, ignition position) and against its equilibrium at '
              'constant enthalpy and pressure; a cooled mechanism tube with friction against its extensible '
              'reactor carrying the wall heat and pressure drop',
  'where': "mixture-averaged viscosity (Wilke's rule over its species viscosity fits)",
  'test': 'tests/test_physics_fixes.py::test_kernel_viscosity_follows_the_local_composition_as_cantera'},
 {'key': 'ergun1952',
  'citation': "S. Ergun, 'Fluid flow through packed columns', Chem. Eng. Prog. 48(2), 89-94, 1952",
  'compared': 'Packed-bed pressure gradient against the Ergun equation evaluated by hand (gas and liquid, '
              'viscous and inertial terms apart); isothermal pressure profile and first-order conversion '
              'with pressure drop against the closed forms that follow from it',
  'where': 'Ergun equation, k1 = 150, k2 = 1.75 (check-values 2a)',
  'test': 'tests/test_pressure_drop.py::test_ergun_2a_fluids_docstring_example'},
 {'key': 'fluids',
  'citation': 'C. Bell et al., fluids: fluid dynamics component of the Chemical Engineering Design Library '
              "(ChEDL), Python package 'fluids'",
  'compared': 'Friction factors (Colebrook, Churchill, Blasius, Haaland, laminar), pipe and packed-bed '
              '(Ergun) pressure gradients against an independent open-source implementation',
  'where': 'fluids.packed_bed.Ergun docstring example, dp = 8e-4 m',
  'test': 'tests/test_pressure_drop.py::test_ergun_2a_fluids_docstring_example'},
 {'key': 'ergun1952',
  'citation': "S. Ergun, 'Fluid flow through packed columns', Chem. Eng. Prog. 48(2), 89-94, 1952",
  'compared': 'Packed-bed pressure gradient against the Ergun equation evaluated by hand (gas and liquid, '
              'viscous and inertial terms apart); isothermal pressure profile and first-order conversion '
              'with pressure drop against the closed forms that follow from it',
  'where': 'Ergun equation; hand value of check-values 2b',
  'test': 'tests/test_pressure_drop.py::test_ergun_2b_hand_value_and_split_into_terms'},
 {'key': 'ergun1952',
  'citation': "S. Ergun, 'Fluid flow through packed columns', Chem. Eng. Prog. 48(2), 89-94, 1952",
  'compared': 'Packed-bed pressure gradient against the Ergun equation evaluated by hand (gas and liquid, '
              'viscous and inertial terms apart); isothermal pressure profile and first-order conversion '
              'with pressure drop against the closed forms that follow from it',
  'where': 'Ergun equation; hand value of check-values 2, third row',
  'test': 'tests/test_pressure_drop.py::test_ergun_liquid_row_two_metres'},
 {'key': 'ergun1952',
  'citation': "S. Ergun, 'Fluid flow through packed columns', Chem. Eng. Prog. 48(2), 89-94, 1952",
  'compared': 'Packed-bed pressure gradient against the Ergun equation evaluated by hand (gas and liquid, '
              'viscous and inertial terms apart); isothermal pressure profile and first-order conversion '
              'with pressure drop against the closed forms that follow from it',
  'where': "Ergun equation evaluated by hand (the function's docstring example)",
  'test': 'tests/test_pressure_drop.py::test_ergun_style_example'},
 {'key': 'fluids',
  'citation': 'C. Bell et al., fluids: fluid dynamics component of the Chemical Engineering Design Library '
              "(ChEDL), Python package 'fluids'",
  'compared': 'Friction factors (Colebrook, Churchill, Blasius, Haaland, laminar), pipe and packed-bed '
              '(Ergun) pressure gradients against an independent open-source implementation',
  'where': 'fluids.packed_bed.Ergun(dp, voidage, vs, rho, mu, L)',
  'test': 'tests/test_pressure_drop.py::test_ergun_against_fluids'},
 {'key': 'ergun1952',
  'citation': "S. Ergun, 'Fluid flow through packed columns', Chem. Eng. Prog. 48(2), 89-94, 1952",
  'compared': 'Packed-bed pressure gradient against the Ergun equation evaluated by hand (gas and liquid, '
              'viscous and inertial terms apart); isothermal pressure profile and first-order conversion '
              'with pressure drop against the closed forms that follow from it',
  'where': 'Ergun equation; closed-form isothermal P/P0 (check-values 2c)',
  'test': 'tests/test_pressure_drop.py::test_isothermal_ideal_gas_bed_pressure_profile_2c'},
 {'key': 'fluids',
  'citation': 'C. Bell et al., fluids: fluid dynamics component of the Chemical Engineering Design Library '
              "(ChEDL), Python package 'fluids'",
  'compared': 'Friction factors (Colebrook, Churchill, Blasius, Haaland, laminar), pipe and packed-bed '
              '(Ergun) pressure gradients against an independent open-source implementation',
  'where': 'fluids.friction.friction_laminar and fluids.core.Reynolds',
  'test': 'tests/test_pressure_drop.py::test_laminar_darcy_weisbach_is_hagen_poiseuille'},
 {'key': 'colebrook1939',
  'citation': "C.F. Colebrook, 'Turbulent flow in pipes, with particular reference to the transition region "
              "between the smooth and rough pipe laws', J. Inst. Civ. Eng. 11(4), 133-156, 1939",
  'compared': 'Darcy friction factor against the Colebrook equation solved exactly, including its fully '
              'rough limit',
  'where': 'Colebrook equation solved exactly; check-values 3a-3c and rows without id',
  'test': 'tests/test_pressure_drop.py::test_colebrook_check_values'},
 {'key': 'colebrook1939',
  'citation': "C.F. Colebrook, 'Turbulent flow in pipes, with particular reference to the transition region "
              "between the smooth and rough pipe laws', J. Inst. Civ. Eng. 11(4), 133-156, 1939",
  'compared': 'Darcy friction factor against the Colebrook equation solved exactly, including its fully '
              'rough limit',
  'where': 'fully rough limit of the Colebrook equation',
  'test': 'tests/test_pressure_drop.py::test_colebrook_fully_rough_limit'},
 {'key': 'fluids',
  'citation': 'C. Bell et al., fluids: fluid dynamics component of the Chemical Engineering Design Library '
              "(ChEDL), Python package 'fluids'",
  'compared': 'Friction factors (Colebrook, Churchill, Blasius, Haaland, laminar), pipe and packed-bed '
              '(Ergun) pressure gradients against an independent open-source implementation',
  'where': 'fluids.friction.Colebrook docstring example (1e5, 1e-4)',
  'test': 'tests/test_pressure_drop.py::test_colebrook_fluids_docstring_example'},
 {'key': 'fluids',
  'citation': 'C. Bell et al., fluids: fluid dynamics component of the Chemical Engineering Design Library '
              "(ChEDL), Python package 'fluids'",
  'compared': 'Friction factors (Colebrook, Churchill, Blasius, Haaland, laminar), pipe and packed-bed '
              '(Ergun) pressure gradients against an independent open-source implementation',
  'where': 'fluids.friction.Clamond: Colebrook solved to machine precision',
  'test': 'tests/test_pressure_drop.py::test_colebrook_against_fluids_clamond'},
 {'key': 'colebrook1939',
  'citation': "C.F. Colebrook, 'Turbulent flow in pipes, with particular reference to the transition region "
              "between the smooth and rough pipe laws', J. Inst. Civ. Eng. 11(4), 133-156, 1939",
  'compared': 'Darcy friction factor against the Colebrook equation solved exactly, including its fully '
              'rough limit',
  'where': 'the Colebrook equation itself (residual)',
  'test': 'tests/test_pressure_drop.py::test_colebrook_residual_is_zero'},
 {'key': 'churchill1977',
  'citation': "S.W. Churchill, 'Friction-factor equation spans all fluid-flow regimes', Chem. Eng. 84(24), "
              '91-92, 1977',
  'compared': 'Darcy friction factor in laminar, transition and turbulent flow against the Churchill '
              'equation, and its closeness to Colebrook in turbulent flow',
  'where': "Churchill equation; check-values 3 'other forms' column",
  'test': 'tests/test_pressure_drop.py::test_churchill_check_values'},
 {'key': 'fluids',
  'citation': 'C. Bell et al., fluids: fluid dynamics component of the Chemical Engineering Design Library '
              "(ChEDL), Python package 'fluids'",
  'compared': 'Friction factors (Colebrook, Churchill, Blasius, Haaland, laminar), pipe and packed-bed '
              '(Ergun) pressure gradients against an independent open-source implementation',
  'where': 'fluids.friction.Churchill_1977 (docstring example 1e5, 1e-4 and all regimes)',
  'test': 'tests/test_pressure_drop.py::test_churchill_against_fluids'},
 {'key': 'fluids',
  'citation': 'C. Bell et al., fluids: fluid dynamics component of the Chemical Engineering Design Library '
              "(ChEDL), Python package 'fluids'",
  'compared': 'Friction factors (Colebrook, Churchill, Blasius, Haaland, laminar), pipe and packed-bed '
              '(Ergun) pressure gradients against an independent open-source implementation',
  'where': 'fluids.friction.Churchill_1977, transition value of check-values 3i',
  'test': 'tests/test_pressure_drop.py::test_churchill_transition_3i'},
 {'key': 'colebrook1939',
  'citation': "C.F. Colebrook, 'Turbulent flow in pipes, with particular reference to the transition region "
              "between the smooth and rough pipe laws', J. Inst. Civ. Eng. 11(4), 133-156, 1939",
  'compared': 'Darcy friction factor against the Colebrook equation solved exactly, including its fully '
              'rough limit',
  'where': 'Colebrook equation',
  'test': 'tests/test_pressure_drop.py::test_churchill_close_to_colebrook_in_turbulent_flow'},
 {'key': 'churchill1977',
  'citation': "S.W. Churchill, 'Friction-factor equation spans all fluid-flow regimes', Chem. Eng. 84(24), "
              '91-92, 1977',
  'compared': 'Darcy friction factor in laminar, transition and turbulent flow against the Churchill '
              'equation, and its closeness to Colebrook in turbulent flow',
  'where': 'Churchill equation',
  'test': 'tests/test_pressure_drop.py::test_churchill_close_to_colebrook_in_turbulent_flow'},
 {'key': 'blasius1913',
  'citation': "H. Blasius, 'Das Aehnlichkeitsgesetz bei Reibungsvorgaengen in Fluessigkeiten', Mitt. "
              'Forschungsarb. Geb. Ingenieurwes. 131, 1-41, 1913',
  'compared': 'Smooth-tube friction factor against f = 0.3164 Re^-0.25',
  'where': 'f = 0.3164 Re^-0.25 (check-values 3d, 3e and row Re = 1e5)',
  'test': 'tests/test_pressure_drop.py::test_blasius_check_values'},
 {'key': 'fluids',
  'citation': 'C. Bell et al., fluids: fluid dynamics component of the Chemical Engineering Design Library '
              "(ChEDL), Python package 'fluids'",
  'compared': 'Friction factors (Colebrook, Churchill, Blasius, Haaland, laminar), pipe and packed-bed '
              '(Ergun) pressure gradients against an independent open-source implementation',
  'where': 'fluids.friction.Blasius and fluids.friction.friction_laminar',
  'test': 'tests/test_pressure_drop.py::test_blasius_and_laminar_against_fluids'},
 {'key': 'fluids',
  'citation': 'C. Bell et al., fluids: fluid dynamics component of the Chemical Engineering Design Library '
              "(ChEDL), Python package 'fluids'",
  'compared': 'Friction factors (Colebrook, Churchill, Blasius, Haaland, laminar), pipe and packed-bed '
              '(Ergun) pressure gradients against an independent open-source implementation',
  'where': 'fluids.friction.Haaland (docstring example 1e5, 1e-4)',
  'test': 'tests/test_pressure_drop.py::test_haaland_against_fluids_and_close_to_colebrook'},
 {'key': 'carslaw_jaeger1959',
  'citation': 'H.S. Carslaw, J.C. Jaeger, Conduction of Heat in Solids, 2nd ed., Oxford University Press, '
              '1959',
  'compared': 'Centre-line and cup-mixing temperatures of the two-dimensional model of a packed tube cooled '
              'through a wall coefficient, without reaction, against the exact series solution '
              '(Bessel-function roots), at three wall Biot numbers',
  'where': 'series for the cylinder with a surface condition (chapter from memory)',
  'test': 'tests/test_radial_run.py::test_graetz_series_through_a_case_file'},
 {'key': 'froment_bischoff1990',
  'citation': 'G.F. Froment, K.B. Bischoff, Chemical Reactor Analysis and Design, 2nd ed., Wiley, 1990',
  'compared': 'The two-dimensional model with a large radial conductivity and wall coefficient against the '
              'one-dimensional model with the lumped overall coefficient (hot-spot rise, outlet conversion)',
  'where': 'ch. 11, lumped U of the 2-D model (from memory)',
  'test': 'tests/test_radial_run.py::test_large_conductivity_and_wall_coefficient_equal_the_lumped_one_dimensional_tube'},
 {'key': 'peng_robinson1976',
  'citation': "D.-Y. Peng, D.B. Robinson, 'A new two-constant equation of state', Ind. Eng. Chem. Fundam. "
              '15(1), 59-64, 1976',
  'compared': 'Compressibility factor and enthalpy departure against the Peng-Robinson cubic solved directly '
              "and against Cantera's Peng-Robinson phase",
  'where': 'PR cubic, a = 0.45724 R^2 Tc^2/Pc, b = 0.07780 R Tc/Pc, kappa(omega), eqs. from memory',
  'test': 'tests/test_real_gas.py::test_pr_departure_against_direct_cubic_and_cantera'},
 {'key': 'setzmann_wagner1991',
  'citation': "U. Setzmann, W. Wagner, 'A new equation of state and tables of thermodynamic properties for "
              "methane covering the range from the melting line to 625 K at pressures up to 1000 MPa', J. "
              'Phys. Chem. Ref. Data 20(6), 1061-1155, 1991',
  'compared': 'Peng-Robinson compressibility factor of methane along a run within 3 % of the reference '
              'equation of state, and the temperature change of isenthalpic throttling (reference equation '
              'evaluated with CoolProp)',
  'where': 'methane reference EOS through CoolProp, Z at the states of check-values section 7',
  'test': 'tests/test_real_gas.py::test_pr_z_of_a_run_within_3_percent_of_reference_eos'},
 {'key': 'span2000',
  'citation': "R. Span, E.W. Lemmon, R.T. Jacobsen, W. Wagner, A. Yokozeki, 'A reference equation of state "
              'for the thermodynamic properties of nitrogen for temperatures from 63.151 to 1000 K and '
              "pressures to 2200 MPa', J. Phys. Chem. Ref. Data 29(6), 1361-1433, 2000",
  'compared': 'Peng-Robinson compressibility factor of nitrogen along a run within 3 % of the reference '
              'equation of state (evaluated with CoolProp)',
  'where': 'nitrogen reference EOS through CoolProp, Z at the states of check-values section 7',
  'test': 'tests/test_real_gas.py::test_pr_z_of_a_run_within_3_percent_of_reference_eos'},
 {'key': 'coolprop',
  'citation': "I.H. Bell, J. Wronski, S. Quoilin, V. Lemort, 'Pure and pseudo-pure fluid thermophysical "
              "property evaluation and the open-source thermophysical property library CoolProp', Ind. Eng. "
              'Chem. Res. 53(6), 2498-2508, 2014',
  'compared': 'Reference compressibility factors and enthalpies of methane and nitrogen, and ideal-gas heat '
              'capacities of H2, N2, CH4 and H2O, used in the real-gas and enthalpy-balance checks',
  'where': "PropsSI('Z', 'T', T, 'P', P, fluid)",
  'test': 'tests/test_real_gas.py::test_pr_z_of_a_run_within_3_percent_of_reference_eos'},
 {'key': 'peng_robinson1976',
  'citation': "D.-Y. Peng, D.B. Robinson, 'A new two-constant equation of state', Ind. Eng. Chem. Fundam. "
              '15(1), 59-64, 1976',
  'compared': 'Compressibility factor and enthalpy departure against the Peng-Robinson cubic solved directly '
              "and against Cantera's Peng-Robinson phase",
  'where': 'Z of the ideal-gas check computed with PR',
  'test': 'tests/test_real_gas.py::test_ideal_gas_run_reports_pr_z_in_profile_and_summary'},
 {'key': 'setzmann_wagner1991',
  'citation': "U. Setzmann, W. Wagner, 'A new equation of state and tables of thermodynamic properties for "
              "methane covering the range from the melting line to 625 K at pressures up to 1000 MPa', J. "
              'Phys. Chem. Ref. Data 20(6), 1061-1155, 1991',
  'compared': 'Peng-Robinson compressibility factor of methane along a run within 3 % of the reference '
              'equation of state, and the temperature change of isenthalpic throttling (reference equation '
              'evaluated with CoolProp)',
  'where': 'isenthalpic throttling of methane, reference EOS through CoolProp',
  'test': 'tests/test_real_gas.py::test_pr_throttling_against_reference_eos'},
 {'key': 'coolprop',
  'citation': "I.H. Bell, J. Wronski, S. Quoilin, V. Lemort, 'Pure and pseudo-pure fluid thermophysical "
              "property evaluation and the open-source thermophysical property library CoolProp', Ind. Eng. "
              'Chem. Res. 53(6), 2498-2508, 2014',
  'compared': 'Reference compressibility factors and enthalpies of methane and nitrogen, and ideal-gas heat '
              'capacities of H2, N2, CH4 and H2O, used in the real-gas and enthalpy-balance checks',
  'where': "PropsSI('Hmolar', ...) for methane",
  'test': 'tests/test_real_gas.py::test_pr_throttling_against_reference_eos'},
 {'key': 'chase1998',
  'citation': 'M.W. Chase, NIST-JANAF Thermochemical Tables, 4th ed., J. Phys. Chem. Ref. Data Monograph 9, '
              '1998',
  'compared': 'Standard enthalpies of formation, heats of reaction and ideal-gas heat capacities of the '
              'built-in species data against the tables; adiabatic rise of a methanation bed against an '
              'enthalpy balance on the tabulated data',
  'where': 'CO + 3 H2 -> CH4 + H2O, dH_r(573.15 K) from JANAF dfH and Cp (check-values 6a)',
  'test': 'tests/test_real_gas.py::test_methanator_adiabatic_rise_against_hand_enthalpy_balance'},
 {'key': 'coolprop',
  'citation': "I.H. Bell, J. Wronski, S. Quoilin, V. Lemort, 'Pure and pseudo-pure fluid thermophysical "
              "property evaluation and the open-source thermophysical property library CoolProp', Ind. Eng. "
              'Chem. Res. 53(6), 2498-2508, 2014',
  'compared': 'Reference compressibility factors and enthalpies of methane and nitrogen, and ideal-gas heat '
              'capacities of H2, N2, CH4 and H2O, used in the real-gas and enthalpy-balance checks',
  'where': 'ideal-gas Cp0molar of Hydrogen, Nitrogen, Methane, Water',
  'test': 'tests/test_real_gas.py::test_methanator_adiabatic_rise_against_hand_enthalpy_balance'},
 {'key': 'cantera',
  'citation': "D.G. Goodwin, H.K. Moffat, I. Schoegl, R.L. Speth, B.W. Weber, 'Cantera: An object-oriented "
              "software toolkit for chemical kinetics, thermodynamics, and transport processes', version "
              '3.2, https://www.cantera.org',
  'compared': 'Equilibrium reached by reversible rates (ideal gas and Peng-Robinson fugacities) against '
              'Gibbs-energy minimisation on the same species data; adiabatic temperature rise against an '
              'enthalpy balance on the same data; mixture viscosity (Wilke rule on pure-species fits) '
              'against its mixture-averaged transport; a detailed-mechanism tube (adiabatic, isobaric, '
              'hydrogen/air on GRI-Mech 3.0 species) against its constant-pressure reactor marched in time '
              '(outlet temperature and composition, ignition position) and against its equilibrium at '
              'constant enthalpy and pressure; a cooled mechanism tube with friction against its extensible '
              'reactor carrying the wall heat and pressure drop',
  'where': "Peng-Robinson chemical potentials of Cantera's own PR phase",
  'test': 'tests/test_real_gas.py::test_reversible_reaction_on_peng_robinson_reaches_fugacity_equilibrium'},
 {'key': 'semenov1928',
  'citation': "N.N. Semenov, 'Zur Theorie des Verbrennungsprozesses', Z. Phys. 48, 571, 1928; F.A. Williams, "
              'Combustion Theory, 2nd ed., App. B',
  'compared': 'Critical Semenov number against the closed-form tangency condition (1/e for an infinite '
              'activation energy, no critical point for gamma <= 4), and the bound it sets on the other '
              'criteria',
  'where': 'critical condition (tangency); psi_c = 1/e at gamma = inf as in Williams, Combustion Theory, '
           'App. B; finite-gamma table of the project notes (closed form)',
  'test': 'tests/test_runaway_criteria.py::test_semenov_critical_against_closed_form_table'},
 {'key': 'semenov1928',
  'citation': "N.N. Semenov, 'Zur Theorie des Verbrennungsprozesses', Z. Phys. 48, 571, 1928; F.A. Williams, "
              'Combustion Theory, 2nd ed., App. B',
  'compared': 'Critical Semenov number against the closed-form tangency condition (1/e for an infinite '
              'activation energy, no critical point for gamma <= 4), and the bound it sets on the other '
              'criteria',
  'where': 'no critical point for gamma <= 4 (closed form: double root at 4)',
  'test': 'tests/test_runaway_criteria.py::test_semenov_no_criticality_for_gamma_at_most_4'},
 {'key': 'morbidelli_varma1988',
  'citation': "M. Morbidelli, A. Varma, 'A generalized criterion for parametric sensitivity: application to "
              "thermal explosion theory', Chem. Eng. Sci. 43, 91, 1988",
  'compared': 'Runaway boundary at the peak of the normalized hot-spot sensitivity: critical '
              'reaction-to-cooling ratios, the ordering of the criteria, the size of the sensitivity peak '
              'and the critical feed partial pressure of the Froment (1967) tube (also found on a sweep '
              'grid), against an independent reproduction (not values printed in the paper)',
  'where': 'criterion: maximum of the normalized hot-spot sensitivity, phi = N; numbers: regression of the '
           'reproduction in the project notes (runaway.md table 1.7), not digits printed in the paper',
  'test': 'tests/test_runaway_criteria.py::test_critical_N_over_B_morbidelli_varma'},
 {'key': 'morbidelli_varma1988',
  'citation': "M. Morbidelli, A. Varma, 'A generalized criterion for parametric sensitivity: application to "
              "thermal explosion theory', Chem. Eng. Sci. 43, 91, 1988",
  'compared': 'Runaway boundary at the peak of the normalized hot-spot sensitivity: critical '
              'reaction-to-cooling ratios, the ordering of the criteria, the size of the sensitivity peak '
              'and the critical feed partial pressure of the Froment (1967) tube (also found on a sweep '
              'grid), against an independent reproduction (not values printed in the paper)',
  'where': 'size of the sensitivity peak: regression of the reproduction in runaway.md section 1.7 (|s|max = '
           '1.5, 8, 70 at B = 5, 10, 15)',
  'test': 'tests/test_runaway_criteria.py::test_sensitivity_peak_size_grows_with_B'},
 {'key': 'van_welsenaere_froment1970',
  'citation': "R.J. Van Welsenaere, G.F. Froment, 'Parametric sensitivity and runaway in fixed bed catalytic "
              "reactors', Chem. Eng. Sci. 25, 1503-1516, 1970",
  'compared': 'Criterion I (hot spot on the extremum of the maxima curve) and criterion II (inflection '
              'before the hot spot): critical reaction-to-cooling ratios, and the critical feed partial '
              'pressure of the Froment (1967) tube, against an independent reproduction of the criteria (not '
              'values printed in the paper)',
  'where': 'criterion I (hot spot = extremum of the maxima curve); numbers: regression of runaway.md table '
           '1.7, not printed in the paper',
  'test': 'tests/test_runaway_criteria.py::test_critical_N_over_B_van_welsenaere_froment_maxima'},
 {'key': 'thomas_bowes1961',
  'citation': "P.H. Thomas, P.C. Bowes, 'Some aspects of the self-heating and ignition of solid cellulosic "
              "materials', Br. J. Appl. Phys. 12, 222, 1961",
  'compared': 'Inflection (convexity) criterion on the temperature profile: critical reaction-to-cooling '
              'ratios and the critical feed partial pressure of the Froment (1967) tube, against an '
              'independent reproduction (not values printed in the paper)',
  'where': 'inflection (convexity before the hot spot) applied to T(z)',
  'test': 'tests/test_runaway_criteria.py::test_critical_N_over_B_thomas_bowes'},
 {'key': 'van_welsenaere_froment1970',
  'citation': "R.J. Van Welsenaere, G.F. Froment, 'Parametric sensitivity and runaway in fixed bed catalytic "
              "reactors', Chem. Eng. Sci. 25, 1503-1516, 1970",
  'compared': 'Criterion I (hot spot on the extremum of the maxima curve) and criterion II (inflection '
              'before the hot spot): critical reaction-to-cooling ratios, and the critical feed partial '
              'pressure of the Froment (1967) tube, against an independent reproduction of the criteria (not '
              'values printed in the paper)',
  'where': 'criterion II; numbers: regression of runaway.md table 1.7, not printed in the paper',
  'test': 'tests/test_runaway_criteria.py::test_critical_N_over_B_thomas_bowes'},
 {'key': 'adler_enig1964',
  'citation': "J. Adler, J.W. Enig, 'The critical conditions in thermal explosion theory with reactant "
              "consumption', Combust. Flame 8, 97, 1964",
  'compared': 'Convexity of the temperature-conversion curve before its maximum: critical '
              'reaction-to-cooling ratios against an independent reproduction (not values printed in the '
              'paper)',
  'where': 'convexity of the temperature-conversion curve before the maximum; numbers: regression of '
           'runaway.md table 1.7, not printed in the paper',
  'test': 'tests/test_runaway_criteria.py::test_critical_N_over_B_adler_enig'},
 {'key': 'semenov1928',
  'citation': "N.N. Semenov, 'Zur Theorie des Verbrennungsprozesses', Z. Phys. 48, 571, 1928; F.A. Williams, "
              'Combustion Theory, 2nd ed., App. B',
  'compared': 'Critical Semenov number against the closed-form tangency condition (1/e for an infinite '
              'activation energy, no critical point for gamma <= 4), and the bound it sets on the other '
              'criteria',
  'where': 'N/B bound 1/psi_c(gamma)',
  'test': 'tests/test_runaway_criteria.py::test_ordering_of_criteria_and_approach_to_semenov'},
 {'key': 'morbidelli_varma1988',
  'citation': "M. Morbidelli, A. Varma, 'A generalized criterion for parametric sensitivity: application to "
              "thermal explosion theory', Chem. Eng. Sci. 43, 91, 1988",
  'compared': 'Runaway boundary at the peak of the normalized hot-spot sensitivity: critical '
              'reaction-to-cooling ratios, the ordering of the criteria, the size of the sensitivity peak '
              'and the critical feed partial pressure of the Froment (1967) tube (also found on a sweep '
              'grid), against an independent reproduction (not values printed in the paper)',
  'where': 'ordering of the criteria: regression of the structural facts stated with runaway.md table 1.7',
  'test': 'tests/test_runaway_criteria.py::test_ordering_of_criteria_and_approach_to_semenov'},
 {'key': 'barkelew1959',
  'citation': "C.H. Barkelew, 'Stability of chemical reactors', Chem. Eng. Prog. Symp. Ser. 55(25), 37-46, "
              '1959',
  'compared': 'Envelope of the critical reaction-to-cooling ratio N/S against S and its large-S limit, '
              'against an independent reproduction of the Morbidelli-Varma boundary for infinite activation '
              'energy (not chart values read from the paper)',
  'where': 'envelope of critical N/S against S (closed form from memory); large-S limit e (Semenov, derived)',
  'test': 'tests/test_runaway_criteria.py::test_barkelew_envelope_tends_to_the_semenov_value'},
 {'key': 'barkelew1959',
  'citation': "C.H. Barkelew, 'Stability of chemical reactors', Chem. Eng. Prog. Symp. Ser. 55(25), 37-46, "
              '1959',
  'compared': 'Envelope of the critical reaction-to-cooling ratio N/S against S and its large-S limit, '
              'against an independent reproduction of the Morbidelli-Varma boundary for infinite activation '
              'energy (not chart values read from the paper)',
  'where': 'envelope from memory, compared with the Morbidelli-Varma boundary for gamma = inf of the project '
           "notes' reproduction (runaway.md table 1.7), which the published comparisons put on Barkelew's "
           'envelope (from memory)',
  'test': 'tests/test_runaway_criteria.py::test_barkelew_envelope_against_the_reproduced_boundary'},
 {'key': 'morbidelli_varma1988',
  'citation': "M. Morbidelli, A. Varma, 'A generalized criterion for parametric sensitivity: application to "
              "thermal explosion theory', Chem. Eng. Sci. 43, 91, 1988",
  'compared': 'Runaway boundary at the peak of the normalized hot-spot sensitivity: critical '
              'reaction-to-cooling ratios, the ordering of the criteria, the size of the sensitivity peak '
              'and the critical feed partial pressure of the Froment (1967) tube (also found on a sweep '
              'grid), against an independent reproduction (not values printed in the paper)',
  'where': 'criterion applied to the Froment (1967) tube; 0.01777 atm from an independent reproduction, not '
           'a printed value',
  'test': 'tests/test_screening.py::test_morbidelli_varma_critical_feed_fraction'},
 {'key': 'van_welsenaere_froment1970',
  'citation': "R.J. Van Welsenaere, G.F. Froment, 'Parametric sensitivity and runaway in fixed bed catalytic "
              "reactors', Chem. Eng. Sci. 25, 1503-1516, 1970",
  'compared': 'Criterion I (hot spot on the extremum of the maxima curve) and criterion II (inflection '
              'before the hot spot): critical reaction-to-cooling ratios, and the critical feed partial '
              'pressure of the Froment (1967) tube, against an independent reproduction of the criteria (not '
              'values printed in the paper)',
  'where': 'maxima-curve criterion on the Froment (1967) tube; 0.01614 atm from an independent reproduction, '
           'T_m - Tw = 31.62 K derived',
  'test': 'tests/test_screening.py::test_van_welsenaere_froment_maxima_curve'},
 {'key': 'thomas_bowes1961',
  'citation': "P.H. Thomas, P.C. Bowes, 'Some aspects of the self-heating and ignition of solid cellulosic "
              "materials', Br. J. Appl. Phys. 12, 222, 1961",
  'compared': 'Inflection (convexity) criterion on the temperature profile: critical reaction-to-cooling '
              'ratios and the critical feed partial pressure of the Froment (1967) tube, against an '
              'independent reproduction (not values printed in the paper)',
  'where': 'inflection test on the Froment (1967) tube; 0.01761 atm from an independent reproduction',
  'test': 'tests/test_screening.py::test_inflection_criterion'},
 {'key': 'froment1967',
  'citation': "G.F. Froment, 'Fixed bed catalytic reactors - current design status', Ind. Eng. Chem. 59(2), "
              '18-27, 1967',
  'compared': 'Hot-spot temperature of the published o-xylene oxidation tube for inlet partial pressures of '
              '0.011-0.0175 atm, against an independent reproduction of the published model and data (not '
              'values printed in the paper); the jump to runaway between 0.0175 and 0.018 atm, within 3 % of '
              'where the published profiles run away; the dimensionless groups of the published tube; the '
              "published overall U (96 W/(m^2 K)) against U from Leva's packed-bed wall correlation with a "
              'steel wall and a shell-side coefficient, and from the Li-Finlayson wall coefficient lumped '
              'with a radial conductivity (plausibility, within 20 %)',
  'where': 'groups derived from the published tube data (independent derivation)',
  'test': 'tests/test_screening.py::test_groups_of_the_published_tube'},
 {'key': 'froment1967',
  'citation': "G.F. Froment, 'Fixed bed catalytic reactors - current design status', Ind. Eng. Chem. 59(2), "
              '18-27, 1967',
  'compared': 'Hot-spot temperature of the published o-xylene oxidation tube for inlet partial pressures of '
              '0.011-0.0175 atm, against an independent reproduction of the published model and data (not '
              'values printed in the paper); the jump to runaway between 0.0175 and 0.018 atm, within 3 % of '
              'where the published profiles run away; the dimensionless groups of the published tube; the '
              "published overall U (96 W/(m^2 K)) against U from Leva's packed-bed wall correlation with a "
              'steel wall and a shell-side coefficient, and from the Li-Finlayson wall coefficient lumped '
              'with a radial conductivity (plausibility, within 20 %)',
  'where': "runaway appears just above p0 = 0.018 atm in the source's profile figure (from memory): +-3 %",
  'test': 'tests/test_screening.py::test_critical_feed_fraction_near_the_remembered_published_value'},
 {'key': 'barkelew1959',
  'citation': "C.H. Barkelew, 'Stability of chemical reactors', Chem. Eng. Prog. Symp. Ser. 55(25), 37-46, "
              '1959',
  'compared': 'Envelope of the critical reaction-to-cooling ratio N/S against S and its large-S limit, '
              'against an independent reproduction of the Morbidelli-Varma boundary for infinite activation '
              'energy (not chart values read from the paper)',
  'where': 'envelope (from memory) on the Froment (1967) tube: safe at p0 = 0.015 atm, critical p0 below the '
           'Morbidelli-Varma one (the envelope is for gamma = inf)',
  'test': 'tests/test_screening.py::test_barkelew_on_the_published_tube'},
 {'key': 'morbidelli_varma1988',
  'citation': "M. Morbidelli, A. Varma, 'A generalized criterion for parametric sensitivity: application to "
              "thermal explosion theory', Chem. Eng. Sci. 43, 91, 1988",
  'compared': 'Runaway boundary at the peak of the normalized hot-spot sensitivity: critical '
              'reaction-to-cooling ratios, the ordering of the criteria, the size of the sensitivity peak '
              'and the critical feed partial pressure of the Froment (1967) tube (also found on a sweep '
              'grid), against an independent reproduction (not values printed in the paper)',
  'where': 'boundary on a sweep grid of the Froment (1967) tube; 0.01777 atm from an independent '
           'reproduction',
  'test': 'tests/test_sweep_cli.py::test_sweep_boundary_matches_the_morbidelli_varma_critical_value'},
 {'key': 'cantera',
  'citation': "D.G. Goodwin, H.K. Moffat, I. Schoegl, R.L. Speth, B.W. Weber, 'Cantera: An object-oriented "
              "software toolkit for chemical kinetics, thermodynamics, and transport processes', version "
              '3.2, https://www.cantera.org',
  'compared': 'Equilibrium reached by reversible rates (ideal gas and Peng-Robinson fugacities) against '
              'Gibbs-energy minimisation on the same species data; adiabatic temperature rise against an '
              'enthalpy balance on the same data; mixture viscosity (Wilke rule on pure-species fits) '
              'against its mixture-averaged transport; a detailed-mechanism tube (adiabatic, isobaric, '
              'hydrogen/air on GRI-Mech 3.0 species) against its constant-pressure reactor marched in time '
              '(outlet temperature and composition, ignition position) and against its equilibrium at '
              'constant enthalpy and pressure; a cooled mechanism tube with friction against its extensible '
              'reactor carrying the wall heat and pressure drop',
  'where': "equilibrate('TP') of N2/H2/NH3 (gri30 thermo, ideal gas)",
  'test': 'tests/test_temkin.py::test_temkin_rate_vanishes_at_the_equilibrium_cantera_computes'},
 {'key': 'coolprop',
  'citation': "I.H. Bell, J. Wronski, S. Quoilin, V. Lemort, 'Pure and pseudo-pure fluid thermophysical "
              "property evaluation and the open-source thermophysical property library CoolProp', Ind. Eng. "
              'Chem. Res. 53(6), 2498-2508, 2014',
  'compared': 'Reference compressibility factors and enthalpies of methane and nitrogen, and ideal-gas heat '
              'capacities of H2, N2, CH4 and H2O, used in the real-gas and enthalpy-balance checks',
  'where': 'Peng-Robinson compressibility factor of pure ethanol at 560 K and 40 bar',
  'test': 'tests/test_thermo_critical.py::test_pure_ethanol_compressibility_at_560_K_and_40_bar_against_coolprop_peng_robinson'},
 {'key': 'iapws95',
  'citation': "W. Wagner, A. Pruss, 'The IAPWS formulation 1995 for the thermodynamic properties of ordinary "
              "water substance for general and scientific use', J. Phys. Chem. Ref. Data 31(2), 387-535, "
              '2002',
  'compared': "Critical point of water in the built-in critical-constants table (with CoolProp's reference "
              'equation of state as an independent check)',
  'where': 'critical point of water, Tc = 647.096 K, pc = 22.064 MPa',
  'test': 'tests/test_thermo_critical.py::test_critical_constants_of_water_ammonia_and_other_common_species_against_reference_equations_of_state'},
 {'key': 'coolprop',
  'citation': "I.H. Bell, J. Wronski, S. Quoilin, V. Lemort, 'Pure and pseudo-pure fluid thermophysical "
              "property evaluation and the open-source thermophysical property library CoolProp', Ind. Eng. "
              'Chem. Res. 53(6), 2498-2508, 2014',
  'compared': 'Reference compressibility factors and enthalpies of methane and nitrogen, and ideal-gas heat '
              'capacities of H2, N2, CH4 and H2O, used in the real-gas and enthalpy-balance checks',
  'where': 'critical temperature, critical pressure and acentric factor of the reference equations of state',
  'test': 'tests/test_thermo_critical.py::test_critical_constants_of_water_ammonia_and_other_common_species_against_reference_equations_of_state'},
 {'key': 'chase1998',
  'citation': 'M.W. Chase, NIST-JANAF Thermochemical Tables, 4th ed., J. Phys. Chem. Ref. Data Monograph 9, '
              '1998',
  'compared': 'Standard enthalpies of formation, heats of reaction and ideal-gas heat capacities of the '
              'built-in species data against the tables; adiabatic rise of a methanation bed against an '
              'enthalpy balance on the tabulated data',
  'where': 'standard enthalpies of formation at 298.15 K (ideal gas)',
  'test': 'tests/test_thermo_janaf.py::test_formation_enthalpy_against_janaf'},
 {'key': 'chase1998',
  'citation': 'M.W. Chase, NIST-JANAF Thermochemical Tables, 4th ed., J. Phys. Chem. Ref. Data Monograph 9, '
              '1998',
  'compared': 'Standard enthalpies of formation, heats of reaction and ideal-gas heat capacities of the '
              'built-in species data against the tables; adiabatic rise of a methanation bed against an '
              'enthalpy balance on the tabulated data',
  'where': 'heats of reaction at 298.15 K from JANAF enthalpies of formation',
  'test': 'tests/test_thermo_janaf.py::test_heat_of_reaction_against_janaf'},
 {'key': 'chase1998',
  'citation': 'M.W. Chase, NIST-JANAF Thermochemical Tables, 4th ed., J. Phys. Chem. Ref. Data Monograph 9, '
              '1998',
  'compared': 'Standard enthalpies of formation, heats of reaction and ideal-gas heat capacities of the '
              'built-in species data against the tables; adiabatic rise of a methanation bed against an '
              'enthalpy balance on the tabulated data',
  'where': 'ideal-gas heat capacity tables',
  'test': 'tests/test_thermo_janaf.py::test_heat_capacity_against_janaf'},
 {'key': 'cantera',
  'citation': "D.G. Goodwin, H.K. Moffat, I. Schoegl, R.L. Speth, B.W. Weber, 'Cantera: An object-oriented "
              "software toolkit for chemical kinetics, thermodynamics, and transport processes', version "
              '3.2, https://www.cantera.org',
  'compared': 'Equilibrium reached by reversible rates (ideal gas and Peng-Robinson fugacities) against '
              'Gibbs-energy minimisation on the same species data; adiabatic temperature rise against an '
              'enthalpy balance on the same data; mixture viscosity (Wilke rule on pure-species fits) '
              'against its mixture-averaged transport; a detailed-mechanism tube (adiabatic, isobaric, '
              'hydrogen/air on GRI-Mech 3.0 species) against its constant-pressure reactor marched in time '
              '(outlet temperature and composition, ignition position) and against its equilibrium at '
              'constant enthalpy and pressure; a cooled mechanism tube with friction against its extensible '
              'reactor carrying the wall heat and pressure drop',
  'where': 'mixture enthalpy: Quantity mixing at constant H and P',
  'test': 'tests/test_train_run.py::test_quench_mixed_temperature_against_cantera_mixing'},
 {'key': 'levenspiel1999',
  'citation': 'O. Levenspiel, Chemical Reaction Engineering, 3rd ed., Wiley, 1999, ch. 5',
  'compared': 'Volume of an isothermal plug-flow reactor with change in moles (first and second order), and '
              'the ideal design of the assumption check, against the closed-form performance equations',
  'where': 'ch. 5, PFR performance equation with expansion, first order (eq. 5.21 from memory)',
  'test': 'tests/test_validation_closed_forms.py::test_levenspiel_first_order_volume'},
 {'key': 'levenspiel1999',
  'citation': 'O. Levenspiel, Chemical Reaction Engineering, 3rd ed., Wiley, 1999, ch. 5',
  'compared': 'Volume of an isothermal plug-flow reactor with change in moles (first and second order), and '
              'the ideal design of the assumption check, against the closed-form performance equations',
  'where': 'ch. 5, PFR performance equation with expansion, second order (eq. 5.23 from memory)',
  'test': 'tests/test_validation_closed_forms.py::test_levenspiel_second_order_volume'},
 {'key': 'ergun1952',
  'citation': "S. Ergun, 'Fluid flow through packed columns', Chem. Eng. Prog. 48(2), 89-94, 1952",
  'compared': 'Packed-bed pressure gradient against the Ergun equation evaluated by hand (gas and liquid, '
              'viscous and inertial terms apart); isothermal pressure profile and first-order conversion '
              'with pressure drop against the closed forms that follow from it',
  'where': 'Ergun equation; closed form P/P0 = (1 - alpha W)^(1/2) derived from it (isothermal, eps = 0, '
           'ideal gas; textbook section from memory)',
  'test': 'tests/test_validation_closed_forms.py::test_packed_bed_pressure_profile'},
 {'key': 'ergun1952',
  'citation': "S. Ergun, 'Fluid flow through packed columns', Chem. Eng. Prog. 48(2), 89-94, 1952",
  'compared': 'Packed-bed pressure gradient against the Ergun equation evaluated by hand (gas and liquid, '
              'viscous and inertial terms apart); isothermal pressure profile and first-order conversion '
              'with pressure drop against the closed forms that follow from it',
  'where': "first-order conversion with Ergun pressure drop, ln(1/(1-X)) = 2k'/(3 alpha v0) [1 - (1 - alpha "
           'W)^(3/2)], derived from it',
  'test': 'tests/test_validation_closed_forms.py::test_packed_bed_first_order_conversion_with_pressure_drop'},
 {'key': 'energy_balance',
  'citation': 'Steady-flow enthalpy balance with constant heat capacity, e.g. H.S. Fogler, Elements of '
              'Chemical Reaction Engineering, 4th ed., 2006, ch. 8',
  'compared': 'Adiabatic temperature-conversion profile and the temperature rise at complete conversion '
              'against the closed-form adiabatic line',
  'where': 'adiabatic T-X line with constant Cp (Fogler 2006 ch. 8, eq. 8-29 from memory)',
  'test': 'tests/test_validation_closed_forms.py::test_adiabatic_profile_on_closed_form_line'},
 {'key': 'energy_balance',
  'citation': 'Steady-flow enthalpy balance with constant heat capacity, e.g. H.S. Fogler, Elements of '
              'Chemical Reaction Engineering, 4th ed., 2006, ch. 8',
  'compared': 'Adiabatic temperature-conversion profile and the temperature rise at complete conversion '
              'against the closed-form adiabatic line',
  'where': 'adiabatic T-X line at X = 1 (complete conversion)',
  'test': 'tests/test_validation_closed_forms.py::test_adiabatic_temperature_rise_at_complete_conversion'})
