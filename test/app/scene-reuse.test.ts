import { describe, it, expect } from 'vitest';
import { sameFrames } from '../../src/app/engine';
import { isSoftwareRenderer } from '../../src/app/scene/renderer';
import { createEngineApi } from '../../workers/engine-api';

const C = { time: '2025-03-20T22:00:00Z', pdynNpa: 3, bzNt: -5, byNt: 2, internal: 'dipole' as const, magnetopause: true, imfEfficiency: 0.2, tail: false };
const FAN = { mltHours: [0, 12], magLatDeg: [65, 75] };

describe('scene answers: unchanged frames keep their object', () => {
  it('a pressure step leaves the frame block equal (the client keeps the old object); a time step does not', async () => {
    const api = createEngineApi();
    const a = await api.scene(1, C, FAN);
    const b = await api.scene(2, { ...C, pdynNpa: 6 }, FAN);
    const c = await api.scene(3, { ...C, time: '2025-03-20T23:00:00Z' }, FAN);
    expect(sameFrames(a.frames, b.frames)).toBe(true);
    expect(sameFrames(a.frames, c.frames)).toBe(false);
    // One element of one array, or NaN against a number, makes them differ; NaN equals NaN (empty answers).
    const d = { ...a.frames, sunGeo: Float64Array.from(a.frames.sunGeo) };
    d.sunGeo[2] += 1e-12;
    expect(sameFrames(a.frames, d)).toBe(false);
    expect(sameFrames(a.frames, { ...a.frames, tiltDeg: NaN })).toBe(false);
    expect(sameFrames({ ...a.frames, tiltDeg: NaN }, { ...a.frames, tiltDeg: NaN })).toBe(true);
  });
});

describe('software renderer detection', () => {
  it('names the common CPU rasterisers as software and GPU drivers not', () => {
    for (const n of ['ANGLE (Google, Vulkan 1.3.0 (SwiftShader Device (Subzero) (0x0000C0DE)), SwiftShader driver)', 'llvmpipe (LLVM 15.0.6, 256 bits)', 'Microsoft Basic Render Driver', 'softpipe']) expect(isSoftwareRenderer(n), n).toBe(true);
    for (const n of ['ANGLE (NVIDIA, NVIDIA GeForce RTX 3060 Direct3D11 vs_5_0 ps_5_0, D3D11)', 'Apple M2', 'Mesa Intel(R) UHD Graphics 620 (KBL GT2)', 'WebKit WebGL']) expect(isSoftwareRenderer(n), n).toBe(false);
  });
});
