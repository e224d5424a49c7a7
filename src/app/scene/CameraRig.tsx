/**
 * Orbit/zoom/pan (three's OrbitControls), the preset viewpoints driven from the
 * store, and the keyboard: the canvas takes focus; arrows turn and tilt the
 * view about the target, + and − zoom, 0 or Home go back to the first view.
 */
import { useEffect } from 'react';
import { useThree } from '@react-three/fiber';
import * as THREE from 'three';
import { OrbitControls } from 'three/examples/jsm/controls/OrbitControls.js';
import { store } from '../store';
import { RAD_PER_DEG } from '../../physics/constants';

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

const TURN_RAD = 10 * RAD_PER_DEG;
const ZOOM_STEP = 0.85;
/** Polar-angle limits (from +z) kept by the tilt keys, rad. */
const POLAR_MIN = 0.05;
const POLAR_MAX = Math.PI - 0.05;

/** Camera offset from the target after one key; null for keys the view does not use. */
export function keyMove(key: string, offset: THREE.Vector3, minDist: number, maxDist: number): THREE.Vector3 | 'reset' | null {
  const z = new THREE.Vector3(0, 0, 1);
  const o = offset.clone();
  switch (key) {
    case 'ArrowLeft': return o.applyAxisAngle(z, -TURN_RAD);
    case 'ArrowRight': return o.applyAxisAngle(z, TURN_RAD);
    case 'ArrowUp':
    case 'ArrowDown': {
      const polar = o.angleTo(z);
      const want = Math.min(POLAR_MAX, Math.max(POLAR_MIN, polar + (key === 'ArrowUp' ? -TURN_RAD : TURN_RAD)));
      const axis = new THREE.Vector3().crossVectors(z, o);
      if (axis.lengthSq() < 1e-12) axis.set(0, 1, 0);
      return o.applyAxisAngle(axis.normalize(), want - polar);
    }
    case '+':
    case '=':
      return o.setLength(Math.max(minDist, o.length() * ZOOM_STEP));
    case '-':
    case '_':
      return o.setLength(Math.min(maxDist, o.length() / ZOOM_STEP));
    case '0':
    case 'Home':
      return 'reset';
    default:
      return null;
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
    // The camera position as text on the canvas (the e2e tests read it).
    const mark = () => { dom.dataset.camera = camera.position.toArray().map((v) => v.toFixed(3)).join(','); };
    controls.addEventListener('change', () => { mark(); invalidate(); });
    const go = (p: ViewPreset) => {
      camera.position.copy(presetPosition(p));
      controls.target.set(0, 0, 0);
      controls.update();
      mark();
      invalidate();
    };
    dom.tabIndex = 0;
    dom.setAttribute('role', 'application');
    dom.setAttribute('aria-roledescription', '3D view');
    dom.setAttribute('aria-label', '3D view of field lines, oval and magnetopause: arrow keys turn and tilt, + and − zoom, 0 or Home resets, ? lists the keys');
    const onKey = (e: KeyboardEvent) => {
      if (e.altKey || e.ctrlKey || e.metaKey) return;
      const next = keyMove(e.key, camera.position.clone().sub(controls.target), controls.minDistance, controls.maxDistance);
      if (!next) return;
      e.preventDefault();
      if (next === 'reset') return go('overview');
      camera.position.copy(controls.target).add(next);
      controls.update();
      mark();
      invalidate();
    };
    dom.addEventListener('keydown', onKey);
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
      dom.removeEventListener('keydown', onKey);
      unsub();
      controls.dispose();
    };
  }, [camera, dom, invalidate]);
  return null;
}
