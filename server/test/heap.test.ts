/**
 * The server bounds V8's heap slack itself (`server/src/heap.ts`), since editors other than VS
 * Code start it without Node options. Checked by structure, not by time: a child process makes
 * short-lived objects the way an edit does (a rolling window survives a few scavenges each) and
 * reports the young generation's size, with and without the server's settings.
 */
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { describe, expect, it } from 'vitest';
import { HEAP_SLACK_FLAGS } from '../src/heap';

const heapModule = pathToFileURL(join(__dirname, '..', 'src', 'heap.ts')).href;

/** The young generation's size (MB) after the workload, in a fresh process. */
function youngGenerationMB(limit: boolean): number {
  const script = `
import { getHeapSpaceStatistics } from 'node:v8';
import { limitHeapSlack } from ${JSON.stringify(heapModule)};
if (${limit}) limitHeapSlack();
let window = [];
for (let i = 0; i < 2_000_000; i++) {
  window.push({ i, text: 'edit ' + (i % 1000), list: [i, i + 1] });
  if (window.length > 40_000) window = [];
}
const young = getHeapSpaceStatistics().find((s) => s.space_name === 'new_space');
process.stdout.write(String(young.space_size / 1048576));
`;
  const r = spawnSync(process.execPath, ['--import', 'tsx', '--input-type=module', '-e', script], {
    cwd: join(__dirname, '..', '..'),
    encoding: 'utf8',
    timeout: 60_000,
  });
  if (r.status !== 0) throw new Error(`child failed: ${r.stderr}`);
  return Number(r.stdout);
}

describe('the server bounds its heap slack', () => {
  it('keeps the young generation at its first size, where V8 alone grows it to 2 × 16 MB', () => {
    const bare = youngGenerationMB(false);
    const limited = youngGenerationMB(true);
    // V8's default maximum semi-space on 64-bit is 16 MB (from memory; the bare run shows it).
    expect(bare).toBeGreaterThan(8);
    expect(limited).toBeLessThanOrEqual(4.5);
  });

  it('sets only settings V8 takes at run time, in the form node takes them', () => {
    for (const flag of HEAP_SLACK_FLAGS) {
      const r = spawnSync(process.execPath, [flag, '-e', ''], { encoding: 'utf8' });
      expect(r.status, `${flag}: ${r.stderr}`).toBe(0);
      expect(r.stderr).toBe('');
    }
  });
});
