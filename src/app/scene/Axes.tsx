/** The dipole axis with its poles, and an arrow toward the Sun. */
import { useEffect, useMemo } from 'react';
import { useThree } from '@react-three/fiber';
import * as THREE from 'three';
import { useStore } from '../store';

export function Axes() {
  const frames = useStore((s) => s.scene?.frames);
  const invalidate = useThree((s) => s.invalidate);
  const objs = useMemo(() => {
    if (!frames) return null;
    const a = new THREE.Vector3(frames.axisGeo[0], frames.axisGeo[1], frames.axisGeo[2]).normalize();
    const s = new THREE.Vector3(frames.sunGeo[0], frames.sunGeo[1], frames.sunGeo[2]).normalize();
    const axisGeom = new THREE.BufferGeometry().setFromPoints([a.clone().multiplyScalar(-1.8), a.clone().multiplyScalar(1.8)]);
    const sun = new THREE.ArrowHelper(s, s.clone().multiplyScalar(1.15), 1.7, 0xffd24a, 0.3, 0.14);
    return { a, axisGeom, sun };
  }, [frames]);
  useEffect(() => {
    invalidate();
    return () => {
      objs?.axisGeom.dispose();
      objs?.sun.dispose();
    };
  }, [objs, invalidate]);
  if (!objs) return null;
  return (
    <group>
      <lineSegments geometry={objs.axisGeom} name="dipole-axis">
        <lineBasicMaterial color="#ff7b5c" />
      </lineSegments>
      <mesh position={objs.a.clone().multiplyScalar(1.02)}>
        <sphereGeometry args={[0.035, 16, 8]} />
        <meshBasicMaterial color="#ff7b5c" />
      </mesh>
      <mesh position={objs.a.clone().multiplyScalar(-1.02)}>
        <sphereGeometry args={[0.035, 16, 8]} />
        <meshBasicMaterial color="#5ca8ff" />
      </mesh>
      <primitive object={objs.sun} />
    </group>
  );
}
