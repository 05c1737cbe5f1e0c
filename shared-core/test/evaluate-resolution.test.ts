/**
 * Rounding is not physics: a process whose two states carry rounded copies of one humidity ratio
 * has no moisture change — no latent heat, no water or condensate, SHR 1 — while a change the
 * written figures do resolve is kept.
 */
import { describe, expect, it } from 'vitest';
import { hover, inlayHints } from '../src/service';
import { analyse, fence, psy } from './evaluate-helpers';
import type { ProcessResult } from '../src/evaluate/types';
import { air, noteOf } from './service-helpers';

const proc = (lines: string[], name: string) =>
  analyse(fence(...lines)).items.find((i) => i.kind === 'process' && i.name === name) as ProcessResult;

describe('a Δw below the resolution of the written states', () => {
  // 13 °C / 95 % off a coil: W = 8.86 g/kg (PsychroLib 1.1.1 as oracle); the reheat's leaving state
  // is written with the rounded copy w=8.9g/kg, the fan's with rh=89% at 14 °C (W 8.85 g/kg).
  const lines = [
    'state OFF: db=13C rh=95%',
    'state SA: db=30C w=8.9g/kg',
    'process RH: OFF -> SA m=2kg/s',
    'state SA2: db=14C rh=89%',
    'process FAN: OFF -> SA2 m=2kg/s',
  ];

  it('is no moisture change: Δw, latent heat and water 0, SHR exactly 1, total = sensible', () => {
    const wA = psy.GetHumRatioFromRelHum(13, 0.95, 101325);
    for (const [name, dt] of [
      ['RH', 17],
      ['FAN', 1],
    ] as const) {
      const p = proc(lines, name);
      expect(p.moistureUnchanged, name).toBe(true);
      expect(p.processKind).toBe('sensible-heating');
      expect(p.dw).toBe(0);
      expect(p.dhLatent).toBe(0);
      expect(p.qLatentW).toBe(0);
      expect(p.waterKgS).toBe(0);
      expect(p.shr).toBe(1);
      expect(p.qTotalW).toBe(p.qSensibleW);
      // Sensible: ṁ (1.006 + 1.86 W_A) Δt kW (ASHRAE HoF 2017 SI Ch.1 eq 32, the split docs/notation.md defines).
      expect(Math.abs(p.qSensibleW! - 2 * (1006 + 1860 * wA) * dt)).toBeLessThan(1e-6 * p.qSensibleW!);
      expect(p.qCoilW).toBe(p.qSensibleW);
    }
  });

  it('shows no water, no condensate and no latent line', () => {
    const text = air(...lines);
    const note = noteOf(text);
    const labels = inlayHints(note, { start: 0, end: text.length }).map((h) => h.label.replace(/\u00a0/g, ' '));
    const rh = labels.find((l) => l.startsWith('sensible heating · 34'))!;
    expect(rh).toContain('SHR 1.00');
    expect(rh).not.toMatch(/water|condensate/);
    const md = hover(note, text.indexOf('RH:'))!.markdown;
    expect(md).toContain('no moisture change');
    expect(md).not.toContain('latent heat');
    expect(md).not.toMatch(/condensate|water added/);
  });

  it('keeps a moisture change the written figures resolve', () => {
    // 24 °C from 50 % to 52 %: ΔW ≈ 0.37 g/kg (eq 20–22), well above what rh to 1 % resolves (≈0.1 g/kg each).
    const hum = proc(['state RA: db=24C rh=50%', 'state HUM: db=24C rh=52%', 'process H: RA -> HUM m=1kg/s'], 'H');
    expect(hum.moistureUnchanged).toBeUndefined();
    expect(hum.processKind).toBe('humidifying');
    expect(hum.waterKgS!).toBeGreaterThan(0);
  });

  it('takes the threshold from the written precision: more digits resolve a smaller Δw', () => {
    // W_A 8.86 g/kg and w=8.90g/kg: 0.04 g/kg apart. rh=95.0% (±0.05 %) and w=8.90g/kg (±0.005) resolve it.
    const fine = proc(
      ['state OFF: db=13C rh=95.0%', 'state SA: db=30C w=8.90g/kg', 'process RH: OFF -> SA m=2kg/s'],
      'RH',
    );
    expect(fine.moistureUnchanged).toBeUndefined();
    expect(fine.dw).toBeGreaterThan(0);
    // An explicit band says the same: w=8.9g/kg±0.001 resolves it too.
    const banded = proc(
      ['state OFF: db=13C rh=95.0%', 'state SA: db=30C w=8.9g/kg±0.001', 'process RH: OFF -> SA m=2kg/s'],
      'RH',
    );
    expect(banded.moistureUnchanged).toBeUndefined();
  });

  it('reads a mix’s W as computed, not written: the other state’s figures decide', () => {
    // A cooling coil after a mix, 0.19 g/kg of moisture removed (MA 8.57, OFF 8.39 g/kg): OFF's
    // rh=90% resolves about 0.05 g/kg, so the change is kept.
    const cc = proc(
      [
        'state OA: db=40C wb=20C',
        'state RA: db=24C rh=50%',
        'mix MA: OA 25% + RA 75%',
        'state OFF: db=13C rh=90%',
        'process CC: MA -> OFF m=5kg/s',
      ],
      'CC',
    );
    expect(cc.moistureUnchanged).toBeUndefined();
    expect(cc.processKind).toBe('cooling-dehumidifying');
    const p = proc(
      [
        'state OA: db=30C rh=40%',
        'state RA: db=24C rh=50%',
        'mix MA: OA 30% + RA 70%',
        'state SA: db=35C w=9.3g/kg',
        'process H: MA -> SA m=1kg/s',
      ],
      'H',
    );
    // MA: 0.3 × 10.6 + 0.7 × 9.3 = 9.6 g/kg (eq 20–22, mass balance), 0.3 g/kg from 9.3: resolved.
    expect(p.moistureUnchanged).toBeUndefined();
    const copy = proc(
      [
        'state OA: db=30C rh=40%',
        'state RA: db=24C rh=50%',
        'mix MA: OA 30% + RA 70%',
        'state SA: db=35C w=9.7g/kg',
        'process H: MA -> SA m=1kg/s',
      ],
      'H',
    );
    expect(copy.moistureUnchanged).toBe(true);
  });
});
