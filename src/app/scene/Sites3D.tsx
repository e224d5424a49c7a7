/** Site markers, their field lines and their conjugate points. */
import { useEffect, useMemo } from 'react';
import { useThree } from '@react-three/fiber';
import * as THREE from 'three';
import { geoFromGeodetic } from '../../physics/frames/geodesy';
import { SITE_COLOURS } from '../lib/palette';
import { useStore } from '../store';

const tmp = new Float64Array(3);
const lineMaterial = new THREE.LineBasicMaterial({ color: '#ffe9f4' });

export function Sites3D() {
  const sites = useStore((s) => s.sites);
  const results = useStore((s) => s.siteResults);
  const invalidate = useThree((s) => s.invalidate);
  const markers = useMemo(
    () => sites.map((s) => { geoFromGeodetic(tmp, s.latDeg, s.lonDeg, 0); return new THREE.Vector3(tmp[0], tmp[1], tmp[2]).multiplyScalar(1.004); }),
    [sites],
  );
  const extra = useMemo(() => {
    const out: { line: THREE.Line; conj: THREE.Vector3 | null }[] = [];
    for (const r of results?.sites ?? []) {
      if (r.lineGeo.length < 6) continue;
      const line = new THREE.BufferGeometry();
      line.setAttribute('position', new THREE.BufferAttribute(new Float32Array(r.lineGeo), 3));
      let conj: THREE.Vector3 | null = null;
      if (r.conjugate) {
        geoFromGeodetic(tmp, r.conjugate.geoLatDeg, r.conjugate.geoLonDeg, r.conjugate.altKm);
        conj = new THREE.Vector3(tmp[0], tmp[1], tmp[2]).multiplyScalar(1.004);
      }
      out.push({ line: new THREE.Line(line, lineMaterial), conj });
    }
    return out;
  }, [results]);
  useEffect(() => {
    invalidate();
    return () => extra.forEach((e) => e.line.geometry.dispose());
  }, [markers, extra, invalidate]);
  return (
    <group name="sites">
      {markers.map((p, i) => (
        <mesh key={`s${i}`} position={p}>
          <sphereGeometry args={[0.018, 12, 8]} />
          <meshBasicMaterial color={SITE_COLOURS.site} />
        </mesh>
      ))}
      {extra.map((e, i) => (
        <group key={`l${i}`}>
          <primitive object={e.line} />
          {e.conj && (
            <mesh position={e.conj}>
              <sphereGeometry args={[0.02, 12, 8]} />
              <meshBasicMaterial color={SITE_COLOURS.conjugate} />
            </mesh>
          )}
        </group>
      ))}
    </group>
  );
}
