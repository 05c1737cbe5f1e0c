/**
 * The third-party notices of the bundles: every npm package whose files esbuild put into a bundle
 * (read from the build's metafiles), with its version, licence name and full licence text.
 * A bundled package without a licence file stops the build: the notices must be complete.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';

/** The last `node_modules/<name>/` of a bundled input path (nested copies count as their own package). */
const PACKAGE_DIR = /^(.*node_modules\/((?:@[^/]+\/)?[^/]+))\//;

/** Licence files, and the notices a package carries for code it includes itself. */
const LICENCE_FILE = /^(licen[cs]e|copying|third-?party-?notices)(\.|-|$)/i;

/** Package folders (relative to the root) bundled into each bundle. */
export function bundledPackages(metafiles) {
  /** @type {Map<string, Set<string>>} package folder → bundles */
  const dirs = new Map();
  for (const [bundle, meta] of metafiles) {
    for (const input of Object.keys(meta.inputs)) {
      const m = PACKAGE_DIR.exec(input.replace(/\\/g, '/'));
      if (!m) continue;
      if (!dirs.has(m[1])) dirs.set(m[1], new Set());
      dirs.get(m[1]).add(bundle);
    }
  }
  return dirs;
}

/** Builds the notices text; throws when a bundled package has no licence file. */
export function thirdPartyNotices(root, metafiles) {
  const entries = [];
  for (const [dir, bundles] of bundledPackages(metafiles)) {
    const abs = join(root, dir);
    const pkg = JSON.parse(readFileSync(join(abs, 'package.json'), 'utf8'));
    const files = readdirSync(abs)
      .filter((f) => LICENCE_FILE.test(f))
      .sort();
    if (files.length === 0)
      throw new Error(`${pkg.name}@${pkg.version} (${dir}) is bundled but has no licence file to copy`);
    const licence = typeof pkg.license === 'string' ? pkg.license : (pkg.license?.type ?? 'see the text below');
    const texts = files.map((f) => readFileSync(join(abs, f), 'utf8').replace(/\r\n/g, '\n').trim());
    entries.push({ name: pkg.name, version: pkg.version, licence, bundles: [...bundles].sort(), texts });
  }
  entries.sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : a.version < b.version ? -1 : 1));
  let text =
    '# Third-party notices\n\n' +
    "Dewmark's bundles (the files in this folder) include code from the packages below, each under its\n" +
    'own licence, reproduced in full. Dewmark itself is under the MIT licence in LICENSE.\n';
  for (const e of entries) {
    text += `\n## ${e.name} ${e.version}\n\nLicence: ${e.licence}. In: ${e.bundles.join(', ')}.\n\n`;
    for (const t of e.texts) text += `\`\`\`text\n${t.replace(/```/g, "'''")}\n\`\`\`\n\n`;
  }
  return { text: text.replace(/\n+$/, '\n'), packages: entries.length };
}
