/** The globe: land/ocean texture drawn from world-atlas, day/night from the Sun direction, coastlines. */
import { useEffect, useMemo } from 'react';
import { useThree, type ThreeEvent } from '@react-three/fiber';
import * as THREE from 'three';
import { geoEquirectangular, geoPath } from 'd3-geo';
import { coastSegments, landFeature } from '../lib/atlas';
import { BASE_COLOURS } from '../lib/palette';
import { useStore } from '../store';
import { addSiteAt } from '../sites';
import { geodeticFromGeo } from '../../physics/frames/geodesy';

function landTexture(): THREE.Texture {
  const w = 2048;
  const h = 1024;
  const canvas = document.createElement('canvas');
  canvas.width = w;
  canvas.height = h;
  const ctx = canvas.getContext('2d')!;
  ctx.fillStyle = BASE_COLOURS.ocean;
  ctx.fillRect(0, 0, w, h);
  const path = geoPath(geoEquirectangular().scale(w / (2 * Math.PI)).translate([w / 2, h / 2]).precision(0.5), ctx);
  ctx.beginPath();
  path(landFeature());
  ctx.fillStyle = BASE_COLOURS.land;
  ctx.fill();
  const tex = new THREE.CanvasTexture(canvas);
  tex.colorSpace = THREE.SRGBColorSpace;
  tex.minFilter = THREE.LinearFilter; // no mipmaps: avoids a seam where atan wraps
  tex.generateMipmaps = false;
  return tex;
}

const vertex = /* glsl */ `
varying vec3 vP;
void main() { vP = position; gl_Position = projectionMatrix * modelViewMatrix * vec4(position, 1.0); }`;

const fragment = /* glsl */ `
uniform sampler2D land;
uniform vec3 sun;
varying vec3 vP;
const float PI = 3.141592653589793;
void main() {
  vec3 n = normalize(vP);
  vec2 uv = vec2(atan(n.y, n.x) / (2.0 * PI) + 0.5, asin(clamp(n.z, -1.0, 1.0)) / PI + 0.5);
  vec3 c = texture2D(land, uv).rgb;
  float d = dot(n, sun);
  float day = smoothstep(-0.08, 0.08, d);
  // Linear light (the output is sRGB-encoded below): 0.045 reads as a dim night side.
  vec3 night = c * 0.045 + vec3(0.0, 0.002, 0.008);
  vec3 lit = c * (0.6 + 0.4 * max(d, 0.0));
  gl_FragColor = vec4(mix(night, lit, day), 1.0);
  #include <colorspace_fragment>
}`;

export function Earth() {
  const sun = useStore((s) => s.scene?.frames.sunGeo);
  const invalidate = useThree((s) => s.invalidate);
  const material = useMemo(
    () => new THREE.ShaderMaterial({ vertexShader: vertex, fragmentShader: fragment, uniforms: { land: { value: landTexture() }, sun: { value: new THREE.Vector3(1, 0, 0) } } }),
    [],
  );
  const coast = useMemo(() => {
    const g = new THREE.BufferGeometry();
    g.setAttribute('position', new THREE.BufferAttribute(coastSegments(1.002), 3));
    return g;
  }, []);
  useEffect(() => {
    if (sun) (material.uniforms.sun.value as THREE.Vector3).set(sun[0], sun[1], sun[2]);
    invalidate();
  }, [sun, material, invalidate]);
  useEffect(() => () => { material.uniforms.land.value.dispose(); material.dispose(); coast.dispose(); }, [material, coast]);

  const onClick = (e: ThreeEvent<MouseEvent>) => {
    if (e.delta > 4 || !e.nativeEvent.shiftKey) return; // shift-click adds a site; plain drags orbit
    e.stopPropagation();
    const p = e.point;
    const g = geodeticFromGeo(p.x, p.y, p.z);
    addSiteAt(g.latDeg, g.lonDeg);
  };

  return (
    <group>
      <mesh material={material} onClick={onClick} name="earth">
        <sphereGeometry args={[1, 128, 64]} />
      </mesh>
      <lineSegments geometry={coast}>
        <lineBasicMaterial color={BASE_COLOURS.coast} transparent opacity={0.85} />
      </lineSegments>
    </group>
  );
}
