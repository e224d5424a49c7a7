/** The magnetopause as a translucent surface drawn from the worker's r0 and α. */
import { useEffect, useMemo } from 'react';
import { useThree } from '@react-three/fiber';
import * as THREE from 'three';
import { useStore } from '../store';
import { SurfaceBuffers } from './reusedGeometry';

export function Magnetopause() {
  const mp = useStore((s) => s.scene?.magnetopause);
  const m = useStore((s) => s.scene?.frames.geoFromGsm);
  const show = useStore((s) => s.view.magnetopauseSurface);
  const invalidate = useThree((s) => s.invalidate);
  // One geometry for every shape: a new r0 or α rewrites its vertices (the triangles stay).
  const buffers = useMemo(() => new SurfaceBuffers(), []);
  useEffect(() => () => buffers.dispose(), [buffers]);
  const geom = useMemo(() => {
    if (!mp || !m || !mp.enabled || !Number.isFinite(mp.r0Re) || !Number.isFinite(mp.alpha)) return null;
    return buffers.set(mp.r0Re, mp.alpha, m);
  }, [mp, m, buffers]);
  useEffect(() => {
    invalidate();
  }, [mp, m, invalidate]);
  if (!geom || !show) return null;
  return (
    <group name="magnetopause">
      <mesh geometry={geom} renderOrder={2}>
        <meshBasicMaterial color="#6fa8ff" transparent opacity={0.09} side={THREE.DoubleSide} depthWrite={false} />
      </mesh>
      <mesh geometry={geom} renderOrder={3}>
        <meshBasicMaterial color="#6fa8ff" wireframe transparent opacity={0.035} depthWrite={false} />
      </mesh>
    </group>
  );
}
