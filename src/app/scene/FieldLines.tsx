/** The fan of field lines, one draw call, coloured per vertex by line type. */
import { useEffect, useMemo } from 'react';
import { useThree } from '@react-three/fiber';
import * as THREE from 'three';
import { bundleSegments } from '../lib/sphere';
import { store, useStore } from '../store';
import { awaitDraw, noteStep } from '../perf';

export function FieldLines() {
  const lines = useStore((s) => s.scene?.lines);
  const show = useStore((s) => s.view.fan);
  const invalidate = useThree((s) => s.invalidate);
  const geom = useMemo(() => {
    if (!lines) return null;
    const { positions, colours, index } = bundleSegments(lines);
    const g = new THREE.BufferGeometry();
    g.setAttribute('position', new THREE.BufferAttribute(positions, 3));
    g.setAttribute('color', new THREE.BufferAttribute(colours, 3));
    g.setIndex(new THREE.BufferAttribute(index, 1));
    noteStep('scene', store.get().sceneSeq, 'built');
    return g;
  }, [lines]);
  useEffect(() => {
    awaitDraw('scene', store.get().sceneSeq);
    invalidate();
    return () => geom?.dispose();
  }, [geom, invalidate]);
  if (!geom || !show) return null;
  return (
    <lineSegments geometry={geom} name="field-lines">
      <lineBasicMaterial vertexColors transparent opacity={0.8} />
    </lineSegments>
  );
}
