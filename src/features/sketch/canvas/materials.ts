import {
  BackSide,
  Color,
  DataTexture,
  FrontSide,
  MeshBasicMaterial,
  MeshLambertMaterial,
  RGBAFormat,
  RepeatWrapping,
  SRGBColorSpace,
  type Material,
} from 'three';
import type { CheckStatus } from '@shared/engine/types';
import { HOVER_LIGHTEN, SELECTED_LIGHTEN, STATUS_STYLES, type StatusPattern } from './status-style';

/*
 * Shared textures and materials: one pattern texture per status pattern and one material per
 * (status, highlight), so a sketch of a thousand elements uses at most 15 materials. Pipe
 * geometry carries UVs with u = around the pipe (3 tiles per turn) and v = along it (one
 * tile per outside diameter), so patterns keep their size on every element.
 */

const SIZE = 32;
const LIGHT = 255;
const DARK = 110;

function patternValue(pattern: StatusPattern, x: number, y: number): number {
  switch (pattern) {
    case 'solid':
      return LIGHT;
    case 'bands': // rings around the pipe: a quarter of each tile
      return y < SIZE / 4 ? DARK : LIGHT;
    case 'hatch': // helical stripes
      return (x + y) % (SIZE / 2) < SIZE / 6 ? DARK : LIGHT;
    case 'dots': {
      const dx = (x % (SIZE / 2)) - SIZE / 4 + 0.5;
      const dy = (y % (SIZE / 2)) - SIZE / 4 + 0.5;
      return dx * dx + dy * dy < (SIZE / 9) ** 2 ? DARK : LIGHT;
    }
    case 'dashes': // dashes along the pipe
      return x % (SIZE / 2) < SIZE / 5 && y < (SIZE * 2) / 3 ? DARK : LIGHT;
  }
}

const textures = new Map<StatusPattern, DataTexture>();

/** A small grey-scale tile for a pattern (white = surface colour, grey = mark). */
export function patternTexture(pattern: StatusPattern): DataTexture {
  let tex = textures.get(pattern);
  if (tex) return tex;
  const data = new Uint8Array(SIZE * SIZE * 4);
  for (let y = 0; y < SIZE; y++) {
    for (let x = 0; x < SIZE; x++) {
      const v = patternValue(pattern, x, y);
      const i = (y * SIZE + x) * 4;
      data[i] = v;
      data[i + 1] = v;
      data[i + 2] = v;
      data[i + 3] = 255;
    }
  }
  tex = new DataTexture(data, SIZE, SIZE, RGBAFormat);
  tex.wrapS = RepeatWrapping;
  tex.wrapT = RepeatWrapping;
  tex.colorSpace = SRGBColorSpace;
  tex.generateMipmaps = true;
  tex.needsUpdate = true;
  textures.set(pattern, tex);
  return tex;
}

export type Highlight = 'none' | 'hover' | 'selected';
const materials = new Map<string, MeshBasicMaterial>();

/**
 * The shared material of a status in a highlight state: unlit, shaded by the geometry's baked
 * vertex colours (see `bakeLighting`), patterned by the status texture; highlights lighten it.
 */
export function statusMaterial(
  status: CheckStatus,
  highlight: Highlight = 'none',
): MeshBasicMaterial {
  const key = `${status}:${highlight}`;
  let m = materials.get(key);
  if (m) return m;
  const style = STATUS_STYLES[status];
  const color = new Color(style.color);
  if (highlight !== 'none')
    color.lerp(new Color('#ffffff'), highlight === 'hover' ? HOVER_LIGHTEN : SELECTED_LIGHTEN);
  m = new MeshBasicMaterial({
    color,
    vertexColors: true,
    map: style.pattern === 'solid' ? null : patternTexture(style.pattern),
  });
  materials.set(key, m);
  return m;
}

const plain = new Map<string, Material>();

/** A shared untextured material for markers and outlines. */
export function plainMaterial(color: string, opts: { backSide?: boolean } = {}): Material {
  const key = `${color}:${opts.backSide ? 'b' : 'f'}`;
  let m = plain.get(key);
  if (!m) {
    m = new MeshLambertMaterial({
      color: new Color(color),
      side: opts.backSide ? BackSide : FrontSide,
    });
    plain.set(key, m);
  }
  return m;
}
