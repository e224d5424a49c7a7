/** The magnetopause as a translucent surface drawn from the worker's r0 and α. */
import { useEffect, useMemo } from 'react';
import { useThree } from '@react-three/fiber';
import * as THREE from 'three';
import { magnetopauseMesh } from '../lib/sphere';
import { useStore } from '../store';

export function Magnetopause() {
  const mp = useStore((s) => s.scene?.magnetopause);
  const m = useStore((s) => s.scene?.frames.geoFromGsm);
  const show = useStore((s) => s.view.magnetopauseSurface);
  const invalidate = useThree((s) => s.invalidate);
  const geom = useMemo(() => {
    if (!mp || !m || !mp.enabled || !Number.isFinite(mp.r0Re) || !Number.isFinite(mp.alpha)) return null;
    const { positions, index } = magnetopauseMesh(mp.r0Re, mp.alpha, m);
    const g = new THREE.BufferGeometry();
    g.setAttribute('position', new THREE.BufferAttribute(positions, 3));
    g.setIndex(new THREE.BufferAttribute(index, 1));
    return g;
  }, [mp, m]);
  useEffect(() => {
    invalidate();
    return () => geom?.dispose();
  }, [geom, invalidate]);
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
