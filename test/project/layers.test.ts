import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import { findLayerViolations, readSources } from '../../scripts/checkLayers';

const root = fileURLToPath(new URL('../..', import.meta.url));

describe('layer rule (../shared/STYLE.md: shared/ is pure; renderer/ never touches Node or Electron)', () => {
  it('holds for the whole tree', () => {
    const files = readSources(root, ['shared', 'renderer', 'cli', 'bench', 'electron']);
    expect(files.length).toBeGreaterThan(0);
    const violations = findLayerViolations(files);
    expect(violations.map((v) => `${v.path}:${v.line} ${v.specifier} (${v.rule})`)).toEqual([]);
  });

  it('catches a deliberate bad import in shared/', () => {
    const bad = [
      { path: 'shared/ssm/x.ts', text: "import { readFileSync } from 'node:fs';\nexport const a = 1;" },
      { path: 'shared/ssm/y.ts', text: "import fs from 'fs';" },
      { path: 'shared/ssm/z.ts', text: "import React from 'react';" },
      { path: 'shared/ssm/w.ts', text: "import { app } from 'electron';" },
      { path: 'shared/ssm/v.ts', text: "import { host } from '../../renderer/host';" },
      { path: 'shared/ssm/u.ts', text: 'export const w = window.innerWidth;' },
    ];
    const found = findLayerViolations(bad);
    expect(found.map((v) => v.path)).toEqual(bad.map((b) => b.path));
  });

  it('catches Node and electron imports in renderer/, and allows shared/ and react there', () => {
    const found = findLayerViolations([
      { path: 'renderer/src/a.tsx', text: "import { ipcRenderer } from 'electron';" },
      { path: 'renderer/src/b.tsx', text: "import path from 'node:path';" },
      { path: 'renderer/src/c.tsx', text: "import { x } from '../../shared/errors';\nimport React from 'react';" },
    ]);
    expect(found.map((v) => v.path)).toEqual(['renderer/src/a.tsx', 'renderer/src/b.tsx']);
  });

  it('catches renderer code imported by the Electron shell', () => {
    const found = findLayerViolations([
      { path: 'electron/main.ts', text: "import { App } from '../renderer/src/App';" },
      { path: 'electron/preload.ts', text: "import { contextBridge } from 'electron';\nimport type { ForecatchBridge } from '../shared/ipc/contract';" },
    ]);
    expect(found.map((v) => v.path)).toEqual(['electron/main.ts']);
  });

  it('allows the math/CSV libraries and relative shared/ imports in shared/', () => {
    const found = findLayerViolations([
      { path: 'shared/a/b.ts', text: "import { Matrix } from 'ml-matrix';\nimport Papa from 'papaparse';\nimport { ParseError } from '../errors';" },
    ]);
    expect(found).toEqual([]);
  });
});
