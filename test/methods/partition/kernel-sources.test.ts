import { describe, expect, it } from 'vitest';
import { ASSEMBLED_KERNELS } from '../../../src/methods/partition/kernels/assembled';
import { kernelModule, type KernelName } from '../../../src/methods/partition/wasm-kernels';

// The committed binaries (kernels/assembled.ts) must be what the wabt assembler makes of the
// .wat files now: a .wat edited without `npm run kernels` fails here.

const { assembleKernels } = require('../../../scripts/assemble-kernels.js') as { assembleKernels: () => Promise<Record<string, Buffer>> };

describe('WebAssembly kernels of k-means', () => {
  it('are assembled from their WebAssembly text: the committed binaries match the .wat files', async () => {
    const fresh = await assembleKernels();
    expect(Object.keys(fresh).sort()).toEqual(Object.keys(ASSEMBLED_KERNELS).sort());
    for (const [name, bytes] of Object.entries(fresh)) {
      expect(bytes.toString('base64'), name).toBe(ASSEMBLED_KERNELS[name as KernelName]);
    }
  });

  it('compile on this platform and export their one function over an imported memory', () => {
    const exported: Record<KernelName, string> = {
      'trial-totals': 'trialTotals', take: 'take', 'segment-sums': 'segmentSums', 'pair-scan': 'pairScan', 'bound-pass': 'boundPass',
    }; // prettier-ignore
    for (const [name, fn] of Object.entries(exported)) {
      const module = kernelModule(name as KernelName)!;
      expect(module, name).toBeDefined();
      expect(WebAssembly.Module.exports(module)).toEqual([{ name: fn, kind: 'function' }]);
      expect(WebAssembly.Module.imports(module)).toEqual([{ module: 'env', name: 'memory', kind: 'memory' }]);
    }
  });
});
