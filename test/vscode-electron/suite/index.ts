/**
 * Entry point VS Code calls inside its extension host (`extensionTestsPath`): runs the mocha
 * suite bundled next to this file and rejects when any test fails.
 */
import { join } from 'node:path';
import Mocha from 'mocha';

/** Runs every spec of the integration suite. */
export function run(): Promise<void> {
  const mocha = new Mocha({ ui: 'bdd', timeout: 90_000, color: false, reporter: 'spec' });
  mocha.addFile(join(__dirname, 'extension.spec.js'));
  return new Promise((resolve, reject) => {
    mocha.run((failures) => (failures > 0 ? reject(new Error(`${failures} integration test(s) failed`)) : resolve()));
  });
}
