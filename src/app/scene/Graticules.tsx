/** Geographic graticule (always) and magnetic graticule (switchable, from FrameInfo.axisGeo). */
import { useEffect, useMemo } from 'react';
import { useThree } from '@react-three/fiber';
import * as THREE from 'three';
import { graticuleSegments } from '../lib/sphere';
import { useStore } from '../store';

function useSegments(arr: Float32Array | null) {
  const geom = useMemo(() => {
    if (!arr) return null;
    const g = new THREE.BufferGeometry();
    g.setAttribute('position', new THREE.BufferAttribute(arr, 3));
    return g;
  }, [arr]);
  const invalidate = useThree((s) => s.invalidate);
  useEffect(() => {
    invalidate();
    return () => geom?.dispose();
  }, [geom, invalidate]);
  return geom;
}

export function Graticules() {
  const axis = useStore((s) => s.scene?.frames.axisGeo);
  const showMag = useStore((s) => s.view.magGraticule);
  const geo = useSegments(useMemo(() => graticuleSegments(1.003, 30, 30), []));
  const mag = useSegments(useMemo(() => (axis && showMag ? graticuleSegments(1.004, 10, 30, axis) : null), [axis, showMag]));
  return (
    <group>
      {geo && (
        <lineSegments geometry={geo}>
          <lineBasicMaterial color="#8aa4c0" transparent opacity={0.35} />
        </lineSegments>
      )}
      {mag && (
        <lineSegments geometry={mag} name="magnetic-graticule">
          <lineBasicMaterial color="#e0c060" transparent opacity={0.55} />
        </lineSegments>
      )}
    </group>
  );
}
