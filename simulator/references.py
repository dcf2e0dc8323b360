"""Reference keys -> full citations. Each model component declares the keys it uses,
the result collects the keys of the components that actually ran, and reports print them."""

REFERENCES = {
    "cantera": "D.G. Goodwin, H.K. Moffat, I. Schoegl, R.L. Speth, B.W. Weber, \"Cantera: An object-oriented "
               "software toolkit for chemical kinetics, thermodynamics, and transport processes,\" "
               "https://www.cantera.org, version 3.",
    "mcbride2002": "B.J. McBride, M.J. Zehe, S. Gordon, \"NASA Glenn coefficients for calculating thermodynamic "
                   "properties of individual species,\" NASA/TP-2002-211556, 2002.",
    "gri30": "G.P. Smith et al., \"GRI-Mech 3.0\" thermodynamic data, as bundled with Cantera (gri30.yaml).",
    "nasa_gas": "B.J. McBride, S. Gordon, M.A. Reno, \"Thermodynamic data for fifty reference elements,\" "
                "NASA TP-3287 / TM-4513, 1993, as bundled with Cantera (nasa_gas.yaml).",
    "arrhenius1889": "S. Arrhenius, \"Über die Reaktionsgeschwindigkeit bei der Inversion von Rohrzucker durch "
                     "Säuren,\" Z. Phys. Chem., vol. 4, pp. 226-248, 1889.",
    "hougen_watson1947": "O.A. Hougen, K.M. Watson, Chemical Process Principles, Part III: Kinetics and "
                         "Catalysis, Wiley, 1947 (Langmuir-Hinshelwood-Hougen-Watson rate forms).",
    "ergun1952": "S. Ergun, \"Fluid flow through packed columns,\" Chem. Eng. Prog., vol. 48, no. 2, "
                 "pp. 89-94, 1952.",
    "wilke1950": "C.R. Wilke, \"A viscosity equation for gas mixtures,\" J. Chem. Phys., vol. 18, no. 4, "
                 "pp. 517-519, 1950, doi:10.1063/1.1747673.",
    "churchill1977": "S.W. Churchill, \"Friction-factor equation spans all fluid-flow regimes,\" Chem. Eng., "
                     "vol. 84, no. 24, pp. 91-92, 1977.",
    "colebrook1939": "C.F. Colebrook, \"Turbulent flow in pipes, with particular reference to the transition "
                     "region between the smooth and rough pipe laws,\" J. Inst. Civ. Eng., vol. 11, no. 4, "
                     "pp. 133-156, 1939.",
    "blasius1913": "H. Blasius, \"Das Aehnlichkeitsgesetz bei Reibungsvorgängen in Flüssigkeiten,\" Mitt. "
                   "Forschungsarb. Geb. Ingenieurwes., vol. 131, pp. 1-41, 1913.",
    "haaland1983": "S.E. Haaland, \"Simple and explicit formulas for the friction factor in turbulent pipe "
                   "flow,\" J. Fluids Eng., vol. 105, no. 1, pp. 89-90, 1983, doi:10.1115/1.3240948.",
    "white2011": "F.M. White, Fluid Mechanics, 7th ed., McGraw-Hill, 2011, ch. 6.",
    "hagen_poiseuille": "Hagen-Poiseuille laminar friction factor f = 64/Re (textbook standard).",
    "peng_robinson1976": "D.-Y. Peng, D.B. Robinson, \"A new two-constant equation of state,\" Ind. Eng. Chem. "
                         "Fundam., vol. 15, no. 1, pp. 59-64, 1976, doi:10.1021/i160057a011.",
    "hindmarsh1983": "A.C. Hindmarsh, \"ODEPACK, a systematized collection of ODE solvers,\" in Scientific "
                     "Computing, IMACS Trans., vol. 1, pp. 55-64, 1983; L. Petzold, \"Automatic selection of "
                     "methods for solving stiff and nonstiff systems of ODEs,\" SIAM J. Sci. Stat. Comput., "
                     "vol. 4, pp. 136-148, 1983 (LSODA, via scipy.integrate.odeint).",
    "villadsen_stewart1967": "J.V. Villadsen, W.E. Stewart, \"Solution of boundary-value problems by orthogonal "
                             "collocation,\" Chem. Eng. Sci., vol. 22, no. 11, pp. 1483-1501, 1967.",
    "hindmarsh2005": "A.C. Hindmarsh et al., \"SUNDIALS: Suite of nonlinear and differential/algebraic equation "
                     "solvers,\" ACM Trans. Math. Softw., vol. 31, no. 3, pp. 363-396, 2005, "
                     "doi:10.1145/1089014.1089020 (CVODE, via scikit-sundae).",
    "semenov1928": "N.N. Semenov, \"Zur Theorie des Verbrennungsprozesses,\" Z. Phys., vol. 48, pp. 571-582, 1928.",
    "barkelew1959": "C.H. Barkelew, \"Stability of chemical reactors,\" Chem. Eng. Prog. Symp. Ser., vol. 55, "
                    "no. 25, pp. 37-46, 1959.",
    "van_welsenaere_froment1970": "R.J. Van Welsenaere, G.F. Froment, \"Parametric sensitivity and runaway in "
                                  "fixed bed catalytic reactors,\" Chem. Eng. Sci., vol. 25, pp. 1503-1516, 1970.",
    "adler_enig1964": "J. Adler, J.W. Enig, \"The critical conditions in thermal explosion theory with reactant "
                      "consumption,\" Combust. Flame, vol. 8, pp. 97-103, 1964.",
    "morbidelli_varma1988": "M. Morbidelli, A. Varma, \"A generalized criterion for parametric sensitivity: "
                            "application to thermal explosion theory,\" Chem. Eng. Sci., vol. 43, pp. 91-102, 1988.",
    "thomas_bowes1961": "P.H. Thomas, P.C. Bowes, \"Some aspects of the self-heating and ignition of solid "
                        "cellulosic materials,\" Br. J. Appl. Phys., vol. 12, p. 222, 1961.",
    "froment1967": "G.F. Froment, \"Fixed bed catalytic reactors - current design status,\" Ind. Eng. Chem., "
                   "vol. 59, no. 2, pp. 18-27, 1967.",
    "clopper_pearson1934": "C.J. Clopper, E.S. Pearson, \"The use of confidence or fiducial limits illustrated in "
                           "the case of the binomial,\" Biometrika, vol. 26, no. 4, pp. 404-413, 1934.",
    "wilson1927": "E.B. Wilson, \"Probable inference, the law of succession, and statistical inference,\" "
                  "J. Am. Stat. Assoc., vol. 22, no. 158, pp. 209-212, 1927.",
    "mckay1979": "M.D. McKay, R.J. Beckman, W.J. Conover, \"A comparison of three methods for selecting values of "
                 "input variables in the analysis of output from a computer code,\" Technometrics, vol. 21, "
                 "no. 2, pp. 239-245, 1979.",
    "sobol1967": "I.M. Sobol', \"On the distribution of points in a cube and the approximate evaluation of "
                 "integrals,\" USSR Comput. Math. Math. Phys., vol. 7, no. 4, pp. 86-112, 1967.",
    "spearman1904": "C. Spearman, \"The proof and measurement of association between two things,\" Am. J. "
                    "Psychol., vol. 15, no. 1, pp. 72-101, 1904.",
    "levenspiel1999": "O. Levenspiel, Chemical Reaction Engineering, 3rd ed., Wiley, 1999, ch. 5.",
    "gnielinski1976": "V. Gnielinski, \"New equations for heat and mass transfer in turbulent pipe and channel "
                      "flow,\" Int. Chem. Eng., vol. 16, no. 2, pp. 359-368, 1976; with the friction factor of "
                      "G.K. Filonenko, Teploenergetika, vol. 1, no. 4, pp. 40-44, 1954.",
    "gnielinski2013": "V. Gnielinski, \"On heat transfer in tubes,\" Int. J. Heat Mass Transfer, vol. 63, "
                      "pp. 134-140, 2013 (the laminar-turbulent blend).",
    "dittus_boelter1930": "F.W. Dittus, L.M.K. Boelter, \"Heat transfer in automobile radiators of the tubular "
                          "type,\" Univ. Calif. Publ. Eng., vol. 2, pp. 443-461, 1930.",
    "leva1949": "M. Leva, \"Packed-tube heat transfer,\" Ind. Eng. Chem., vol. 41, p. 1206, 1949 (heating), and "
                "M. Leva et al., \"Cooling of gases through packed tubes,\" Ind. Eng. Chem., 1950 (cooling); "
                "constants as usually quoted.",
    "li_finlayson1977": "C.-H. Li, B.A. Finlayson, \"Heat transfer in packed beds - a reevaluation,\" Chem. Eng. "
                        "Sci., vol. 32, pp. 1055-1066, 1977.",
    "andrade1930": "E.N. da C. Andrade, \"The viscosity of liquids,\" Nature, vol. 125, pp. 309-310, 1930.",
    "smith_van_ness2005": "J.M. Smith, H.C. Van Ness, M.M. Abbott, Introduction to Chemical Engineering "
                          "Thermodynamics, 7th ed., McGraw-Hill, 2005 (Raoult's law, Clausius-Clapeyron).",
    "aris1975": "R. Aris, The Mathematical Theory of Diffusion and Reaction in Permeable Catalysts, vol. 1, "
                "Clarendon Press, Oxford, 1975.",
    "bischoff1965": "K.B. Bischoff, \"Effectiveness factors for general reaction rate forms,\" AIChE J., vol. 11, "
                    "pp. 351-355, 1965.",
    "weisz_prater1954": "P.B. Weisz, C.D. Prater, \"Interpretation of measurements in experimental catalysis,\" "
                        "Adv. Catal., vol. 6, pp. 143-196, 1954.",
    "zukauskas1972": "A. Zukauskas, \"Heat transfer from tubes in crossflow,\" Adv. Heat Transfer, vol. 8, "
                     "pp. 93-160, 1972.",
    "mathur1967": "S. Mathur, P.K. Tondon, S.C. Saxena, \"Thermal conductivity of binary, ternary and "
                  "quaternary mixtures of rare gases,\" Mol. Phys., vol. 12, pp. 569-579, 1967.",
}


def lookup(keys):
    """[(key, citation)] for the given keys, in the given order, unknown keys kept visible."""
    seen, out = set(), []
    for key in keys:
        if key in seen:
            continue
        seen.add(key)
        out.append((key, REFERENCES.get(key, f"(no citation recorded for {key!r})")))
    return out
