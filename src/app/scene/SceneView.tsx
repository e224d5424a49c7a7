/** The 3D view: GEO frame (Earth fixed, z to the north pole), rendered on demand. */
import { useEffect, useMemo } from 'react';
import { Canvas, useFrame, useThree } from '@react-three/fiber';
import { frameRendered } from '../perf';
import { useStore } from '../store';
import { setSnapshotter } from './snapshot';
import { Earth } from './Earth';
import { Graticules } from './Graticules';
import { Axes } from './Axes';
import { Magnetopause } from './Magnetopause';
import { FieldLines } from './FieldLines';
import { OvalBand } from './OvalBand';
import { Sites3D } from './Sites3D';
import { CameraRig } from './CameraRig';
import { softwareRendered } from './renderer';

/** Takes over rendering (priority 1) so the timing marks land after gl.render. */
function RenderAndMark() {
  useFrame(({ gl, scene, camera }) => {
    const t = performance.now();
    gl.render(scene, camera);
    frameRendered(performance.now() - t, gl.info.render.calls, gl.info.render.triangles + gl.info.render.lines);
  }, 1);
  return null;
}

/**
 * Draws a new scene or oval answer at once instead of at the next animation frame: the last child
 * of the canvas, so its effect runs after every part has put its new geometry in place; drawing
 * uses up the frame those parts asked for (invalidate), so nothing is drawn twice. The new lines
 * reach the screen up to one frame sooner.
 */
function DrawAnswers() {
  const scene = useStore((s) => s.scene);
  const oval = useStore((s) => s.oval);
  const advance = useThree((s) => s.advance);
  useEffect(() => {
    if (scene || oval) advance(performance.now());
  }, [scene, oval, advance]);
  return null;
}

/** Registers render-then-read for the PNG export (no preserveDrawingBuffer needed). */
function Snapshot() {
  const gl = useThree((s) => s.gl);
  const scene = useThree((s) => s.scene);
  const camera = useThree((s) => s.camera);
  useEffect(() => {
    setSnapshotter(() => {
      gl.render(scene, camera);
      return gl.domElement.toDataURL('image/png');
    });
    return () => setSnapshotter(null);
  }, [gl, scene, camera]);
  return null;
}

export function SceneView() {
  // Without a GPU every frame is drawn on the CPU: no multisampling, one pixel per CSS pixel.
  const soft = useMemo(softwareRendered, []);
  return (
    <Canvas
      frameloop="demand"
      gl={{ antialias: !soft }}
      camera={{ fov: 40, near: 0.05, far: 1000, position: [-14, 22, 9] }}
      dpr={soft ? 1 : [1, 2]}
      data-renderer={soft ? 'software' : 'gpu'}
      aria-label="3D view of field lines, oval and magnetopause (GEO frame)"
    >
      <color attach="background" args={['#070b14']} />
      <RenderAndMark />
      <Snapshot />
      <CameraRig />
      <Earth />
      <Graticules />
      <Axes />
      <OvalBand />
      <FieldLines />
      <Sites3D />
      <Magnetopause />
      <DrawAnswers />
    </Canvas>
  );
}
