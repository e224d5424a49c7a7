/**
 * The dipole axis with its poles, and an arrow toward the Sun. The three.js
 * objects are made once and moved when the frames change: disposing the
 * arrow's materials on every answer released their shader programs, and
 * compiling them again cost a software renderer hundreds of ms per change.
 */
import { useEffect, useMemo } from 'react';
import { useThree } from '@react-three/fiber';
import * as THREE from 'three';
import { useStore } from '../store';

const AXIS_HALF_LENGTH = 1.8;
const POLE_RADIUS = 1.02;

export function Axes() {
  const frames = useStore((s) => s.scene?.frames);
  const invalidate = useThree((s) => s.invalidate);
  const objs = useMemo(() => {
    const axisGeom = new THREE.BufferGeometry();
    axisGeom.setAttribute('position', new THREE.BufferAttribute(new Float32Array(6), 3));
    const sun = new THREE.ArrowHelper(new THREE.Vector3(1, 0, 0), new THREE.Vector3(1.15, 0, 0), 1.7, 0xffd24a, 0.3, 0.14);
    return { axisGeom, sun };
  }, []);
  useEffect(() => () => { objs.axisGeom.dispose(); objs.sun.dispose(); }, [objs]);
  // Move the objects to the frames of the answer (a new frames object only when they changed).
  const placed = useMemo(() => {
    if (!frames) return null;
    const a = new THREE.Vector3(frames.axisGeo[0], frames.axisGeo[1], frames.axisGeo[2]).normalize();
    const s = new THREE.Vector3(frames.sunGeo[0], frames.sunGeo[1], frames.sunGeo[2]).normalize();
    const pos = objs.axisGeom.getAttribute('position') as THREE.BufferAttribute;
    pos.setXYZ(0, -AXIS_HALF_LENGTH * a.x, -AXIS_HALF_LENGTH * a.y, -AXIS_HALF_LENGTH * a.z);
    pos.setXYZ(1, AXIS_HALF_LENGTH * a.x, AXIS_HALF_LENGTH * a.y, AXIS_HALF_LENGTH * a.z);
    pos.needsUpdate = true;
    objs.axisGeom.computeBoundingSphere();
    objs.sun.setDirection(s);
    objs.sun.position.copy(s).multiplyScalar(1.15);
    // The pole markers' positions as new arrays (r3f applies a prop when its value changes).
    return { north: [POLE_RADIUS * a.x, POLE_RADIUS * a.y, POLE_RADIUS * a.z] as const, south: [-POLE_RADIUS * a.x, -POLE_RADIUS * a.y, -POLE_RADIUS * a.z] as const };
  }, [frames, objs]);
  useEffect(() => invalidate(), [frames, invalidate]);
  if (!placed) return null;
  return (
    <group>
      <lineSegments geometry={objs.axisGeom} name="dipole-axis">
        <lineBasicMaterial color="#ff7b5c" />
      </lineSegments>
      <mesh position={placed.north}>
        <sphereGeometry args={[0.035, 16, 8]} />
        <meshBasicMaterial color="#ff7b5c" />
      </mesh>
      <mesh position={placed.south}>
        <sphereGeometry args={[0.035, 16, 8]} />
        <meshBasicMaterial color="#5ca8ff" />
      </mesh>
      <primitive object={objs.sun} />
    </group>
  );
}
