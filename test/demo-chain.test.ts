/**
 * The demo note (examples/kestrel-ridge-ahu1.md, an invented building, what `npm run demo` shows)
 * is one chain: loads → supply → heat recovery → ventilation mix → coil → fan → reheat, and in
 * winter preheat → heat recovery → mix → heating coil → humidifier. This test holds it to that:
 * - only the design data are written as states; every other state is derived from the one before;
 * - every figure it quotes is a claim, and all of them pass;
 * - the chain's figures agree with an independent computation, each check naming its source;
 * - changing the outdoor design condition changes every figure that depends on it, flags every
 *   claim on those figures stale, and leaves the rest exactly as they were (propagation on the
 *   real demo, not on a toy chain).
 */
import { createRequire } from 'node:module';
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { analyzeNote } from '../shared-core/src/analyze';
import type { Analysis, ProcessResult, StateResult } from '../shared-core/src/evaluate/types';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const DEMO = readFileSync(join(root, 'examples', 'kestrel-ridge-ahu1.md'), 'utf8');

/** PsychroLib 1.1.1 (devDependency): the test oracle, SI. */
const psy = createRequire(import.meta.url)('psychrolib') as {
  SetUnitSystem(u: unknown): void;
  SI: unknown;
  GetStandardAtmPressure(z: number): number;
  GetHumRatioFromRelHum(t: number, rh: number, p: number): number;
  GetHumRatioFromTWetBulb(t: number, wb: number, p: number): number;
  GetMoistAirEnthalpy(t: number, w: number): number;
  GetMoistAirVolume(t: number, w: number, p: number): number;
};
psy.SetUnitSystem(psy.SI);

/** The design data: the only states written with figures. */
const DESIGN_STATES = ['OA', 'RA', 'OA_W', 'RA_W'];

function stateOf(a: Analysis, name: string): NonNullable<StateResult['state']> {
  const item = a.items.find((i) => i.name === name && i.kind !== 'process') as StateResult | undefined;
  expect(item?.state, `${name} is computed`).toBeTruthy();
  return item!.state!;
}

function processOf(a: Analysis, name: string, from?: string): ProcessResult {
  const item = a.items.find(
    (i): i is ProcessResult => i.kind === 'process' && i.name === name && (from === undefined || i.from === from),
  );
  expect(item, `process ${name}`).toBeDefined();
  return item!;
}

function near(actual: number, expected: number, rel: number, why: string): void {
  expect(Math.abs(actual - expected), `${why}: ${actual} vs ${expected}`).toBeLessThanOrEqual(rel * Math.abs(expected));
}

/** Every claim as `line key`, with whether it passes. */
function claims(a: Analysis, text: string): Map<string, boolean> {
  const out = new Map<string, boolean>();
  for (const item of a.items)
    for (const c of item.claims) out.set(`${text.slice(0, c.prop.span.start).split('\n').length} ${c.key}`, c.pass);
  return out;
}

/** The computed figures of each item, to compare two analyses (a state's h and W; a process's rates). */
function figures(a: Analysis): Map<string, number[]> {
  const out = new Map<string, number[]>();
  for (const i of a.items) {
    if (i.kind === 'process') out.set(`${i.name} ${i.from}`, [i.qTotalW ?? Number.NaN, i.waterKgS ?? Number.NaN]);
    else out.set(i.name, i.state ? [i.state.h, i.state.w, i.state.db] : []);
  }
  return out;
}

describe('the demo note is one chain', () => {
  const a = analyzeNote(DEMO);

  it('evaluates with no diagnostic, and every quoted figure is a claim that passes', () => {
    expect(a.diagnostics.map((d) => d.message)).toEqual([]);
    const all = [...claims(a, DEMO).values()];
    expect(all.length).toBeGreaterThanOrEqual(27);
    expect(all.every(Boolean)).toBe(true);
  });

  it('writes only the design data as states: every other state is derived from the one before', () => {
    const written = a.items.filter((i) => i.kind === 'state' && i.statement.keyword === 'state').map((i) => i.name);
    expect(written).toEqual(DESIGN_STATES);
    for (const i of a.items) {
      if (i.kind === 'process' || DESIGN_STATES.includes(i.name)) continue;
      // A supply from its room's loads, a mix of streams, or a state a process or recovery defines.
      const derived = i.kind === 'supply' || i.kind === 'mix' || i.definedBy !== undefined;
      expect(derived, `${i.name} is derived`).toBe(true);
    }
  });

  it('gives the figures an independent computation gives', () => {
    // Standard atmosphere at 1600 m (ASHRAE HoF 2017 SI Ch.1 eq 3; PsychroLib as oracle).
    const p = psy.GetStandardAtmPressure(1600);
    const wRA = psy.GetHumRatioFromRelHum(24, 0.5, p);
    // Supply from the loads at 4.6 kg/s (docs/notation.md "Supply air", from ASHRAE HoF 2017 SI
    // Ch.1 eq 32): W_S = W_R − Q_l/(ṁ L), L = 2 501 000 + 1860 t_R; t_S = t_R − Q_s/(ṁ (1006 + 1860 W_S)).
    const wSA = wRA - 18000 / (4.6 * (2501000 + 1860 * 24));
    const tSA = 24 - 44000 / (4.6 * (1006 + 1860 * wSA));
    near(stateOf(a, 'SA').w, wSA, 2e-4, 'supply W (PsychroLib W of the room)');
    near(stateOf(a, 'SA').db, tSA, 1e-4, 'supply dry-bulb');
    // Heat recovery, sensible, on the smaller capacity rate C = ṁ (1006 + 1860 W) (common practice).
    const wOA = psy.GetHumRatioFromTWetBulb(32, 16.5, p);
    const cOA = 1.15 * (1006 + 1860 * wOA);
    const cEA = 0.95 * (1006 + 1860 * wRA);
    const q = 0.7 * Math.min(cOA, cEA) * (32 - 24);
    near(stateOf(a, 'OAHX').db, 32 - q / cOA, 1e-4, 'outdoor air after the exchanger');
    near(stateOf(a, 'EAHX').db, 24 + q / cEA, 1e-4, 'exhaust air after the exchanger');
    // Adiabatic mixing by dry-air mass (ASHRAE HoF 2017 SI Ch.1, mixing of two streams): W and h weighted.
    const wMA = (1.15 * wOA + 3.45 * wRA) / 4.6;
    const hMA = (1.15 * psy.GetMoistAirEnthalpy(32 - q / cOA, wOA) + 3.45 * psy.GetMoistAirEnthalpy(24, wRA)) / 4.6;
    near(stateOf(a, 'MA').w, wMA, 2e-4, 'mixed W');
    near(stateOf(a, 'MA').h, hMA, 2e-4, 'mixed h');
    // Coil to 11.5 °C at the supply W: Q = ṁ (h_MA − h_OFF), condensate ṁ (W_MA − W_OFF) (eq 32, mass balance).
    const hOFF = psy.GetMoistAirEnthalpy(11.5, wSA);
    near(-processOf(a, 'CC').qTotalW!, 4.6 * (hMA - hOFF), 5e-4, 'coil total');
    near(-processOf(a, 'CC').waterKgS!, 4.6 * (wMA - wSA), 5e-4, 'condensate');
    // Fan heat, motor in the airstream: Δt = Δp v / (η cp), v per kg dry air at the fan inlet
    // (ASHRAE HoF 2017 SI Ch.1 eq 26 for v; all the input power heats the air: common practice).
    const rise = (750 * psy.GetMoistAirVolume(11.5, wSA, p)) / (0.62 * (1006 + 1860 * wSA));
    near(stateOf(a, 'FANOFF').db, 11.5 + rise, 1e-4, 'after the fan');
    // Closure: the supply, taken to the room state at its flow, gives back the loads exactly.
    near(processOf(a, 'ROOM').qSensibleW!, 44000, 1e-9, 'sensible load');
    near(processOf(a, 'ROOM').qLatentW!, 18000, 1e-9, 'latent load');
    // Winter: the preheater at 1.15 kg/s, −12 °C to 0 °C at constant W (eq 32).
    const wOAW = psy.GetHumRatioFromRelHum(-12, 0.7, p);
    near(
      processOf(a, 'PH').qTotalW!,
      1.15 * (psy.GetMoistAirEnthalpy(0, wOAW) - psy.GetMoistAirEnthalpy(-12, wOAW)),
      2e-4,
      'preheat',
    );
    // The humidifier adds ṁ (W_SA − W_MA) (mass balance).
    near(processOf(a, 'HU').waterKgS!, 4.6 * (stateOf(a, 'SA_W').w - stateOf(a, 'MA_W').w), 1e-9, 'humidifier water');
  });
});

describe('a changed outdoor condition reaches every figure that depends on it (the real demo)', () => {
  const base = analyzeNote(DEMO);
  const cases: {
    what: string;
    from: string;
    to: string;
    changed: string[];
    stale: string[];
  }[] = [
    {
      what: 'summer outdoor air 32 °C / 16.5 °C wb → 34 °C / 17.5 °C wb',
      from: 'state OA: db=32C wb=16.5C',
      to: 'state OA: db=34C wb=17.5C',
      // The outdoor air, the exchanger on both sides, the mix and the coil; the supply, the coil's
      // leaving state (db given, W from the supply), the fan and the reheat do not depend on it.
      changed: ['OA', 'OAHX', 'EAHX', 'HX OA', 'HX RA', 'MA', 'CC MA'],
      stale: ['OA rh', 'OA w', 'HX q_sensible', 'MA db', 'CC q_total', 'CC shr', 'CC water'],
    },
    {
      what: 'winter outdoor air −12 °C → −15 °C at 70 %',
      from: 'state OA_W: db=-12C rh=70%',
      to: 'state OA_W: db=-15C rh=70%',
      // Drier outdoor air: the preheater's duty and the humidifier's water move; the exchanger's
      // heat does not (the exhaust has the smaller capacity rate and both inlet temperatures stay).
      changed: ['OA_W', 'PHW', 'PH OA_W', 'OAHXW', 'HXW PHW', 'MA_W', 'HCW', 'HC MA_W', 'HU HCW'],
      stale: ['OA_W w', 'PH q_total', 'HU water'],
    },
  ];
  for (const c of cases) {
    it(c.what, () => {
      expect(DEMO).toContain(c.from);
      const text = DEMO.replace(c.from, c.to);
      const after = analyzeNote(text);
      // Every figure that depends on the change moved; every other one is exactly as it was.
      const f0 = figures(base);
      const f1 = figures(after);
      const moved = [...f0.keys()].filter((k) => f0.get(k)!.some((v, i) => !Object.is(v, f1.get(k)![i])));
      expect(moved).toEqual(c.changed);
      // Every claim on a moved figure that is now out of its band is flagged, naming the line; the
      // others pass. Which claims those are is written out above, with the engineer's reason.
      const lineOf = new Map<number, string>();
      for (const i of after.items) lineOf.set(text.slice(0, i.statement.span.start).split('\n').length, i.name);
      const stale = [...claims(after, text)]
        .filter(([, pass]) => !pass)
        .map(([k]) => {
          const [line, key] = k.split(' ');
          return `${lineOf.get(Number(line))} ${key}`;
        });
      expect(stale).toEqual(c.stale);
      expect(after.diagnostics.filter((d) => d.code !== 'claim-mismatch')).toEqual([]);
      expect(after.diagnostics.filter((d) => d.code === 'claim-mismatch')).toHaveLength(c.stale.length);
    });
  }
});
