// Checks a built web/dist: the only font files shipped are Public Sans and the primeicons icon
// font, and no stylesheet points at another host (nothing is fetched from the internet).
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';

const dist = new URL('../dist/', import.meta.url).pathname;
const files = [];
(function walk(dir) {
  for (const name of readdirSync(dir)) {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) walk(path);
    else files.push(path);
  }
})(dist);

const problems = [];
const fontFile = /\.(woff2?|ttf|otf|eot)$/i;
for (const file of files.filter((f) => fontFile.test(f))) {
  const name = file.slice(dist.length);
  if (!/(^|\/)(public-sans-|primeicons-)/.test(name))
    problems.push(`unexpected font file: ${name}`);
}
for (const file of files.filter((f) => /\.(css|html)$/.test(f))) {
  const text = readFileSync(file, 'utf8');
  for (const m of text.matchAll(
    /url\(\s*['"]?(https?:)?\/\/[^)]*\)|@import\s+(url\()?['"]?https?:/gi,
  )) {
    problems.push(`${file.slice(dist.length)} fetches from another host: ${m[0]}`);
  }
  if (/font-family:\s*["']?Inter/i.test(text))
    problems.push(`${file.slice(dist.length)} still names the Inter font`);
}
const fonts = files.filter((f) => fontFile.test(f)).length;
if (fonts === 0) problems.push('no font files at all: Public Sans is missing from the build');

if (problems.length > 0) {
  console.error(`web/dist check failed:\n  ${problems.join('\n  ')}`);
  process.exit(1);
}
console.log(
  `web/dist check passed: ${fonts} font files, all Public Sans or primeicons; no remote URLs in CSS.`,
);
