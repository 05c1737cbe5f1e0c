/**
 * Check values for the moist-air engine, copied from the project's sourced reference list (each
 * case keeps its id, its published source, its provenance and its tolerance; "from-memory" cases
 * say so in their source). Units are named in each key: SI cases in °C, Pa, kg/kg, J/kg, m³/kg;
 * I-P cases in °F, psia, lb/lb, Btu/lb (dry air 0 at 0 °F, water from liquid at 32 °F), ft³/lb.
 * Tolerance semantics: a check passes if |actual − expected| ≤ abs, or ≤ rel·|expected|.
 * Where the engine's SI-with-exact-conversion figures need a wider band than the listed one for
 * an I-P case, the test file widens it explicitly and says why beside the case.
 */

/** A tolerance band: absolute, relative, or either. */
export interface Tol {
  abs?: number;
  rel?: number;
}

/** One sourced check case. */
export interface CheckCase {
  id: string;
  /** What the case checks (selects the computation in the test). */
  kind:
    | 'pws'
    | 'ws'
    | 'hs'
    | 'dryAir'
    | 'stdAtm'
    | 'example1'
    | 'wFromPw'
    | 'wFromWb'
    | 'enthalpy'
    | 'volume'
    | 'density'
    | 'wbFromRh';
  units: 'SI' | 'IP';
  provenance: string;
  source: string;
  inputs: Record<string, number>;
  expected: Record<string, number>;
  tolerance: Record<string, Tol>;
  note: string;
}

/** Every applicable case of the reference list (the "edge" behaviour cases are tested by name elsewhere). */
export const CHECK_CASES: CheckCase[] = [
  {
    id: 'PL-SI-PWS--60',
    kind: 'pws',
    units: 'SI',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (SI) Ch.1 Table 3, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatVapPres',
    inputs: { t_C: -60 },
    expected: { pws_Pa: 1.08 },
    tolerance: { pws_Pa: { abs: 0.01 } },
    note: 'PsychroLib notes the H-W formula misses the 300 ppm claim here; abs 0.01 Pa used.',
  },
  {
    id: 'PL-SI-PWS--20',
    kind: 'pws',
    units: 'SI',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (SI) Ch.1 Table 3, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatVapPres',
    inputs: { t_C: -20 },
    expected: { pws_Pa: 103.24 },
    tolerance: { pws_Pa: { rel: 0.0003 } },
    note: 'ASHRAE states eqns 5/6 agree with Table 3 within ~300 ppm; tolerance = 300 ppm.',
  },
  {
    id: 'PL-SI-PWS--5',
    kind: 'pws',
    units: 'SI',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (SI) Ch.1 Table 3, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatVapPres',
    inputs: { t_C: -5 },
    expected: { pws_Pa: 401.74 },
    tolerance: { pws_Pa: { rel: 0.0003 } },
    note: 'ASHRAE states eqns 5/6 agree with Table 3 within ~300 ppm; tolerance = 300 ppm.',
  },
  {
    id: 'PL-SI-PWS-5',
    kind: 'pws',
    units: 'SI',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (SI) Ch.1 Table 3, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatVapPres',
    inputs: { t_C: 5 },
    expected: { pws_Pa: 872.6 },
    tolerance: { pws_Pa: { rel: 0.0003 } },
    note: 'ASHRAE states eqns 5/6 agree with Table 3 within ~300 ppm; tolerance = 300 ppm.',
  },
  {
    id: 'PL-SI-PWS-25',
    kind: 'pws',
    units: 'SI',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (SI) Ch.1 Table 3, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatVapPres',
    inputs: { t_C: 25 },
    expected: { pws_Pa: 3169.7 },
    tolerance: { pws_Pa: { rel: 0.0003 } },
    note: 'ASHRAE states eqns 5/6 agree with Table 3 within ~300 ppm; tolerance = 300 ppm.',
  },
  {
    id: 'PL-SI-PWS-50',
    kind: 'pws',
    units: 'SI',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (SI) Ch.1 Table 3, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatVapPres',
    inputs: { t_C: 50 },
    expected: { pws_Pa: 12351.3 },
    tolerance: { pws_Pa: { rel: 0.0003 } },
    note: 'ASHRAE states eqns 5/6 agree with Table 3 within ~300 ppm; tolerance = 300 ppm.',
  },
  {
    id: 'PL-SI-PWS-100',
    kind: 'pws',
    units: 'SI',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (SI) Ch.1 Table 3, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatVapPres',
    inputs: { t_C: 100 },
    expected: { pws_Pa: 101418 },
    tolerance: { pws_Pa: { rel: 0.0003 } },
    note: 'ASHRAE states eqns 5/6 agree with Table 3 within ~300 ppm; tolerance = 300 ppm.',
  },
  {
    id: 'PL-SI-PWS-150',
    kind: 'pws',
    units: 'SI',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (SI) Ch.1 Table 3, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatVapPres',
    inputs: { t_C: 150 },
    expected: { pws_Pa: 476101.4 },
    tolerance: { pws_Pa: { rel: 0.0003 } },
    note: 'ASHRAE states eqns 5/6 agree with Table 3 within ~300 ppm; tolerance = 300 ppm.',
  },
  {
    id: 'PL-IP-PWS--76',
    kind: 'pws',
    units: 'IP',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (I-P) Ch.1 Table 3, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatVapPres',
    inputs: { t_F: -76 },
    expected: { pws_psia: 0.000157 },
    tolerance: { pws_psia: { abs: 1e-5 } },
    note:
      'IP test temperatures are the SI ones converted (-76F=-60C ... ' +
      '300F~148.9C); values consistent with SI Table 3 x 0.1450377.',
  },
  {
    id: 'PL-IP-PWS--4',
    kind: 'pws',
    units: 'IP',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (I-P) Ch.1 Table 3, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatVapPres',
    inputs: { t_F: -4 },
    expected: { pws_psia: 0.014974 },
    tolerance: { pws_psia: { rel: 0.0003 } },
    note:
      'IP test temperatures are the SI ones converted (-76F=-60C ... ' +
      '300F~148.9C); values consistent with SI Table 3 x 0.1450377.',
  },
  {
    id: 'PL-IP-PWS-23',
    kind: 'pws',
    units: 'IP',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (I-P) Ch.1 Table 3, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatVapPres',
    inputs: { t_F: 23 },
    expected: { pws_psia: 0.058268 },
    tolerance: { pws_psia: { rel: 0.0003 } },
    note:
      'IP test temperatures are the SI ones converted (-76F=-60C ... ' +
      '300F~148.9C); values consistent with SI Table 3 x 0.1450377.',
  },
  {
    id: 'PL-IP-PWS-41',
    kind: 'pws',
    units: 'IP',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (I-P) Ch.1 Table 3, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatVapPres',
    inputs: { t_F: 41 },
    expected: { pws_psia: 0.12656 },
    tolerance: { pws_psia: { rel: 0.0003 } },
    note:
      'IP test temperatures are the SI ones converted (-76F=-60C ... ' +
      '300F~148.9C); values consistent with SI Table 3 x 0.1450377.',
  },
  {
    id: 'PL-IP-PWS-77',
    kind: 'pws',
    units: 'IP',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (I-P) Ch.1 Table 3, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatVapPres',
    inputs: { t_F: 77 },
    expected: { pws_psia: 0.45973 },
    tolerance: { pws_psia: { rel: 0.0003 } },
    note:
      'IP test temperatures are the SI ones converted (-76F=-60C ... ' +
      '300F~148.9C); values consistent with SI Table 3 x 0.1450377.',
  },
  {
    id: 'PL-IP-PWS-122',
    kind: 'pws',
    units: 'IP',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (I-P) Ch.1 Table 3, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatVapPres',
    inputs: { t_F: 122 },
    expected: { pws_psia: 1.7914 },
    tolerance: { pws_psia: { rel: 0.0003 } },
    note:
      'IP test temperatures are the SI ones converted (-76F=-60C ... ' +
      '300F~148.9C); values consistent with SI Table 3 x 0.1450377.',
  },
  {
    id: 'PL-IP-PWS-212',
    kind: 'pws',
    units: 'IP',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (I-P) Ch.1 Table 3, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatVapPres',
    inputs: { t_F: 212 },
    expected: { pws_psia: 14.7094 },
    tolerance: { pws_psia: { rel: 0.0003 } },
    note:
      'IP test temperatures are the SI ones converted (-76F=-60C ... ' +
      '300F~148.9C); values consistent with SI Table 3 x 0.1450377.',
  },
  {
    id: 'PL-IP-PWS-300',
    kind: 'pws',
    units: 'IP',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (I-P) Ch.1 Table 3, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatVapPres',
    inputs: { t_F: 300 },
    expected: { pws_psia: 67.0206 },
    tolerance: { pws_psia: { rel: 0.0003 } },
    note:
      'IP test temperatures are the SI ones converted (-76F=-60C ... ' +
      '300F~148.9C); values consistent with SI Table 3 x 0.1450377.',
  },
  {
    id: 'PL-SI-WS--50',
    kind: 'ws',
    units: 'SI',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (SI) Ch.1 Table 2, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatHumRatio',
    inputs: { t_C: -50, p_Pa: 101325 },
    expected: { Ws_kg_per_kg: 2.43e-5 },
    tolerance: { Ws_kg_per_kg: { rel: 0.01 } },
    note:
      'Table 2 is a real-gas (enhancement-factor) tabulation; ideal-gas eqn ' +
      "20/36 differs by up to ~2% (largest at 85 C). Tolerances are PsychroLib's.",
  },
  {
    id: 'PL-SI-WS--20',
    kind: 'ws',
    units: 'SI',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (SI) Ch.1 Table 2, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatHumRatio',
    inputs: { t_C: -20, p_Pa: 101325 },
    expected: { Ws_kg_per_kg: 0.0006373 },
    tolerance: { Ws_kg_per_kg: { rel: 0.01 } },
    note:
      'Table 2 is a real-gas (enhancement-factor) tabulation; ideal-gas eqn ' +
      "20/36 differs by up to ~2% (largest at 85 C). Tolerances are PsychroLib's.",
  },
  {
    id: 'PL-SI-WS--5',
    kind: 'ws',
    units: 'SI',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (SI) Ch.1 Table 2, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatHumRatio',
    inputs: { t_C: -5, p_Pa: 101325 },
    expected: { Ws_kg_per_kg: 0.0024863 },
    tolerance: { Ws_kg_per_kg: { rel: 0.005 } },
    note:
      'Table 2 is a real-gas (enhancement-factor) tabulation; ideal-gas eqn ' +
      "20/36 differs by up to ~2% (largest at 85 C). Tolerances are PsychroLib's.",
  },
  {
    id: 'PL-SI-WS-5',
    kind: 'ws',
    units: 'SI',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (SI) Ch.1 Table 2, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatHumRatio',
    inputs: { t_C: 5, p_Pa: 101325 },
    expected: { Ws_kg_per_kg: 0.005425 },
    tolerance: { Ws_kg_per_kg: { rel: 0.005 } },
    note:
      'Table 2 is a real-gas (enhancement-factor) tabulation; ideal-gas eqn ' +
      "20/36 differs by up to ~2% (largest at 85 C). Tolerances are PsychroLib's.",
  },
  {
    id: 'PL-SI-WS-25',
    kind: 'ws',
    units: 'SI',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (SI) Ch.1 Table 2, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatHumRatio',
    inputs: { t_C: 25, p_Pa: 101325 },
    expected: { Ws_kg_per_kg: 0.020173 },
    tolerance: { Ws_kg_per_kg: { rel: 0.005 } },
    note:
      'Table 2 is a real-gas (enhancement-factor) tabulation; ideal-gas eqn ' +
      "20/36 differs by up to ~2% (largest at 85 C). Tolerances are PsychroLib's.",
  },
  {
    id: 'PL-SI-WS-50',
    kind: 'ws',
    units: 'SI',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (SI) Ch.1 Table 2, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatHumRatio',
    inputs: { t_C: 50, p_Pa: 101325 },
    expected: { Ws_kg_per_kg: 0.086863 },
    tolerance: { Ws_kg_per_kg: { rel: 0.01 } },
    note:
      'Table 2 is a real-gas (enhancement-factor) tabulation; ideal-gas eqn ' +
      "20/36 differs by up to ~2% (largest at 85 C). Tolerances are PsychroLib's.",
  },
  {
    id: 'PL-SI-WS-85',
    kind: 'ws',
    units: 'SI',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (SI) Ch.1 Table 2, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatHumRatio',
    inputs: { t_C: 85, p_Pa: 101325 },
    expected: { Ws_kg_per_kg: 0.838105 },
    tolerance: { Ws_kg_per_kg: { rel: 0.02 } },
    note:
      'Table 2 is a real-gas (enhancement-factor) tabulation; ideal-gas eqn ' +
      "20/36 differs by up to ~2% (largest at 85 C). Tolerances are PsychroLib's.",
  },
  {
    id: 'PL-SI-HS--50',
    kind: 'hs',
    units: 'SI',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (SI) Ch.1 Table 2, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatAirEnthalpy',
    inputs: { t_C: -50, p_Pa: 101325 },
    expected: { hs_J_per_kg: -50222 },
    tolerance: { hs_J_per_kg: { rel: 0.01 } },
    note: 'Real-gas table vs ideal-gas eqn 30; PsychroLib tolerances (3% at -5 C because h is near zero).',
  },
  {
    id: 'PL-SI-HS--20',
    kind: 'hs',
    units: 'SI',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (SI) Ch.1 Table 2, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatAirEnthalpy',
    inputs: { t_C: -20, p_Pa: 101325 },
    expected: { hs_J_per_kg: -18542 },
    tolerance: { hs_J_per_kg: { rel: 0.01 } },
    note: 'Real-gas table vs ideal-gas eqn 30; PsychroLib tolerances (3% at -5 C because h is near zero).',
  },
  {
    id: 'PL-SI-HS--5',
    kind: 'hs',
    units: 'SI',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (SI) Ch.1 Table 2, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatAirEnthalpy',
    inputs: { t_C: -5, p_Pa: 101325 },
    expected: { hs_J_per_kg: 1164 },
    tolerance: { hs_J_per_kg: { rel: 0.03 } },
    note: 'Real-gas table vs ideal-gas eqn 30; PsychroLib tolerances (3% at -5 C because h is near zero).',
  },
  {
    id: 'PL-SI-HS-5',
    kind: 'hs',
    units: 'SI',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (SI) Ch.1 Table 2, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatAirEnthalpy',
    inputs: { t_C: 5, p_Pa: 101325 },
    expected: { hs_J_per_kg: 18639 },
    tolerance: { hs_J_per_kg: { rel: 0.01 } },
    note: 'Real-gas table vs ideal-gas eqn 30; PsychroLib tolerances (3% at -5 C because h is near zero).',
  },
  {
    id: 'PL-SI-HS-25',
    kind: 'hs',
    units: 'SI',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (SI) Ch.1 Table 2, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatAirEnthalpy',
    inputs: { t_C: 25, p_Pa: 101325 },
    expected: { hs_J_per_kg: 76504 },
    tolerance: { hs_J_per_kg: { rel: 0.01 } },
    note: 'Real-gas table vs ideal-gas eqn 30; PsychroLib tolerances (3% at -5 C because h is near zero).',
  },
  {
    id: 'PL-SI-HS-50',
    kind: 'hs',
    units: 'SI',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (SI) Ch.1 Table 2, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatAirEnthalpy',
    inputs: { t_C: 50, p_Pa: 101325 },
    expected: { hs_J_per_kg: 275353 },
    tolerance: { hs_J_per_kg: { rel: 0.01 } },
    note: 'Real-gas table vs ideal-gas eqn 30; PsychroLib tolerances (3% at -5 C because h is near zero).',
  },
  {
    id: 'PL-SI-HS-85',
    kind: 'hs',
    units: 'SI',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (SI) Ch.1 Table 2, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatAirEnthalpy',
    inputs: { t_C: 85, p_Pa: 101325 },
    expected: { hs_J_per_kg: 2307539 },
    tolerance: { hs_J_per_kg: { rel: 0.01 } },
    note: 'Real-gas table vs ideal-gas eqn 30; PsychroLib tolerances (3% at -5 C because h is near zero).',
  },
  {
    id: 'PL-IP-WS--58',
    kind: 'ws',
    units: 'IP',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 Ch.1 Table 2 (values identical to SI, temperature converted), as cited in PsychroLib ' +
      'test suite (github psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatHumRatio',
    inputs: { t_F: -58, p_psia: 14.696 },
    expected: { Ws_lb_per_lb: 2.43e-5 },
    tolerance: { Ws_lb_per_lb: { rel: 0.01 } },
    note: 'Same physical states as PL-SI-WS-*.',
  },
  {
    id: 'PL-IP-WS--4',
    kind: 'ws',
    units: 'IP',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 Ch.1 Table 2 (values identical to SI, temperature converted), as cited in PsychroLib ' +
      'test suite (github psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatHumRatio',
    inputs: { t_F: -4, p_psia: 14.696 },
    expected: { Ws_lb_per_lb: 0.0006373 },
    tolerance: { Ws_lb_per_lb: { rel: 0.01 } },
    note: 'Same physical states as PL-SI-WS-*.',
  },
  {
    id: 'PL-IP-WS-23',
    kind: 'ws',
    units: 'IP',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 Ch.1 Table 2 (values identical to SI, temperature converted), as cited in PsychroLib ' +
      'test suite (github psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatHumRatio',
    inputs: { t_F: 23, p_psia: 14.696 },
    expected: { Ws_lb_per_lb: 0.0024863 },
    tolerance: { Ws_lb_per_lb: { rel: 0.005 } },
    note: 'Same physical states as PL-SI-WS-*.',
  },
  {
    id: 'PL-IP-WS-41',
    kind: 'ws',
    units: 'IP',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 Ch.1 Table 2 (values identical to SI, temperature converted), as cited in PsychroLib ' +
      'test suite (github psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatHumRatio',
    inputs: { t_F: 41, p_psia: 14.696 },
    expected: { Ws_lb_per_lb: 0.005425 },
    tolerance: { Ws_lb_per_lb: { rel: 0.005 } },
    note: 'Same physical states as PL-SI-WS-*.',
  },
  {
    id: 'PL-IP-WS-77',
    kind: 'ws',
    units: 'IP',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 Ch.1 Table 2 (values identical to SI, temperature converted), as cited in PsychroLib ' +
      'test suite (github psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatHumRatio',
    inputs: { t_F: 77, p_psia: 14.696 },
    expected: { Ws_lb_per_lb: 0.020173 },
    tolerance: { Ws_lb_per_lb: { rel: 0.005 } },
    note: 'Same physical states as PL-SI-WS-*.',
  },
  {
    id: 'PL-IP-WS-122',
    kind: 'ws',
    units: 'IP',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 Ch.1 Table 2 (values identical to SI, temperature converted), as cited in PsychroLib ' +
      'test suite (github psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatHumRatio',
    inputs: { t_F: 122, p_psia: 14.696 },
    expected: { Ws_lb_per_lb: 0.086863 },
    tolerance: { Ws_lb_per_lb: { rel: 0.01 } },
    note: 'Same physical states as PL-SI-WS-*.',
  },
  {
    id: 'PL-IP-WS-185',
    kind: 'ws',
    units: 'IP',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 Ch.1 Table 2 (values identical to SI, temperature converted), as cited in PsychroLib ' +
      'test suite (github psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatHumRatio',
    inputs: { t_F: 185, p_psia: 14.696 },
    expected: { Ws_lb_per_lb: 0.838105 },
    tolerance: { Ws_lb_per_lb: { rel: 0.02 } },
    note: 'Same physical states as PL-SI-WS-*.',
  },
  {
    id: 'PL-IP-HS--58',
    kind: 'hs',
    units: 'IP',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 Ch.1 Table 2 (I-P), as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatAirEnthalpy',
    inputs: { t_F: -58, p_psia: 14.696 },
    expected: { hs_Btu_per_lb: -13.906 },
    tolerance: { hs_Btu_per_lb: { rel: 0.01 } },
    note:
      'These equal SI values/2.326 + 7.68 Btu/lb (dry-air datum ' +
      'shift 0.240 x 32 F); e.g. -50222 J/kg -> -13.906 Btu/lb.',
  },
  {
    id: 'PL-IP-HS--4',
    kind: 'hs',
    units: 'IP',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 Ch.1 Table 2 (I-P), as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatAirEnthalpy',
    inputs: { t_F: -4, p_psia: 14.696 },
    expected: { hs_Btu_per_lb: -0.286 },
    tolerance: { hs_Btu_per_lb: { rel: 0.01 } },
    note:
      'These equal SI values/2.326 + 7.68 Btu/lb (dry-air datum ' +
      'shift 0.240 x 32 F); e.g. -50222 J/kg -> -13.906 Btu/lb.',
  },
  {
    id: 'PL-IP-HS-23',
    kind: 'hs',
    units: 'IP',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 Ch.1 Table 2 (I-P), as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatAirEnthalpy',
    inputs: { t_F: 23, p_psia: 14.696 },
    expected: { hs_Btu_per_lb: 8.186 },
    tolerance: { hs_Btu_per_lb: { rel: 0.03 } },
    note:
      'These equal SI values/2.326 + 7.68 Btu/lb (dry-air datum ' +
      'shift 0.240 x 32 F); e.g. -50222 J/kg -> -13.906 Btu/lb.',
  },
  {
    id: 'PL-IP-HS-41',
    kind: 'hs',
    units: 'IP',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 Ch.1 Table 2 (I-P), as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatAirEnthalpy',
    inputs: { t_F: 41, p_psia: 14.696 },
    expected: { hs_Btu_per_lb: 15.699 },
    tolerance: { hs_Btu_per_lb: { rel: 0.01 } },
    note:
      'These equal SI values/2.326 + 7.68 Btu/lb (dry-air datum ' +
      'shift 0.240 x 32 F); e.g. -50222 J/kg -> -13.906 Btu/lb.',
  },
  {
    id: 'PL-IP-HS-77',
    kind: 'hs',
    units: 'IP',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 Ch.1 Table 2 (I-P), as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatAirEnthalpy',
    inputs: { t_F: 77, p_psia: 14.696 },
    expected: { hs_Btu_per_lb: 40.576 },
    tolerance: { hs_Btu_per_lb: { rel: 0.01 } },
    note:
      'These equal SI values/2.326 + 7.68 Btu/lb (dry-air datum ' +
      'shift 0.240 x 32 F); e.g. -50222 J/kg -> -13.906 Btu/lb.',
  },
  {
    id: 'PL-IP-HS-122',
    kind: 'hs',
    units: 'IP',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 Ch.1 Table 2 (I-P), as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatAirEnthalpy',
    inputs: { t_F: 122, p_psia: 14.696 },
    expected: { hs_Btu_per_lb: 126.066 },
    tolerance: { hs_Btu_per_lb: { rel: 0.01 } },
    note:
      'These equal SI values/2.326 + 7.68 Btu/lb (dry-air datum ' +
      'shift 0.240 x 32 F); e.g. -50222 J/kg -> -13.906 Btu/lb.',
  },
  {
    id: 'PL-IP-HS-185',
    kind: 'hs',
    units: 'IP',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 Ch.1 Table 2 (I-P), as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetSatAirEnthalpy',
    inputs: { t_F: 185, p_psia: 14.696 },
    expected: { hs_Btu_per_lb: 999.749 },
    tolerance: { hs_Btu_per_lb: { rel: 0.01 } },
    note:
      'These equal SI values/2.326 + 7.68 Btu/lb (dry-air datum ' +
      'shift 0.240 x 32 F); e.g. -50222 J/kg -> -13.906 Btu/lb.',
  },
  {
    id: 'PL-SI-DRYAIR-25',
    kind: 'dryAir',
    units: 'SI',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (SI) Ch.1 Table 2, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_DryAir',
    inputs: { t_C: 25, p_Pa: 101325 },
    expected: { hda_J_per_kg: 25148, vda_m3_per_kg: 0.8443, rho_da_kg_per_m3: 1.184413123297406 },
    tolerance: { hda_J_per_kg: { rel: 0.0003 }, vda_m3_per_kg: { rel: 0.001 }, rho_da_kg_per_m3: { rel: 0.001 } },
    note: 'eqn: h_da = 1.006 t kJ/kg; v_da = R_da T/p with R_da = 287.042 J/(kg K).',
  },
  {
    id: 'PL-IP-DRYAIR-77',
    kind: 'dryAir',
    units: 'IP',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (I-P) Ch.1 Table 2, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_DryAir',
    inputs: { t_F: 77, p_psia: 14.696 },
    expected: { hda_Btu_per_lb: 18.498, vda_ft3_per_lb: 13.5251 },
    tolerance: { hda_Btu_per_lb: { rel: 0.001 }, vda_ft3_per_lb: { rel: 0.001 } },
    note: '0.240 x 77 = 18.48 vs table 18.498: the 0.240 Btu/lb.F constant is 0.1% off the table; keep rel 1e-3.',
  },
  {
    id: 'PL-SI-ATM--500',
    kind: 'stdAtm',
    units: 'SI',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (SI) Ch.1 Table 1 (eqns 3,4), as cited in PsychroLib test suite ' +
      '(github psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetStandardAtmPressure/Temperature',
    inputs: { Z_m: -500 },
    expected: { p_Pa: 107478, t_C: 18.2 },
    tolerance: { p_Pa: { abs: 1 }, t_C: { abs: 0.1 } },
    note:
      'eqn 3: p = 101.325 (1 - 2.25577e-5 Z)^5.2559 kPa; eqn 4: t = 15 - 0.0065 ' +
      'Z. Table temperatures are rounded to 0.1 C (eqn gives 18.25 at -500 m).',
  },
  {
    id: 'PL-SI-ATM-0',
    kind: 'stdAtm',
    units: 'SI',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (SI) Ch.1 Table 1 (eqns 3,4), as cited in PsychroLib test suite ' +
      '(github psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetStandardAtmPressure/Temperature',
    inputs: { Z_m: 0 },
    expected: { p_Pa: 101325, t_C: 15 },
    tolerance: { p_Pa: { abs: 1 }, t_C: { abs: 0.1 } },
    note:
      'eqn 3: p = 101.325 (1 - 2.25577e-5 Z)^5.2559 kPa; eqn 4: t = 15 - 0.0065 ' +
      'Z. Table temperatures are rounded to 0.1 C (eqn gives 18.25 at -500 m).',
  },
  {
    id: 'PL-SI-ATM-500',
    kind: 'stdAtm',
    units: 'SI',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (SI) Ch.1 Table 1 (eqns 3,4), as cited in PsychroLib test suite ' +
      '(github psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetStandardAtmPressure/Temperature',
    inputs: { Z_m: 500 },
    expected: { p_Pa: 95461, t_C: 11.8 },
    tolerance: { p_Pa: { abs: 1 }, t_C: { abs: 0.1 } },
    note:
      'eqn 3: p = 101.325 (1 - 2.25577e-5 Z)^5.2559 kPa; eqn 4: t = 15 - 0.0065 ' +
      'Z. Table temperatures are rounded to 0.1 C (eqn gives 18.25 at -500 m).',
  },
  {
    id: 'PL-SI-ATM-1000',
    kind: 'stdAtm',
    units: 'SI',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (SI) Ch.1 Table 1 (eqns 3,4), as cited in PsychroLib test suite ' +
      '(github psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetStandardAtmPressure/Temperature',
    inputs: { Z_m: 1000 },
    expected: { p_Pa: 89875, t_C: 8.5 },
    tolerance: { p_Pa: { abs: 1 }, t_C: { abs: 0.1 } },
    note:
      'eqn 3: p = 101.325 (1 - 2.25577e-5 Z)^5.2559 kPa; eqn 4: t = 15 - 0.0065 ' +
      'Z. Table temperatures are rounded to 0.1 C (eqn gives 18.25 at -500 m).',
  },
  {
    id: 'PL-SI-ATM-4000',
    kind: 'stdAtm',
    units: 'SI',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (SI) Ch.1 Table 1 (eqns 3,4), as cited in PsychroLib test suite ' +
      '(github psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetStandardAtmPressure/Temperature',
    inputs: { Z_m: 4000 },
    expected: { p_Pa: 61640, t_C: -11 },
    tolerance: { p_Pa: { abs: 1 }, t_C: { abs: 0.1 } },
    note:
      'eqn 3: p = 101.325 (1 - 2.25577e-5 Z)^5.2559 kPa; eqn 4: t = 15 - 0.0065 ' +
      'Z. Table temperatures are rounded to 0.1 C (eqn gives 18.25 at -500 m).',
  },
  {
    id: 'PL-SI-ATM-10000',
    kind: 'stdAtm',
    units: 'SI',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (SI) Ch.1 Table 1 (eqns 3,4), as cited in PsychroLib test suite ' +
      '(github psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetStandardAtmPressure/Temperature',
    inputs: { Z_m: 10000 },
    expected: { p_Pa: 26436, t_C: -50 },
    tolerance: { p_Pa: { abs: 1 }, t_C: { abs: 0.1 } },
    note:
      'eqn 3: p = 101.325 (1 - 2.25577e-5 Z)^5.2559 kPa; eqn 4: t = 15 - 0.0065 ' +
      'Z. Table temperatures are rounded to 0.1 C (eqn gives 18.25 at -500 m).',
  },
  {
    id: 'PL-IP-ATM--1000',
    kind: 'stdAtm',
    units: 'IP',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (I-P) Ch.1 Table 1 (eqns 3,4), as cited in PsychroLib test suite ' +
      '(github psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetStandardAtmPressure/Temperature',
    inputs: { Z_ft: -1000 },
    expected: { p_psia: 15.236, t_F: 62.6 },
    tolerance: { p_psia: { rel: 0.002 }, t_F: { abs: 0.1 } },
    note:
      'PsychroLib tests use abs tolerance 1 psi here (i.e. untested). The I-P eqn 3 ' +
      '(14.696(1-6.8754e-6 Z)^5.2559) differs from the I-P Table 1 by up to 0.15% (30 000 ft: ' +
      '4.3643 vs 4.371), so rel 2e-3 is proposed. Test the formula itself tightly as well.',
  },
  {
    id: 'PL-IP-ATM-0',
    kind: 'stdAtm',
    units: 'IP',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (I-P) Ch.1 Table 1 (eqns 3,4), as cited in PsychroLib test suite ' +
      '(github psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetStandardAtmPressure/Temperature',
    inputs: { Z_ft: 0 },
    expected: { p_psia: 14.696, t_F: 59 },
    tolerance: { p_psia: { rel: 0.002 }, t_F: { abs: 0.1 } },
    note:
      'PsychroLib tests use abs tolerance 1 psi here (i.e. untested). The I-P eqn 3 ' +
      '(14.696(1-6.8754e-6 Z)^5.2559) differs from the I-P Table 1 by up to 0.15% (30 000 ft: ' +
      '4.3643 vs 4.371), so rel 2e-3 is proposed. Test the formula itself tightly as well.',
  },
  {
    id: 'PL-IP-ATM-1000',
    kind: 'stdAtm',
    units: 'IP',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (I-P) Ch.1 Table 1 (eqns 3,4), as cited in PsychroLib test suite ' +
      '(github psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetStandardAtmPressure/Temperature',
    inputs: { Z_ft: 1000 },
    expected: { p_psia: 14.175, t_F: 55.4 },
    tolerance: { p_psia: { rel: 0.002 }, t_F: { abs: 0.1 } },
    note:
      'PsychroLib tests use abs tolerance 1 psi here (i.e. untested). The I-P eqn 3 ' +
      '(14.696(1-6.8754e-6 Z)^5.2559) differs from the I-P Table 1 by up to 0.15% (30 000 ft: ' +
      '4.3643 vs 4.371), so rel 2e-3 is proposed. Test the formula itself tightly as well.',
  },
  {
    id: 'PL-IP-ATM-3000',
    kind: 'stdAtm',
    units: 'IP',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (I-P) Ch.1 Table 1 (eqns 3,4), as cited in PsychroLib test suite ' +
      '(github psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetStandardAtmPressure/Temperature',
    inputs: { Z_ft: 3000 },
    expected: { p_psia: 13.173, t_F: 48.3 },
    tolerance: { p_psia: { rel: 0.002 }, t_F: { abs: 0.1 } },
    note:
      'PsychroLib tests use abs tolerance 1 psi here (i.e. untested). The I-P eqn 3 ' +
      '(14.696(1-6.8754e-6 Z)^5.2559) differs from the I-P Table 1 by up to 0.15% (30 000 ft: ' +
      '4.3643 vs 4.371), so rel 2e-3 is proposed. Test the formula itself tightly as well.',
  },
  {
    id: 'PL-IP-ATM-10000',
    kind: 'stdAtm',
    units: 'IP',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (I-P) Ch.1 Table 1 (eqns 3,4), as cited in PsychroLib test suite ' +
      '(github psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetStandardAtmPressure/Temperature',
    inputs: { Z_ft: 10000 },
    expected: { p_psia: 10.108, t_F: 23.4 },
    tolerance: { p_psia: { rel: 0.002 }, t_F: { abs: 0.1 } },
    note:
      'PsychroLib tests use abs tolerance 1 psi here (i.e. untested). The I-P eqn 3 ' +
      '(14.696(1-6.8754e-6 Z)^5.2559) differs from the I-P Table 1 by up to 0.15% (30 000 ft: ' +
      '4.3643 vs 4.371), so rel 2e-3 is proposed. Test the formula itself tightly as well.',
  },
  {
    id: 'PL-IP-ATM-30000',
    kind: 'stdAtm',
    units: 'IP',
    provenance: 'published-table-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (I-P) Ch.1 Table 1 (eqns 3,4), as cited in PsychroLib test suite ' +
      '(github psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_GetStandardAtmPressure/Temperature',
    inputs: { Z_ft: 30000 },
    expected: { p_psia: 4.371, t_F: -47.8 },
    tolerance: { p_psia: { rel: 0.002 }, t_F: { abs: 0.2 } },
    note:
      'PsychroLib tests use abs tolerance 1 psi here (i.e. untested). The I-P eqn 3 ' +
      '(14.696(1-6.8754e-6 Z)^5.2559) differs from the I-P Table 1 by up to 0.15% (30 000 ft: ' +
      '4.3643 vs 4.371), so rel 2e-3 is proposed. Test the formula itself tightly as well.',
  },
  {
    id: 'PL-SI-XLS-W-VP',
    kind: 'wFromPw',
    units: 'SI',
    provenance: 'psychrolib-tests-excel',
    source:
      'PsychroLib test suite (github psychrometrics/psychrolib @3066345dc8cf, ' +
      'tests/test_psychrolib_{si,ip}.py, tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) ' +
      "(values 'calculated with Excel' by the PsychroLib authors from the 2017 equations)",
    inputs: { pw_Pa: 3169.7, p_Pa: 95461 },
    expected: { W_kg_per_kg: 0.0213603998047487 },
    tolerance: { W_kg_per_kg: { rel: 1e-6 } },
    note: 'eqn 20 (0.621945 pw/(p-pw)); 95461 Pa = std atm at 500 m',
  },
  {
    id: 'PL-SI-XLS-W-WB-ABOVE',
    kind: 'wFromWb',
    units: 'SI',
    provenance: 'psychrolib-tests-excel',
    source:
      'PsychroLib test suite (github psychrometrics/psychrolib @3066345dc8cf, ' +
      'tests/test_psychrolib_{si,ip}.py, tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) ' +
      "(values 'calculated with Excel' by the PsychroLib authors from the 2017 equations)",
    inputs: { tdb_C: 30, twb_C: 25, p_Pa: 95461 },
    expected: { W_kg_per_kg: 0.0192281274241096 },
    tolerance: { W_kg_per_kg: { rel: 0.0003 } },
    note: 'eqn 33 (wet bulb above freezing)',
  },
  {
    id: 'PL-SI-XLS-W-WB-BELOW',
    kind: 'wFromWb',
    units: 'SI',
    provenance: 'psychrolib-tests-excel',
    source:
      'PsychroLib test suite (github psychrometrics/psychrolib @3066345dc8cf, ' +
      'tests/test_psychrolib_{si,ip}.py, tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) ' +
      "(values 'calculated with Excel' by the PsychroLib authors from the 2017 equations)",
    inputs: { tdb_C: -1, twb_C: -5, p_Pa: 95461 },
    expected: { W_kg_per_kg: 0.00120399819933844 },
    tolerance: { W_kg_per_kg: { rel: 0.0003 } },
    note: 'eqn 35 (wet bulb below freezing, ice)',
  },
  {
    id: 'PL-SI-XLS-H',
    kind: 'enthalpy',
    units: 'SI',
    provenance: 'psychrolib-tests-excel',
    source:
      'PsychroLib test suite (github psychrometrics/psychrolib @3066345dc8cf, ' +
      'tests/test_psychrolib_{si,ip}.py, tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) ' +
      "(values 'calculated with Excel' by the PsychroLib authors from the 2017 equations)",
    inputs: { tdb_C: 30, W_kg_per_kg: 0.02 },
    expected: { h_J_per_kg: 81316 },
    tolerance: { h_J_per_kg: { rel: 0.0003 } },
    note: 'eqn 30',
  },
  {
    id: 'PL-SI-XLS-V',
    kind: 'volume',
    units: 'SI',
    provenance: 'psychrolib-tests-excel',
    source:
      'PsychroLib test suite (github psychrometrics/psychrolib @3066345dc8cf, ' +
      'tests/test_psychrolib_{si,ip}.py, tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) ' +
      "(values 'calculated with Excel' by the PsychroLib authors from the 2017 equations)",
    inputs: { tdb_C: 30, W_kg_per_kg: 0.02, p_Pa: 95461 },
    expected: { v_m3_per_kg: 0.940855374352943 },
    tolerance: { v_m3_per_kg: { rel: 0.0003 } },
    note: 'eqn 26',
  },
  {
    id: 'PL-SI-XLS-RHO',
    kind: 'density',
    units: 'SI',
    provenance: 'psychrolib-tests-excel',
    source:
      'PsychroLib test suite (github psychrometrics/psychrolib @3066345dc8cf, ' +
      'tests/test_psychrolib_{si,ip}.py, tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) ' +
      "(values 'calculated with Excel' by the PsychroLib authors from the 2017 equations)",
    inputs: { tdb_C: 30, W_kg_per_kg: 0.02, p_Pa: 95461 },
    expected: { rho_kg_per_m3: 1.08411986348219 },
    tolerance: { rho_kg_per_m3: { rel: 0.0003 } },
    note: 'eqn 11: (1+W)/v',
  },
  {
    id: 'PL-SI-WB-RH',
    kind: 'wbFromRh',
    units: 'SI',
    provenance: 'psychrolib-tests-excel',
    source:
      'PsychroLib test suite (github psychrometrics/psychrolib @3066345dc8cf, ' +
      'tests/test_psychrolib_{si,ip}.py, tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) ' +
      "(values 'calculated with Excel' by the PsychroLib authors from the 2017 equations)",
    inputs: { tdb_C: 7, RH: 0.61, p_Pa: 100000 },
    expected: { twb_C: 3.92667433781955 },
    tolerance: { twb_C: { rel: 0.001 } },
    note: 'regression test for an old dew-point convergence bug',
  },
  {
    id: 'PL-IP-XLS-W-VP',
    kind: 'wFromPw',
    units: 'IP',
    provenance: 'psychrolib-tests-excel',
    source:
      'PsychroLib test suite (github psychrometrics/psychrolib @3066345dc8cf, ' +
      'tests/test_psychrolib_{si,ip}.py, tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) ' +
      "(values 'calculated with Excel' by the PsychroLib authors)",
    inputs: { pw_psia: 0.45973, p_psia: 14.175 },
    expected: { W_lb_per_lb: 0.0208473311024865 },
    tolerance: { W_lb_per_lb: { rel: 1e-6 } },
    note: '14.175 psia = std atm at 1000 ft',
  },
  {
    id: 'PL-IP-XLS-W-WB-ABOVE',
    kind: 'wFromWb',
    units: 'IP',
    provenance: 'psychrolib-tests-excel',
    source:
      'PsychroLib test suite (github psychrometrics/psychrolib @3066345dc8cf, ' +
      'tests/test_psychrolib_{si,ip}.py, tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) ' +
      "(values 'calculated with Excel' by the PsychroLib authors)",
    inputs: { tdb_F: 86, twb_F: 77, p_psia: 14.175 },
    expected: { W_lb_per_lb: 0.0187193288418892 },
    tolerance: { W_lb_per_lb: { rel: 0.0003 } },
    note: 'I-P eqn 33',
  },
  {
    id: 'PL-IP-XLS-W-WB-BELOW',
    kind: 'wFromWb',
    units: 'IP',
    provenance: 'psychrolib-tests-excel',
    source:
      'PsychroLib test suite (github psychrometrics/psychrolib @3066345dc8cf, ' +
      'tests/test_psychrolib_{si,ip}.py, tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) ' +
      "(values 'calculated with Excel' by the PsychroLib authors)",
    inputs: { tdb_F: 30.2, twb_F: 23, p_psia: 14.175 },
    expected: { W_lb_per_lb: 0.00114657481090184 },
    tolerance: { W_lb_per_lb: { rel: 0.0003 } },
    note: 'I-P eqn 35 (ice)',
  },
  {
    id: 'PL-IP-XLS-H',
    kind: 'enthalpy',
    units: 'IP',
    provenance: 'psychrolib-tests-excel',
    source:
      'PsychroLib test suite (github psychrometrics/psychrolib @3066345dc8cf, ' +
      'tests/test_psychrolib_{si,ip}.py, tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) ' +
      "(values 'calculated with Excel' by the PsychroLib authors)",
    inputs: { tdb_F: 86, W_lb_per_lb: 0.02 },
    expected: { h_Btu_per_lb: 42.6168 },
    tolerance: { h_Btu_per_lb: { rel: 0.0003 } },
    note: 'I-P eqn 32: 0.240t + W(1061 + 0.444t)',
  },
  {
    id: 'PL-IP-XLS-V',
    kind: 'volume',
    units: 'IP',
    provenance: 'psychrolib-tests-excel',
    source:
      'PsychroLib test suite (github psychrometrics/psychrolib @3066345dc8cf, ' +
      'tests/test_psychrolib_{si,ip}.py, tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) ' +
      "(values 'calculated with Excel' by the PsychroLib authors)",
    inputs: { tdb_F: 86, W_lb_per_lb: 0.02, p_psia: 14.175 },
    expected: { v_ft3_per_lb: 14.7205749002918 },
    tolerance: { v_ft3_per_lb: { rel: 0.0003 } },
    note: 'I-P eqn 28: 0.370486 T(1+1.607858W)/p',
  },
  {
    id: 'PL-IP-XLS-RHO',
    kind: 'density',
    units: 'IP',
    provenance: 'psychrolib-tests-excel',
    source:
      'PsychroLib test suite (github psychrometrics/psychrolib @3066345dc8cf, ' +
      'tests/test_psychrolib_{si,ip}.py, tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) ' +
      "(values 'calculated with Excel' by the PsychroLib authors)",
    inputs: { tdb_F: 86, W_lb_per_lb: 0.02, p_psia: 14.175 },
    expected: { rho_lb_per_ft3: 0.0692907720594378 },
    tolerance: { rho_lb_per_ft3: { rel: 0.0003 } },
    note: '',
  },
  {
    id: 'PL-SI-EX1',
    kind: 'example1',
    units: 'SI',
    provenance: 'handbook-example-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (SI) Ch.1 Example 1 ("values provided in the ' +
      'text of the Handbook"), as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_AllPsychrometrics',
    inputs: { tdb_C: 40, twb_C: 20, p_Pa: 101325 },
    expected: { W_kg_per_kg: 0.0065, tdp_C: 7, RH: 0.14, h_J_per_kg: 56700, v_m3_per_kg: 0.896 },
    tolerance: {
      W_kg_per_kg: { abs: 0.0001 },
      tdp_C: { abs: 0.5 },
      RH: { abs: 0.01 },
      h_J_per_kg: { abs: 100 },
      v_m3_per_kg: { rel: 0.01 },
    },
    note:
      'Handbook rounds; tolerances are PsychroLib\'s (dew point "not great agreement"). Reverse checks ' +
      'in PsychroLib: wet bulb recomputed from (40, tdp) and from (40, RH) must be 20 +/- 0.1 C.',
  },
  {
    id: 'PL-IP-EX1',
    kind: 'example1',
    units: 'IP',
    provenance: 'handbook-example-via-psychrolib-tests',
    source:
      'ASHRAE HoF 2017 (I-P) Ch.1 Example 1, as cited in PsychroLib test suite (github ' +
      'psychrometrics/psychrolib @3066345dc8cf, tests/test_psychrolib_{si,ip}.py, ' +
      'tests/js/*.js, tests/c_sharp/PsychroLibUnitTests.cs) test_AllPsychrometrics',
    inputs: { tdb_F: 100, twb_F: 65, p_psia: 14.696 },
    expected: { W_lb_per_lb: 0.00523, tdp_F: 40, RH: 0.13, h_Btu_per_lb: 29.8, v_ft3_per_lb: 14.22 },
    tolerance: {
      W_lb_per_lb: { abs: 0.0001 },
      tdp_F: { abs: 1 },
      RH: { abs: 0.01 },
      h_Btu_per_lb: { abs: 0.1 },
      v_ft3_per_lb: { abs: 0.01 },
    },
    note:
      'DISAGREEMENT: the 2017 I-P equations give W = 0.0051895 and h = 29.736, i.e. ' +
      '0.8% / 0.064 Btu/lb below the quoted 0.00523 / 29.80. Python/JS tests allow W ' +
      '+/-0.001, C# +/-0.0001. W tolerance 1e-4 and h 0.1 are the tightest that the ' +
      'equations pass. Reverse: wet bulb from (100, tdp) and (100, RH) = 65 +/- 0.1 F.',
  },
  {
    id: 'MEM-SI-PWS--40',
    kind: 'pws',
    units: 'SI',
    provenance: 'from-memory',
    source:
      'FROM MEMORY: ASHRAE HoF Ch.1 Table 3 (SI) / IAPWS-95 & IAPWS-2011 ' +
      'sublimation values; not checked against a printed table in this session',
    inputs: { t_C: -40 },
    expected: { pws_Pa: 12.84 },
    tolerance: { pws_Pa: { rel: 0.0005 } },
    note:
      'Recalled to ~4-5 significant figures; 500 ppm tolerance = ASHRAE 300 ppm claim + recall ' +
      'uncertainty. Hyland-Wexler runs 100-220 ppm LOW vs IAPWS-95 between 20 and 50 C.',
  },
  {
    id: 'MEM-SI-PWS--20',
    kind: 'pws',
    units: 'SI',
    provenance: 'from-memory',
    source:
      'FROM MEMORY: ASHRAE HoF Ch.1 Table 3 (SI) / IAPWS-95 & IAPWS-2011 ' +
      'sublimation values; not checked against a printed table in this session',
    inputs: { t_C: -20 },
    expected: { pws_Pa: 103.26 },
    tolerance: { pws_Pa: { rel: 0.0005 } },
    note:
      'Recalled to ~4-5 significant figures; 500 ppm tolerance = ASHRAE 300 ppm claim + recall ' +
      'uncertainty. Hyland-Wexler runs 100-220 ppm LOW vs IAPWS-95 between 20 and 50 C. PsychroLib ' +
      'quotes 103.24 Pa for 2017 Table 3; recalled 103.26 may be the 2009 (H-W based) table.',
  },
  {
    id: 'MEM-SI-PWS-0',
    kind: 'pws',
    units: 'SI',
    provenance: 'from-memory',
    source:
      'FROM MEMORY: ASHRAE HoF Ch.1 Table 3 (SI) / IAPWS-95 & IAPWS-2011 ' +
      'sublimation values; not checked against a printed table in this session',
    inputs: { t_C: 0 },
    expected: { pws_Pa: 611.15 },
    tolerance: { pws_Pa: { rel: 0.0005 } },
    note:
      'Recalled to ~4-5 significant figures; 500 ppm tolerance = ASHRAE 300 ppm claim + recall ' +
      'uncertainty. Hyland-Wexler runs 100-220 ppm LOW vs IAPWS-95 between 20 and 50 C.',
  },
  {
    id: 'MEM-SI-PWS-0.01',
    kind: 'pws',
    units: 'SI',
    provenance: 'from-memory',
    source:
      'FROM MEMORY: ASHRAE HoF Ch.1 Table 3 (SI) / IAPWS-95 & IAPWS-2011 ' +
      'sublimation values; not checked against a printed table in this session',
    inputs: { t_C: 0.01 },
    expected: { pws_Pa: 611.657 },
    tolerance: { pws_Pa: { rel: 0.0005 } },
    note:
      'Recalled to ~4-5 significant figures; 500 ppm tolerance = ASHRAE 300 ppm claim + recall ' +
      'uncertainty. Hyland-Wexler runs 100-220 ppm LOW vs IAPWS-95 between 20 and 50 C.',
  },
  {
    id: 'MEM-SI-PWS-20',
    kind: 'pws',
    units: 'SI',
    provenance: 'from-memory',
    source:
      'FROM MEMORY: ASHRAE HoF Ch.1 Table 3 (SI) / IAPWS-95 & IAPWS-2011 ' +
      'sublimation values; not checked against a printed table in this session',
    inputs: { t_C: 20 },
    expected: { pws_Pa: 2339.2 },
    tolerance: { pws_Pa: { rel: 0.0005 } },
    note:
      'Recalled to ~4-5 significant figures; 500 ppm tolerance = ASHRAE 300 ppm claim + recall ' +
      'uncertainty. Hyland-Wexler runs 100-220 ppm LOW vs IAPWS-95 between 20 and 50 C.',
  },
  {
    id: 'MEM-SI-PWS-25',
    kind: 'pws',
    units: 'SI',
    provenance: 'from-memory',
    source:
      'FROM MEMORY: ASHRAE HoF Ch.1 Table 3 (SI) / IAPWS-95 & IAPWS-2011 ' +
      'sublimation values; not checked against a printed table in this session',
    inputs: { t_C: 25 },
    expected: { pws_Pa: 3169.9 },
    tolerance: { pws_Pa: { rel: 0.0005 } },
    note:
      'Recalled to ~4-5 significant figures; 500 ppm tolerance = ASHRAE 300 ppm claim + recall ' +
      'uncertainty. Hyland-Wexler runs 100-220 ppm LOW vs IAPWS-95 between 20 and 50 C.',
  },
  {
    id: 'MEM-SI-PWS-30',
    kind: 'pws',
    units: 'SI',
    provenance: 'from-memory',
    source:
      'FROM MEMORY: ASHRAE HoF Ch.1 Table 3 (SI) / IAPWS-95 & IAPWS-2011 ' +
      'sublimation values; not checked against a printed table in this session',
    inputs: { t_C: 30 },
    expected: { pws_Pa: 4246.9 },
    tolerance: { pws_Pa: { rel: 0.0005 } },
    note:
      'Recalled to ~4-5 significant figures; 500 ppm tolerance = ASHRAE 300 ppm claim + recall ' +
      'uncertainty. Hyland-Wexler runs 100-220 ppm LOW vs IAPWS-95 between 20 and 50 C.',
  },
  {
    id: 'MEM-SI-PWS-40',
    kind: 'pws',
    units: 'SI',
    provenance: 'from-memory',
    source:
      'FROM MEMORY: ASHRAE HoF Ch.1 Table 3 (SI) / IAPWS-95 & IAPWS-2011 ' +
      'sublimation values; not checked against a printed table in this session',
    inputs: { t_C: 40 },
    expected: { pws_Pa: 7384.9 },
    tolerance: { pws_Pa: { rel: 0.0005 } },
    note:
      'Recalled to ~4-5 significant figures; 500 ppm tolerance = ASHRAE 300 ppm claim + recall ' +
      'uncertainty. Hyland-Wexler runs 100-220 ppm LOW vs IAPWS-95 between 20 and 50 C.',
  },
  {
    id: 'MEM-SI-PWS-50',
    kind: 'pws',
    units: 'SI',
    provenance: 'from-memory',
    source:
      'FROM MEMORY: ASHRAE HoF Ch.1 Table 3 (SI) / IAPWS-95 & IAPWS-2011 ' +
      'sublimation values; not checked against a printed table in this session',
    inputs: { t_C: 50 },
    expected: { pws_Pa: 12351 },
    tolerance: { pws_Pa: { rel: 0.0005 } },
    note:
      'Recalled to ~4-5 significant figures; 500 ppm tolerance = ASHRAE 300 ppm claim + recall ' +
      'uncertainty. Hyland-Wexler runs 100-220 ppm LOW vs IAPWS-95 between 20 and 50 C.',
  },
  {
    id: 'MEM-SI-PWS-60',
    kind: 'pws',
    units: 'SI',
    provenance: 'from-memory',
    source:
      'FROM MEMORY: ASHRAE HoF Ch.1 Table 3 (SI) / IAPWS-95 & IAPWS-2011 ' +
      'sublimation values; not checked against a printed table in this session',
    inputs: { t_C: 60 },
    expected: { pws_Pa: 19946 },
    tolerance: { pws_Pa: { rel: 0.0005 } },
    note:
      'Recalled to ~4-5 significant figures; 500 ppm tolerance = ASHRAE 300 ppm claim + recall ' +
      'uncertainty. Hyland-Wexler runs 100-220 ppm LOW vs IAPWS-95 between 20 and 50 C.',
  },
  {
    id: 'MEM-SI-PWS-80',
    kind: 'pws',
    units: 'SI',
    provenance: 'from-memory',
    source:
      'FROM MEMORY: ASHRAE HoF Ch.1 Table 3 (SI) / IAPWS-95 & IAPWS-2011 ' +
      'sublimation values; not checked against a printed table in this session',
    inputs: { t_C: 80 },
    expected: { pws_Pa: 47414 },
    tolerance: { pws_Pa: { rel: 0.0005 } },
    note:
      'Recalled to ~4-5 significant figures; 500 ppm tolerance = ASHRAE 300 ppm claim + recall ' +
      'uncertainty. Hyland-Wexler runs 100-220 ppm LOW vs IAPWS-95 between 20 and 50 C.',
  },
  {
    id: 'MEM-SI-PWS-100',
    kind: 'pws',
    units: 'SI',
    provenance: 'from-memory',
    source:
      'FROM MEMORY: ASHRAE HoF Ch.1 Table 3 (SI) / IAPWS-95 & IAPWS-2011 ' +
      'sublimation values; not checked against a printed table in this session',
    inputs: { t_C: 100 },
    expected: { pws_Pa: 101418 },
    tolerance: { pws_Pa: { rel: 0.0005 } },
    note:
      'Recalled to ~4-5 significant figures; 500 ppm tolerance = ASHRAE 300 ppm claim + recall ' +
      'uncertainty. Hyland-Wexler runs 100-220 ppm LOW vs IAPWS-95 between 20 and 50 C.',
  },
  {
    id: 'MEM-IP-PWS-32',
    kind: 'pws',
    units: 'IP',
    provenance: 'from-memory',
    source: 'FROM MEMORY: ASHRAE HoF Ch.1 Table 3 (I-P) / IAPWS-95 converted',
    inputs: { t_F: 32 },
    expected: { pws_psia: 0.08865 },
    tolerance: { pws_psia: { rel: 0.0005 } },
    note: '32 F uses the ice branch in PsychroLib (switch at 32.018 F).',
  },
  {
    id: 'MEM-IP-PWS-50',
    kind: 'pws',
    units: 'IP',
    provenance: 'from-memory',
    source: 'FROM MEMORY: ASHRAE HoF Ch.1 Table 3 (I-P) / IAPWS-95 converted',
    inputs: { t_F: 50 },
    expected: { pws_psia: 0.17813 },
    tolerance: { pws_psia: { rel: 0.0005 } },
    note: '',
  },
  {
    id: 'MEM-IP-PWS-70',
    kind: 'pws',
    units: 'IP',
    provenance: 'from-memory',
    source: 'FROM MEMORY: ASHRAE HoF Ch.1 Table 3 (I-P) / IAPWS-95 converted',
    inputs: { t_F: 70 },
    expected: { pws_psia: 0.36334 },
    tolerance: { pws_psia: { rel: 0.0005 } },
    note: '',
  },
  {
    id: 'MEM-IP-PWS-100',
    kind: 'pws',
    units: 'IP',
    provenance: 'from-memory',
    source: 'FROM MEMORY: ASHRAE HoF Ch.1 Table 3 (I-P) / IAPWS-95 converted',
    inputs: { t_F: 100 },
    expected: { pws_psia: 0.95052 },
    tolerance: { pws_psia: { rel: 0.0005 } },
    note: '',
  },
  {
    id: 'MEM-SI-ATM-1500',
    kind: 'stdAtm',
    units: 'SI',
    provenance: 'from-memory',
    source: 'FROM MEMORY: ASHRAE HoF Ch.1 Table 1 (SI)',
    inputs: { Z_m: 1500 },
    expected: { p_Pa: 84556, t_C: 5.2 },
    tolerance: { p_Pa: { abs: 2 }, t_C: { abs: 0.1 } },
    note: 'Table temperatures rounded to 0.1 C; 1500 m and 2500 m fall on .x5 (eqn: 5.25, -1.25).',
  },
  {
    id: 'MEM-SI-ATM-2000',
    kind: 'stdAtm',
    units: 'SI',
    provenance: 'from-memory',
    source: 'FROM MEMORY: ASHRAE HoF Ch.1 Table 1 (SI)',
    inputs: { Z_m: 2000 },
    expected: { p_Pa: 79495, t_C: 2 },
    tolerance: { p_Pa: { abs: 2 }, t_C: { abs: 0.1 } },
    note: 'Table temperatures rounded to 0.1 C; 1500 m and 2500 m fall on .x5 (eqn: 5.25, -1.25).',
  },
  {
    id: 'MEM-SI-ATM-2500',
    kind: 'stdAtm',
    units: 'SI',
    provenance: 'from-memory',
    source: 'FROM MEMORY: ASHRAE HoF Ch.1 Table 1 (SI)',
    inputs: { Z_m: 2500 },
    expected: { p_Pa: 74682, t_C: -1.2 },
    tolerance: { p_Pa: { abs: 2 }, t_C: { abs: 0.1 } },
    note: 'Table temperatures rounded to 0.1 C; 1500 m and 2500 m fall on .x5 (eqn: 5.25, -1.25).',
  },
  {
    id: 'MEM-SI-ATM-3000',
    kind: 'stdAtm',
    units: 'SI',
    provenance: 'from-memory',
    source: 'FROM MEMORY: ASHRAE HoF Ch.1 Table 1 (SI)',
    inputs: { Z_m: 3000 },
    expected: { p_Pa: 70108, t_C: -4.5 },
    tolerance: { p_Pa: { abs: 2 }, t_C: { abs: 0.1 } },
    note: 'Table temperatures rounded to 0.1 C; 1500 m and 2500 m fall on .x5 (eqn: 5.25, -1.25).',
  },
  {
    id: 'MEM-SI-ATM-5000',
    kind: 'stdAtm',
    units: 'SI',
    provenance: 'from-memory',
    source: 'FROM MEMORY: ASHRAE HoF Ch.1 Table 1 (SI)',
    inputs: { Z_m: 5000 },
    expected: { p_Pa: 54020, t_C: -17.5 },
    tolerance: { p_Pa: { abs: 2 }, t_C: { abs: 0.1 } },
    note: 'Table temperatures rounded to 0.1 C; 1500 m and 2500 m fall on .x5 (eqn: 5.25, -1.25).',
  },
  {
    id: 'MEM-SI-ATM-6000',
    kind: 'stdAtm',
    units: 'SI',
    provenance: 'from-memory',
    source: 'FROM MEMORY: ASHRAE HoF Ch.1 Table 1 (SI)',
    inputs: { Z_m: 6000 },
    expected: { p_Pa: 47181, t_C: -24 },
    tolerance: { p_Pa: { abs: 2 }, t_C: { abs: 0.1 } },
    note: 'Table temperatures rounded to 0.1 C; 1500 m and 2500 m fall on .x5 (eqn: 5.25, -1.25).',
  },
  {
    id: 'MEM-SI-ATM-8000',
    kind: 'stdAtm',
    units: 'SI',
    provenance: 'from-memory',
    source: 'FROM MEMORY: ASHRAE HoF Ch.1 Table 1 (SI)',
    inputs: { Z_m: 8000 },
    expected: { p_Pa: 35600, t_C: -37 },
    tolerance: { p_Pa: { abs: 2 }, t_C: { abs: 0.1 } },
    note: 'Table temperatures rounded to 0.1 C; 1500 m and 2500 m fall on .x5 (eqn: 5.25, -1.25).',
  },
  {
    id: 'MEM-IP-ATM-2000',
    kind: 'stdAtm',
    units: 'IP',
    provenance: 'from-memory',
    source:
      'FROM MEMORY: ASHRAE HoF Ch.1 Table 1 (I-P); same numbers reproduced at ' +
      'engineersedge.com "Standard Atmospheric Data" (which shows 12.230 at 5000 ft)',
    inputs: { Z_ft: 2000 },
    expected: { p_psia: 13.664, t_F: 51.9 },
    tolerance: { p_psia: { rel: 0.002 }, t_F: { abs: 0.1 } },
    note: '',
  },
  {
    id: 'MEM-IP-ATM-4000',
    kind: 'stdAtm',
    units: 'IP',
    provenance: 'from-memory',
    source:
      'FROM MEMORY: ASHRAE HoF Ch.1 Table 1 (I-P); same numbers reproduced at ' +
      'engineersedge.com "Standard Atmospheric Data" (which shows 12.230 at 5000 ft)',
    inputs: { Z_ft: 4000 },
    expected: { p_psia: 12.682, t_F: 44.7 },
    tolerance: { p_psia: { rel: 0.002 }, t_F: { abs: 0.1 } },
    note: 'DISAGREEMENT: table 12.682 vs I-P eqn 3 12.692 (and SI eqn converted 12.692): 0.08%, likely a table typo.',
  },
  {
    id: 'MEM-IP-ATM-5000',
    kind: 'stdAtm',
    units: 'IP',
    provenance: 'from-memory',
    source:
      'FROM MEMORY: ASHRAE HoF Ch.1 Table 1 (I-P); same numbers reproduced at ' +
      'engineersedge.com "Standard Atmospheric Data" (which shows 12.230 at 5000 ft)',
    inputs: { Z_ft: 5000 },
    expected: { p_psia: 12.228, t_F: 41.2 },
    tolerance: { p_psia: { rel: 0.002 }, t_F: { abs: 0.1 } },
    note: '',
  },
  {
    id: 'MEM-IP-ATM-6000',
    kind: 'stdAtm',
    units: 'IP',
    provenance: 'from-memory',
    source:
      'FROM MEMORY: ASHRAE HoF Ch.1 Table 1 (I-P); same numbers reproduced at ' +
      'engineersedge.com "Standard Atmospheric Data" (which shows 12.230 at 5000 ft)',
    inputs: { Z_ft: 6000 },
    expected: { p_psia: 11.778, t_F: 37.6 },
    tolerance: { p_psia: { rel: 0.002 }, t_F: { abs: 0.1 } },
    note: '',
  },
  {
    id: 'MEM-IP-ATM-8000',
    kind: 'stdAtm',
    units: 'IP',
    provenance: 'from-memory',
    source:
      'FROM MEMORY: ASHRAE HoF Ch.1 Table 1 (I-P); same numbers reproduced at ' +
      'engineersedge.com "Standard Atmospheric Data" (which shows 12.230 at 5000 ft)',
    inputs: { Z_ft: 8000 },
    expected: { p_psia: 10.914, t_F: 30.5 },
    tolerance: { p_psia: { rel: 0.002 }, t_F: { abs: 0.1 } },
    note: '',
  },
  {
    id: 'MEM-IP-ATM-15000',
    kind: 'stdAtm',
    units: 'IP',
    provenance: 'from-memory',
    source:
      'FROM MEMORY: ASHRAE HoF Ch.1 Table 1 (I-P); same numbers reproduced at ' +
      'engineersedge.com "Standard Atmospheric Data" (which shows 12.230 at 5000 ft)',
    inputs: { Z_ft: 15000 },
    expected: { p_psia: 8.296, t_F: 5.5 },
    tolerance: { p_psia: { rel: 0.002 }, t_F: { abs: 0.1 } },
    note: '',
  },
  {
    id: 'MEM-IP-ATM-20000',
    kind: 'stdAtm',
    units: 'IP',
    provenance: 'from-memory',
    source:
      'FROM MEMORY: ASHRAE HoF Ch.1 Table 1 (I-P); same numbers reproduced at ' +
      'engineersedge.com "Standard Atmospheric Data" (which shows 12.230 at 5000 ft)',
    inputs: { Z_ft: 20000 },
    expected: { p_psia: 6.758, t_F: -12.3 },
    tolerance: { p_psia: { rel: 0.002 }, t_F: { abs: 0.1 } },
    note: '',
  },
];
