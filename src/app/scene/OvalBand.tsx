/** The oval band in both hemispheres at the footpoint altitude, with its two edges. */
import { useEffect, useMemo } from 'react';
import { useThree } from '@react-three/fiber';
import * as THREE from 'three';
import { ovalBandMesh } from '../lib/sphere';
import { OVAL_COLOURS } from '../lib/palette';
import { RE_KM } from '../../physics/constants';
import { store, useStore } from '../store';
import { awaitDraw, noteStep } from '../perf';

export function OvalBand() {
  const oval = useStore((s) => s.oval);
  const altKm = useStore((s) => s.products.altKm);
  const invalidate = useThree((s) => s.invalidate);
  const parts = useMemo(() => {
    if (!oval) return [];
    const r = 1 + Math.max(altKm, 15) / RE_KM; // lift ground-level bands just clear of the globe
    const built = oval.curves.map((c) => {
      const m = ovalBandMesh(c, r);
      const band = new THREE.BufferGeometry();
      band.setAttribute('position', new THREE.BufferAttribute(m.positions, 3));
      band.setIndex(new THREE.BufferAttribute(m.index, 1));
      const edges = new THREE.BufferGeometry();
      edges.setAttribute('position', new THREE.BufferAttribute(m.edges, 3));
      return { key: c.hemisphere, band, edges };
    });
    noteStep('oval', store.get().ovalSeq, 'built');
    return built;
  }, [oval, altKm]);
  useEffect(() => {
    awaitDraw('oval', store.get().ovalSeq);
    invalidate();
    return () => parts.forEach((p) => (p.band.dispose(), p.edges.dispose()));
  }, [parts, invalidate]);
  return (
    <group name="oval">
      {parts.map((p) => (
        <group key={p.key}>
          <mesh geometry={p.band} renderOrder={1}>
            <meshBasicMaterial color={OVAL_COLOURS.band} transparent opacity={0.4} side={THREE.DoubleSide} depthWrite={false} />
          </mesh>
          <lineSegments geometry={p.edges}>
            <lineBasicMaterial color="#e6ddff" transparent opacity={0.9} />
          </lineSegments>
        </group>
      ))}
    </group>
  );
}
