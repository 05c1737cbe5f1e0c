/** The crash-restart policy of the extension client (client/src/restartPolicy.ts). No figures: behaviour only. */
import { describe, expect, it } from 'vitest';
import { RestartPolicy } from '../../client/src/restartPolicy';

describe('RestartPolicy', () => {
  it('restarts after a crash and announces only the first one', () => {
    let t = 0;
    const p = new RestartPolicy(4, 180_000, () => t);
    const first = p.onCrash();
    expect(first).toMatchObject({ restart: true, announce: true });
    expect(first.message).toContain('Output → Dewmark');
    t += 10_000;
    const second = p.onCrash();
    expect(second).toMatchObject({ restart: true, announce: false });
    expect(second.message).toContain('again');
  });

  it('gives up after more than maxRestarts crashes within the window, and says how to retry', () => {
    let t = 0;
    const p = new RestartPolicy(2, 60_000, () => t);
    expect(p.onCrash().restart).toBe(true);
    t += 1000;
    expect(p.onCrash().restart).toBe(true);
    t += 1000;
    const third = p.onCrash();
    expect(third).toMatchObject({ restart: false, announce: true });
    expect(third.message).toContain('Restart Language Server');
  });

  it('forgets crashes older than the window', () => {
    let t = 0;
    const p = new RestartPolicy(1, 60_000, () => t);
    expect(p.onCrash().restart).toBe(true);
    t += 61_000;
    expect(p.onCrash().restart).toBe(true);
    t += 1000;
    expect(p.onCrash().restart).toBe(false);
  });

  it('reset() starts the count again after a manual restart', () => {
    let t = 0;
    const p = new RestartPolicy(1, 60_000, () => t);
    p.onCrash();
    t += 1;
    expect(p.onCrash().restart).toBe(false);
    p.reset();
    expect(p.onCrash().restart).toBe(true);
  });
});
