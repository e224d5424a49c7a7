/** The fan of field lines, one draw call, coloured per vertex by line type. */
import { useEffect, useMemo } from 'react';
import { useThree } from '@react-three/fiber';
import { store, useStore } from '../store';
import { awaitDraw, noteStep } from '../perf';
import { SegmentBuffers } from './reusedGeometry';

export function FieldLines() {
  const lines = useStore((s) => s.scene?.lines);
  const show = useStore((s) => s.view.fan);
  const invalidate = useThree((s) => s.invalidate);
  // One geometry kept from answer to answer, refilled in place (a new object only when an answer outgrows it).
  const buffers = useMemo(() => new SegmentBuffers(), []);
  useEffect(() => () => buffers.dispose(), [buffers]);
  const geom = useMemo(() => {
    if (!lines) return null;
    const g = buffers.set(lines);
    noteStep('scene', store.get().sceneSeq, 'built');
    return g;
  }, [lines, buffers]);
  useEffect(() => {
    awaitDraw('scene', store.get().sceneSeq);
    invalidate();
  }, [lines, invalidate]);
  if (!geom || !show) return null;
  return (
    <lineSegments geometry={geom} name="field-lines">
      <lineBasicMaterial vertexColors transparent opacity={0.8} />
    </lineSegments>
  );
}
