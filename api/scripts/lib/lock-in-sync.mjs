// Usage: node lock-in-sync.mjs CHECKOUT
// Exit 0 when node_modules matches package-lock.json, 1 when `npm ci` is needed.
// npm keeps node_modules/.package-lock.json (the "hidden lockfile") for what it installed. A lock
// file that is merely newer (npm install -w rewrites it, a git checkout touches it) is not a reason
// to wipe node_modules; a different package set is.
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';

const root = process.argv[2] ?? '.';
const read = (p) => JSON.parse(readFileSync(p, 'utf8')).packages ?? {};
const hiddenPath = join(root, 'node_modules', '.package-lock.json');
if (!existsSync(hiddenPath)) process.exit(1);

let wanted, installed;
try {
  wanted = read(join(root, 'package-lock.json'));
  installed = read(hiddenPath);
} catch (err) {
  console.error(`cannot compare lock files: ${err.message}`);
  process.exit(1);
}

const problems = [];
for (const [path, spec] of Object.entries(wanted)) {
  if (path === '' || !path.includes('node_modules/')) continue; // the root and workspace folders
  const have = installed[path];
  if (!have) {
    // Optional packages for other platforms (e.g. another OS's native binding) are never installed.
    if (!spec.optional && !spec.devOptional) problems.push(`missing ${path}`);
  } else if (have.version !== spec.version || Boolean(have.link) !== Boolean(spec.link)) {
    problems.push(
      `${path}: installed ${have.version ?? have.resolved}, lock wants ${spec.version ?? spec.resolved}`,
    );
  }
}
for (const path of Object.keys(installed)) {
  if (path.includes('node_modules/') && !wanted[path]) problems.push(`extra ${path}`);
}
if (problems.length) {
  console.log(
    `node_modules differs from package-lock.json (${problems.length}): ${problems.slice(0, 5).join('; ')}`,
  );
  process.exit(1);
}
