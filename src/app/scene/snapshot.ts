/** PNG of the 3D view: the scene registers a render-then-toDataURL function here. */
let snap: (() => string) | null = null;

export function setSnapshotter(fn: (() => string) | null): void {
  snap = fn;
}

/** data: URL of a fresh render of the 3D view, or null before the scene is up. */
export function snapshotPng(): string | null {
  return snap ? snap() : null;
}
