/**
 * Renders images/screenshot.png for the README: the packaged extension in code-server with the
 * demo note examples/kestrel-ridge-ahu1.md open, its inline hints showing and a hover on a state.
 * Needs the editor-test tools (bash scripts/setup-e2e-tools.sh) and a built dist/.
 *
 *   node --import tsx test/tools/readme-screenshot.ts
 */
import { spawnSync } from 'node:child_process';
import { copyFileSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { startSession } from '../e2e/lib/codeServer';

const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
const NOTE = 'kestrel-ridge-ahu1.md';

async function main(): Promise<void> {
  const work = mkdtempSync(join(tmpdir(), 'dewmark-shot-'));
  const vsix = join(work, 'dewmark.vsix');
  const r = spawnSync(process.execPath, [join(root, 'client', 'package-vsix.mjs'), '--no-build', '--out', vsix], {
    cwd: root,
    stdio: 'inherit',
  });
  if (r.status !== 0) throw new Error('packaging failed (run npm run build first)');
  const session = await startSession(
    {
      extensions: [vsix],
      files: { [NOTE]: readFileSync(join(root, 'examples', NOTE), 'utf8') },
      settings: {
        '[markdown]': { 'editor.wordWrap': 'off' },
        'workbench.sideBar.location': 'left',
        'editor.fontSize': 13,
      },
    },
    { name: 'readme-screenshot', viewport: { width: 1360, height: 820 } },
  );
  try {
    const wb = session.workbench;
    await wb.openFile(NOTE);
    await wb.page.keyboard.press('Control+B'); // hide the side bar: more room for the note
    await wb.page.keyboard.press('Control+G');
    await wb.page.keyboard.insertText('42');
    await wb.page.keyboard.press('Enter');
    await wb.waitForEditorLine(/^state OA: .*dp /);
    await wb.hover('OA', { line: 'state OA:', expect: 'humidity ratio' });
    const shot = await wb.screenshot('readme');
    copyFileSync(shot, join(root, 'images', 'screenshot.png'));
    console.log('wrote images/screenshot.png');
  } finally {
    await session.close();
    rmSync(work, { recursive: true, force: true });
  }
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
