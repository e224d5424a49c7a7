/** The 3D view: GEO frame (Earth fixed, z to the north pole), rendered on demand. */
import { Canvas } from '@react-three/fiber';
import { Earth } from './Earth';
import { Graticules } from './Graticules';
import { Axes } from './Axes';
import { Magnetopause } from './Magnetopause';
import { FieldLines } from './FieldLines';
import { OvalBand } from './OvalBand';
import { Sites3D } from './Sites3D';
import { CameraRig } from './CameraRig';

export function SceneView() {
  return (
    <Canvas
      frameloop="demand"
      gl={{ preserveDrawingBuffer: true, antialias: true }}
      camera={{ fov: 40, near: 0.05, far: 1000, position: [-14, 22, 9] }}
      dpr={[1, 2]}
      aria-label="3D view of field lines, oval and magnetopause (GEO frame)"
    >
      <color attach="background" args={['#070b14']} />
      <CameraRig />
      <Earth />
      <Graticules />
      <Axes />
      <OvalBand />
      <FieldLines />
      <Sites3D />
      <Magnetopause />
    </Canvas>
  );
}
