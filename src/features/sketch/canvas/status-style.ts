import type { CheckStatus } from '@shared/engine/types';

/**
 * How each check status looks on the sketch. Colours are chosen to stay apart for the common
 * colour-vision deficiencies (they differ in lightness as well as hue: dark blue, light
 * yellow, mid vermilion, light cyan, dark neutral grey; every pair stays ≥ 25 ΔE apart in
 * simulated protanopia and deuteranopia, see the palette test), and every status also has a
 * surface pattern and a glyph, so colour is never the only signal.
 */
export type StatusPattern = 'solid' | 'bands' | 'hatch' | 'dots' | 'dashes';

export interface StatusStyle {
  readonly status: CheckStatus;
  /** sRGB hex colour of the pipe surface. */
  readonly color: string;
  /** Darker tone for marks, outlines and text on light backgrounds. */
  readonly ink: string;
  readonly pattern: StatusPattern;
  /** Glyph shown on labels and in the legend (matches the app's status badges). */
  readonly glyph: string;
  readonly label: string;
  readonly description: string;
}

export const STATUS_STYLES: Readonly<Record<CheckStatus, StatusStyle>> = {
  pass: {
    status: 'pass',
    color: '#2f6db3',
    ink: '#1c4577',
    pattern: 'solid',
    glyph: '✓',
    label: 'Pass',
    description: 'wall is enough with margin',
  },
  marginal: {
    status: 'marginal',
    color: '#efbd32',
    ink: '#7a5a06',
    pattern: 'bands',
    glyph: '≈',
    label: 'Marginal',
    description: 'passes with little margin',
  },
  fail: {
    status: 'fail',
    color: '#cf4a26',
    ink: '#7c2410',
    pattern: 'hatch',
    glyph: '✕',
    label: 'Fail',
    description: 'wall is not enough',
  },
  review: {
    status: 'review',
    color: '#4cc3d6',
    ink: '#155d69',
    pattern: 'dots',
    glyph: '?',
    label: 'Review',
    description: 'the code asks for special consideration',
  },
  invalid: {
    status: 'invalid',
    color: '#6f7177',
    ink: '#3a3c40',
    pattern: 'dashes',
    glyph: '!',
    label: 'Not checkable',
    description: 'inputs missing or not resolvable',
  },
};

/** Statuses in legend order. */
export const STATUS_ORDER: readonly CheckStatus[] = [
  'pass',
  'marginal',
  'fail',
  'review',
  'invalid',
];

/** Highlight colours (selection outline, hover tint). */
export const SELECTION_COLOR = '#1d232c';
/** How far toward white a hovered / selected element's colour moves (0…1). */
export const HOVER_LIGHTEN = 0.3;
export const SELECTED_LIGHTEN = 0.15;
export const BACKGROUND_COLOR = '#f4f6f8';

/** A CSS background that draws a status's pattern on a swatch (for legends and badges). */
export function statusSwatchBackground(status: CheckStatus): string {
  const s = STATUS_STYLES[status];
  const mark = 'rgba(0,0,0,0.45)';
  switch (s.pattern) {
    case 'solid':
      return s.color;
    case 'bands':
      return `repeating-linear-gradient(90deg, ${s.color} 0 6px, ${mark} 6px 8px)`;
    case 'hatch':
      return `repeating-linear-gradient(45deg, ${s.color} 0 3px, ${mark} 3px 5px)`;
    case 'dots':
      return `radial-gradient(circle, ${mark} 1.5px, transparent 2px) 0 0 / 6px 6px, ${s.color}`;
    case 'dashes':
      return `repeating-linear-gradient(0deg, ${s.color} 0 3px, transparent 3px 6px), repeating-linear-gradient(90deg, ${mark} 0 4px, ${s.color} 4px 7px)`;
  }
}
