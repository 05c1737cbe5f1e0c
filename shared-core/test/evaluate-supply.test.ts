/**
 * `supply`: the supply state and dry-air flow that absorb a room's sensible and latent gains,
 * checked against the balance written out independently (ASHRAE HoF 2017 SI Ch.1, space heat
 * absorption and moist-air moisture gains; eq 32, h = 1.006 t + W (2501 + 1.86 t) kJ/kg): with
 * enthalpies from PsychroLib 1.1.1 (test oracle),
 *   total    Q_t = ṁ (h_R − h_S)
 *   sensible Q_s = ṁ (1.006 + 1.86 W_S)(t_R − t_S)   (the split processes use, docs/notation.md)
 *   latent   Q_l = Q_t − Q_s.
 * The room and loads are of an invented clinic.
 */
import { describe, expect, it } from 'vitest';
import { analyse, fence, near, processOf, psy, spanText, stateOf, stateResult, withCode } from './evaluate-helpers';

const P0 = 101325;
const ROOM = 'state RA: db=24C rh=50%';

/** The loads a supply state (t, W) at dry-air flow m takes up on its way to the room (kW). */
function loads(t: number, W: number, m: number) {
  const wR = psy.GetHumRatioFromRelHum(24, 0.5, P0);
  const hR = psy.GetMoistAirEnthalpy(24, wR);
  const hS = psy.GetMoistAirEnthalpy(t, W);
  const total = (m * (hR - hS)) / 1000;
  const sensible = m * (1.006 + 1.86 * W) * (24 - t);
  return { total, sensible, latent: total - sensible };
}

describe('supply air from room loads', () => {
  it('by the supply dry-bulb: W and the dry-air flow that carry both loads, shown as mass and volume', () => {
    const a = analyse(fence(ROOM, 'supply SA: RA q_sensible=41.5kW q_latent=8kW db=13.6C'));
    const r = stateResult(a, 'SA');
    const s = stateOf(a, 'SA');
    expect(a.diagnostics).toEqual([]);
    near(s.db, 13.6, { abs: 1e-12 }, 'the given supply dry-bulb');
    const m = r.massFlowKgS!;
    const back = loads(s.db, s.w, m);
    near(back.sensible, 41.5, { rel: 1e-4 }, 'sensible gain absorbed (balance with PsychroLib enthalpies)');
    near(back.latent, 8, { rel: 1e-3 }, 'latent gain absorbed');
    near(
      r.supply!.volumeFlowM3S,
      m * psy.GetMoistAirVolume(s.db, s.w, P0),
      { rel: 1e-4 },
      'volume at SA: ṁ v_S (PsychroLib eq 26)',
    );
    near(r.supply!.shr!, 41.5 / 49.5, { abs: 1e-12 }, 'room SHR = 41.5 / (41.5 + 8)');
    // Common practice at sea level: Q_s ≈ 1.23 W/(L/s·K) × L/s × Δt (ρ cp of standard air), within 2 %.
    near((1.23 * r.supply!.volumeFlowM3S * 1000 * (24 - 13.6)) / 1000, 41.5, { rel: 0.02 }, 'the 1.23 rule of thumb');
  });

  it('a process from SA to the room at the supply flow gives the loads back exactly', () => {
    const a = analyse(
      fence(
        ROOM,
        'supply SA: RA q_sensible=41.5kW q_latent=8kW db=13.6C',
        'process ROOM: SA -> RA q_sensible=41.50kW q_latent=8.00kW',
      ),
    );
    const p = processOf(a, 'ROOM');
    near(p.massFlowKgS, stateResult(a, 'SA').massFlowKgS!, { rel: 1e-15 }, 'the flow is taken from the supply');
    near(p.qSensibleW, 41500, { abs: 1e-6 }, 'sensible');
    near(p.qLatentW, 8000, { abs: 1e-6 }, 'latent');
    expect(withCode(a, 'claim-mismatch')).toEqual([]);
  });

  it('by the dry-air mass flow: the supply temperature and W (latent first, then sensible)', () => {
    const a = analyse(fence(ROOM, 'supply SA: RA q_sensible=41.5kW q_latent=8kW m=3.9kg/s'));
    const s = stateOf(a, 'SA');
    const wR = psy.GetHumRatioFromRelHum(24, 0.5, P0);
    // Written out: W_S = W_R − Q_l / (ṁ (2501 + 1.86 t_R)), t_S = t_R − Q_s / (ṁ (1.006 + 1.86 W_S)) (kJ, kg, °C).
    const W = wR - 8 / (3.9 * (2501 + 1.86 * 24));
    const t = 24 - 41.5 / (3.9 * (1.006 + 1.86 * W));
    near(s.w, W, { rel: 2e-4 }, 'W_S');
    near(s.db, t, { abs: 1e-3 }, 't_S');
    const back = loads(s.db, s.w, 3.9);
    near(back.sensible, 41.5, { rel: 1e-4 }, 'sensible back');
    near(back.latent, 8, { rel: 1e-3 }, 'latent back');
  });

  it('by the volume flow at the supply state (m3/s here; the flow is taken at SA, not at the room)', () => {
    const a = analyse(fence(ROOM, 'supply SA: RA q_sensible=41.5kW q_latent=8kW q=3.4m3/s'));
    const r = stateResult(a, 'SA');
    const s = stateOf(a, 'SA');
    near(r.massFlowKgS! * psy.GetMoistAirVolume(s.db, s.w, P0), 3.4, { rel: 1e-9 }, 'ṁ v_S = V̇ (PsychroLib eq 26)');
    const back = loads(s.db, s.w, r.massFlowKgS!);
    near(back.sensible, 41.5, { rel: 1e-4 }, 'sensible back');
    near(back.latent, 8, { rel: 1e-3 }, 'latent back');
  });

  it('flow= and V= are q= by other names, given or claimed (the key table reads them as q=)', () => {
    const q = analyse(fence(ROOM, 'supply SA: RA q_sensible=41.5kW q_latent=8kW q=3.4m3/s'));
    for (const key of ['flow', 'V']) {
      const a = analyse(fence(ROOM, `supply SA: RA q_sensible=41.5kW q_latent=8kW ${key}=3.4m3/s`));
      expect(a.diagnostics).toEqual([]);
      // The same solve as q=3.4m3/s: the same supply state and flow to the last digit.
      expect(stateOf(a, 'SA')).toEqual(stateOf(q, 'SA'));
      expect(stateResult(a, 'SA').massFlowKgS).toBe(stateResult(q, 'SA').massFlowKgS);
      expect(stateResult(a, 'SA').supply?.given).toBe('q');
    }
    // Beside db=, flow= is a claim on the volume flow at the supply state (ṁ v_S, PsychroLib eq 26).
    const text = fence(ROOM, 'supply SA: RA q_sensible=41.5kW q_latent=8kW db=13.6C flow=3.5m3/s V=3.6m3/s');
    const c = analyse(text);
    const sa = stateOf(c, 'SA');
    const v = stateResult(c, 'SA').massFlowKgS! * psy.GetMoistAirVolume(sa.db, sa.w, P0);
    expect(stateResult(c, 'SA').claims.map((x) => x.key)).toEqual(['flow']);
    near(stateResult(c, 'SA').claims[0]!.computedSI, v, { rel: 1e-9 }, 'volume flow at SA');
    expect(withCode(c, 'flow-conflict').map((d) => [spanText(text, d), d.message])).toEqual([
      ['V=3.6m3/s', expect.stringMatching(/flow= and V= both give the volume flow.*keep one \(flow= is used\)/)],
    ]);
    // Two names for the flow beside m=: the volume flow conflicts with the mass flow.
    const d = analyse(fence(ROOM, 'supply SA: RA q_sensible=41.5kW q_latent=8kW m=3kg/s flow=3m3/s'));
    expect(withCode(d, 'flow-conflict').map((x) => x.message)).toEqual([
      expect.stringMatching(/^supply SA: both m= and flow= give the flow; keep one/),
    ]);
  });

  it('claims on the supply: its state, the flow it was not given, and the room SHR', () => {
    const text = fence(ROOM, 'supply SA: RA q_sensible=41.5kW q_latent=8kW db=13.6C m=3.91kg/s shr=0.84 rh=90%');
    const a = analyse(text);
    const r = stateResult(a, 'SA');
    expect(r.claims.map((c) => [c.key, c.pass])).toEqual([
      ['rh', false],
      ['m', true],
      ['shr', true],
    ]);
    // rh of SA (PsychroLib) at the W that the balance gives: about 87 %, so rh=90% is stale.
    near(r.claims[0]!.computedSI, psy.GetRelHumFromHumRatio(13.6, stateOf(a, 'SA').w, P0), { abs: 2e-4 }, 'rh of SA');
    expect(withCode(a, 'claim-mismatch').map((d) => spanText(text, d))).toEqual(['90']);
  });

  it('IP figures: the same physics, a heating load written negative', () => {
    const a = analyse(
      fence('units: IP', 'state RW: db=70F rh=30%', 'supply SW: RW q_sensible=-120000Btu/h q_latent=0Btu/h db=95F'),
    );
    const s = stateOf(a, 'SW');
    const r = stateResult(a, 'SW');
    const wR = psy.GetHumRatioFromRelHum((70 - 32) / 1.8, 0.3, P0);
    near(s.w, wR, { abs: 1e-12 }, 'no latent load: the supply W equals the room W');
    // Q_s = ṁ (1.006 + 1.86 W)(t_R − t_S): 120 000 Btu/h = 35.1685 kW (NIST SP 811: Btu_IT/h = 0.29307107 W).
    near(
      r.massFlowKgS!,
      -35.168528 / ((1.006 + 1.86 * wR) * (21.1111111 - 35)),
      { rel: 1e-5 },
      'dry-air flow for a heating load',
    );
  });
});

describe('supplies that cannot be', () => {
  const cases: [string, string, string, RegExp][] = [
    [
      'a latent load too large for the flow (W < 0)',
      'supply SA: RA q_sensible=41.5kW q_latent=300kW db=13.6C',
      'db=13.6C',
      /below zero: the supply air cannot absorb that latent load/,
    ],
    [
      'supply warmer than the room for a gain',
      'supply SA: RA q_sensible=41.5kW q_latent=8kW db=26C',
      'db=26C',
      /needs supply air cooler than RA/,
    ],
    [
      'a flow far too small',
      'supply SA: RA q_sensible=41.5kW q_latent=8kW m=0.1kg/s',
      'm=0.1kg/s',
      /humidity ratio of [−-]?[\d.]+ g\/kg, below zero|outside −100 °C to 200 °C/,
    ],
    [
      'a negative latent load that would need air above saturation',
      'supply SA: RA q_sensible=5kW q_latent=-40kW m=1kg/s',
      'm=1kg/s',
      /above saturation/,
    ],
  ];
  for (const [what, line, underlined, message] of cases) {
    it(what, () => {
      const text = fence(ROOM, line);
      const a = analyse(text);
      const errors = a.diagnostics.filter((d) => d.severity === 'error');
      expect(errors.map((d) => d.message)).toHaveLength(1);
      expect(errors[0]!.code === 'supply-infeasible' || errors[0]!.code === 'out-of-range').toBe(true);
      expect(spanText(text, errors[0]!)).toBe(underlined);
      expect(errors[0]!.message).toMatch(message);
      expect(stateResult(a, 'SA').state).toBeNull();
    });
  }

  it('missing loads, neither db nor a flow, both flows', () => {
    const msgs = (line: string) => analyse(fence(ROOM, line)).diagnostics.map((d) => `${d.code}: ${d.message}`);
    expect(msgs('supply SA: RA q_sensible=41.5kW db=13C')).toEqual([
      expect.stringMatching(/^underspecified: supply SA needs the room's sensible and latent loads: add q_latent=/),
    ]);
    expect(msgs('supply SA: RA q_sensible=41.5kW q_latent=8kW')).toEqual([
      expect.stringMatching(/^underspecified: supply SA needs the supply dry-bulb \(db=13\.6C\) or the dry-air flow/),
    ]);
    expect(msgs('supply SA: RA q_sensible=41.5kW q_latent=8kW m=3kg/s q=3m3/s')).toEqual([
      expect.stringMatching(/^flow-conflict: supply SA: both m= and q=/),
    ]);
    expect(msgs('supply SA: q_sensible=41.5kW q_latent=8kW db=13C')).toEqual([
      expect.stringMatching(/^missing-name: the room state the supply serves is missing/),
    ]);
    expect(msgs('supply SA: NOPE q_sensible=41.5kW q_latent=8kW db=13C')).toEqual([
      expect.stringMatching(/^unknown-name: no state is named 'NOPE'/),
    ]);
  });

  it('takes its dry-bulb from a state above (db=OFF.db+0.8K), and only that', () => {
    const a = analyse(
      fence(ROOM, 'state OFF: db=12.8C rh=95%', 'supply SA: RA q_sensible=41.5kW q_latent=8kW db=OFF.db+0.8K'),
    );
    near(stateOf(a, 'SA').db, 13.6, { abs: 1e-12 }, 'OFF + 0.8 K');
    const b = analyse(
      fence(ROOM, 'state OFF: db=12.8C rh=95%', 'supply SA: RA q_sensible=41.5kW q_latent=8kW db=13.6C w=OFF.w'),
    );
    expect(withCode(b, 'bad-reference').map((d) => d.message)).toEqual([
      expect.stringMatching(/a supply takes only its dry-bulb from another state/),
    ]);
  });
});
