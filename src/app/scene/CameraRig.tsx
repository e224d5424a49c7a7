/** Orbit/zoom/pan (three's OrbitControls) and the preset viewpoints, driven from the store. */
import { useEffect } from 'react';
import { useThree } from '@react-three/fiber';
import * as THREE from 'three';
import { OrbitControls } from 'three/examples/jsm/controls/OrbitControls.js';
import { store } from '../store';

type ViewPreset = 'overview' | 'dayside' | 'nightside' | 'north' | 'south';

export const VIEW_PRESETS: { id: ViewPreset; label: string }[] = [
  { id: 'overview', label: 'Overview' },
  { id: 'dayside', label: 'From the Sun' },
  { id: 'nightside', label: 'Night side' },
  { id: 'north', label: 'North pole' },
  { id: 'south', label: 'South pole' },
];

const listeners = new Set<(p: ViewPreset) => void>();
/** Ask the rig to move the camera (called by the preset buttons outside the canvas). */
export function requestView(p: ViewPreset): void {
  listeners.forEach((fn) => fn(p));
}

function presetPosition(p: ViewPreset): THREE.Vector3 {
  const sg = store.get().scene?.frames.sunGeo;
  const sun = sg ? new THREE.Vector3(sg[0], sg[1], sg[2]).normalize() : new THREE.Vector3(1, 0, 0);
  const z = new THREE.Vector3(0, 0, 1);
  const dusk = new THREE.Vector3().crossVectors(z, sun).normalize();
  switch (p) {
    case 'dayside': return sun.clone().multiplyScalar(7).addScaledVector(dusk, 2.5).addScaledVector(z, 1.2);
    case 'nightside': return sun.clone().multiplyScalar(-6).addScaledVector(z, 1.5);
    case 'north': return z.clone().multiplyScalar(4.5).addScaledVector(sun, -0.05);
    case 'south': return z.clone().multiplyScalar(-4.5).addScaledVector(sun, -0.05);
    default: return sun.clone().multiplyScalar(-11).addScaledVector(dusk, 22).addScaledVector(z, 9);
  }
}

export function CameraRig() {
  const camera = useThree((s) => s.camera);
  const dom = useThree((s) => s.gl.domElement);
  const invalidate = useThree((s) => s.invalidate);
  useEffect(() => {
    camera.up.set(0, 0, 1);
    const controls = new OrbitControls(camera, dom);
    controls.minDistance = 1.3;
    controls.maxDistance = 120;
    controls.addEventListener('change', () => invalidate());
    const go = (p: ViewPreset) => {
      camera.position.copy(presetPosition(p));
      controls.target.set(0, 0, 0);
      controls.update();
      invalidate();
    };
    listeners.add(go);
    // First view once the Sun direction is known.
    let placed = false;
    const unsub = store.subscribe((s) => {
      if (!placed && s.scene) {
        placed = true;
        go('overview');
      }
    });
    go('overview');
    return () => {
      listeners.delete(go);
      unsub();
      controls.dispose();
    };
  }, [camera, dom, invalidate]);
  return null;
}
