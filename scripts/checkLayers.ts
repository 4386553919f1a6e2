/**
 * The layer rule, enforced: `shared/` is the pure core and `renderer/` never touches Node or Electron.
 *
 * - shared/   may import only shared/ and the math/CSV libraries (ml-matrix, papaparse).
 * - renderer/ may import no Node built-in and not electron.
 * - cli/, bench/ may import no electron, react or renderer code.
 * - electron/ may import no renderer code (the renderer reaches the shell only through the preload API).
 *
 * `npm test` runs this over the tree (test/layers.test.ts); a bad import fails the build.
 */
import { readFileSync, readdirSync, statSync } from 'node:fs';
import { join, relative, sep } from 'node:path';
import { builtinModules } from 'node:module';

export interface SourceFile {
  /** Path relative to the repository root, with forward slashes. */
  path: string;
  text: string;
}

export interface LayerViolation {
  path: string;
  line: number;
  specifier: string;
  rule: string;
}

const NODE_BUILTINS = new Set(builtinModules.flatMap((m) => [m, `node:${m}`]));
const SHARED_ALLOWED_PACKAGES = new Set(['ml-matrix', 'papaparse']);
const DOM_GLOBALS = /\b(window|document|navigator|localStorage|sessionStorage|XMLHttpRequest|Buffer|process|require|__dirname)\s*[.(\[]/;

/** Every module specifier in a TypeScript source, with its 1-based line. */
export function importSpecifiers(text: string): { specifier: string; line: number }[] {
  const out: { specifier: string; line: number }[] = [];
  const patterns = [
    /\bimport\s+(?:type\s+)?(?:[\w*{}\s,$]+?\s+from\s+)?['"]([^'"]+)['"]/g,
    /\bexport\s+(?:type\s+)?(?:\*|\{[^}]*\})\s*(?:as\s+\w+\s+)?from\s+['"]([^'"]+)['"]/g,
    /\bimport\s*\(\s*['"]([^'"]+)['"]\s*\)/g,
    /\brequire\s*\(\s*['"]([^'"]+)['"]\s*\)/g,
  ];
  for (const re of patterns) {
    for (const m of text.matchAll(re)) {
      const line = text.slice(0, m.index).split('\n').length;
      out.push({ specifier: m[1], line });
    }
  }
  return out;
}

function packageName(spec: string): string {
  if (spec.startsWith('@')) return spec.split('/').slice(0, 2).join('/');
  return spec.split('/')[0];
}

function resolvesInto(fromPath: string, spec: string, folder: string): boolean {
  const parts = fromPath.split('/').slice(0, -1);
  for (const piece of spec.split('/')) {
    if (piece === '..') parts.pop();
    else if (piece !== '.') parts.push(piece);
  }
  return parts[0] === folder;
}

/** Checks the layer rule on a set of source files; returns every violation found. */
export function findLayerViolations(files: SourceFile[]): LayerViolation[] {
  const violations: LayerViolation[] = [];
  for (const file of files) {
    const layer = file.path.split('/')[0];
    for (const { specifier, line } of importSpecifiers(file.text)) {
      const relativeSpec = specifier.startsWith('.');
      const isNode = NODE_BUILTINS.has(specifier) || specifier.startsWith('node:');
      const pkg = relativeSpec ? '' : packageName(specifier);
      const add = (rule: string) => violations.push({ path: file.path, line, specifier, rule });
      if (layer === 'shared') {
        if (isNode) add('shared/ imports no Node built-in');
        else if (relativeSpec && !resolvesInto(file.path, specifier, 'shared')) add('shared/ imports only shared/');
        else if (!relativeSpec && !SHARED_ALLOWED_PACKAGES.has(pkg)) add(`shared/ imports only ${[...SHARED_ALLOWED_PACKAGES].join(', ')}`);
      } else if (layer === 'renderer') {
        if (isNode) add('renderer/ imports no Node built-in');
        else if (pkg === 'electron') add('renderer/ imports no electron');
        else if (relativeSpec && (resolvesInto(file.path, specifier, 'electron') || resolvesInto(file.path, specifier, 'cli'))) add('renderer/ talks to the host interface only, never to electron/ or cli/ code');
      } else if (layer === 'electron') {
        if (pkg === 'react' || pkg === 'react-dom') add('electron/ imports no react');
        else if (relativeSpec && resolvesInto(file.path, specifier, 'renderer')) add('electron/ imports no renderer code');
      } else if (layer === 'cli' || layer === 'bench') {
        if (pkg === 'electron' || pkg === 'react' || pkg === 'react-dom') add(`${layer}/ imports no electron or react`);
        else if (relativeSpec && resolvesInto(file.path, specifier, 'renderer')) add(`${layer}/ imports no renderer code`);
      }
    }
    if (layer === 'shared') {
      const lines = file.text.split('\n');
      lines.forEach((text, i) => {
        const code = text.replace(/\/\/.*$/, '');
        if (/^\s*\*/.test(code)) return; // doc comment line
        const m = DOM_GLOBALS.exec(code);
        if (m) violations.push({ path: file.path, line: i + 1, specifier: m[1], rule: 'shared/ uses no DOM or Node global' });
      });
    }
  }
  return violations;
}

/** Reads every .ts/.tsx file under the given top-level folders of `root`. */
export function readSources(root: string, folders: string[]): SourceFile[] {
  const out: SourceFile[] = [];
  const walk = (dir: string) => {
    for (const name of readdirSync(dir)) {
      if (name === 'node_modules' || name.startsWith('.')) continue;
      const full = join(dir, name);
      if (statSync(full).isDirectory()) walk(full);
      else if (/\.(ts|tsx|mts|cts)$/.test(name) && !name.endsWith('.d.ts')) {
        out.push({ path: relative(root, full).split(sep).join('/'), text: readFileSync(full, 'utf8') });
      }
    }
  };
  for (const f of folders) {
    try {
      walk(join(root, f));
    } catch {
      /* folder absent */
    }
  }
  return out;
}
