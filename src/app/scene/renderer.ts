/**
 * Whether WebGL runs on a software rasteriser here (no GPU: virtual machines,
 * remote desktops, headless browsers). There every frame is drawn on the CPU and
 * multisampled antialiasing costs about 4× a plain frame (measured with
 * SwiftShader at 714×398 px: ~200 ms vs ~50 ms per frame), so the 3D view drops
 * it and draws at one device pixel per CSS pixel.
 */

/** Renderer names of the common software rasterisers (WebGL's UNMASKED_RENDERER_WEBGL or RENDERER string). */
const SOFTWARE_RENDERERS = /swiftshader|llvmpipe|softpipe|software|basic render driver/i;

/** Whether a WebGL renderer name is a software rasteriser's. */
export function isSoftwareRenderer(name: string): boolean {
  return SOFTWARE_RENDERERS.test(name);
}

let cached: boolean | undefined;

/** Probe once with a throw-away context: is WebGL software-rendered? (false when unknown) */
export function softwareRendered(): boolean {
  if (cached !== undefined) return cached;
  cached = false;
  try {
    const canvas = document.createElement('canvas');
    const gl = (canvas.getContext('webgl2') ?? canvas.getContext('webgl')) as WebGLRenderingContext | null;
    if (gl) {
      const info = gl.getExtension('WEBGL_debug_renderer_info');
      const name = String(gl.getParameter(info ? info.UNMASKED_RENDERER_WEBGL : gl.RENDERER) ?? '');
      cached = isSoftwareRenderer(name);
      gl.getExtension('WEBGL_lose_context')?.loseContext();
    }
  } catch {
    cached = false;
  }
  return cached;
}
