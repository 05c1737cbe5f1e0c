/**
 * What the independent-client suites (Neovim, Emacs) share: the language server they start, the
 * note they open (an invented building) and the figures its first state must show.
 */
import { join } from 'node:path';
import { expect } from 'vitest';
import { REPO_ROOT } from './tools';

/** The language server's bin, as the README's editor configurations start it. */
export const SERVER = join(REPO_ROOT, 'bin', 'dewmark-language-server.js');

// Invented building.
export const NOTE = [
  '# Harbour Street Lab — AHU-2',
  '',
  '```air',
  'state OA: db=40C wb=20C        # hot, dry intake air',
  'state RA: db=24 rh=50%',
  'mix MA: OA 25% + RA 75%',
  '```',
  '',
].join('\n');

// ASHRAE HoF 2017 SI Ch.1 Example 1 (40 °C db / 20 °C wb, 101.325 kPa): W 0.0065 kg/kg ± 0.0001,
// h 56.7 kJ/kg ± 0.1 (PsychroLib test-suite tolerances), plus half a shown digit.
export const W_G_PER_KG = { value: 6.5, tol: 0.105 };
export const H_KJ_PER_KG = { value: 56.7, tol: 0.105 };

/** Checks a hover on `state OA` (Markdown as the server sends it): its figures w and h and the caution. */
export function expectStateOaHover(hover: string): void {
  expect(hover).toContain('**state OA**');
  const w = Number(/\| `w` \| ([\d.]+) \| g\/kg/.exec(hover)?.[1]);
  const h = Number(/\| `h` \| ([\d.]+) \| kJ\/kg/.exec(hover)?.[1]);
  expect(Math.abs(w - W_G_PER_KG.value)).toBeLessThanOrEqual(W_G_PER_KG.tol);
  expect(Math.abs(h - H_KJ_PER_KG.value)).toBeLessThanOrEqual(H_KJ_PER_KG.tol);
  expect(hover).toContain('Design aid only');
}
