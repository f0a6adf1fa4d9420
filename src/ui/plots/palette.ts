/**
 * Colours for the plots, all taken from the Okabe-Ito colour-blind-safe palette
 * (Okabe & Ito 2008, "Color Universal Design", J*Fly web publication; recommended
 * for figures by Wong 2011, Nature Methods 8, 441). Every meaning that matters is
 * also carried by something other than hue (line style, marker shape, text).
 */
export const OKABE_ITO = {
  black: '#000000',
  orange: '#E69F00',
  skyBlue: '#56B4E9',
  bluishGreen: '#009E73',
  yellow: '#F0E442',
  blue: '#0072B2',
  vermillion: '#D55E00',
  reddishPurple: '#CC79A7',
} as const;

/** What each element of the spectrum plot is drawn with. */
export const SPECTRUM_COLOURS = {
  flux: OKABE_ITO.black,
  /** The 1-sigma band, drawn translucent behind the flux. */
  band: OKABE_ITO.skyBlue,
  bandAlpha: 0.35,
  model: OKABE_ITO.vermillion,
  /** Masked pixels: neutral grey ticks along the bottom (grey is safe for every CVD type). */
  mask: '#8C8C8C',
  /** Emission markers: solid line, upward triangle. */
  emission: OKABE_ITO.blue,
  /** Absorption markers: dashed line, downward triangle. */
  absorption: OKABE_ITO.reddishPurple,
  sky: OKABE_ITO.yellow,
  skyAlpha: 0.28,
  highlight: OKABE_ITO.orange,
  crosshair: '#666666',
  /** A second solution for comparison: its model dashed, its markers as ticks from the bottom. */
  compare: OKABE_ITO.bluishGreen,
  /** Quasar broad-line fits (continuum + Gaussians over their fitted ranges): short dashes, thicker. */
  physics: OKABE_ITO.reddishPurple,
} as const;

/** Family colours for fit-quality curves, paired with dash patterns so hue is never the only cue. */
export const FAMILY_COLOURS: readonly string[] = [
  OKABE_ITO.blue,
  OKABE_ITO.vermillion,
  OKABE_ITO.bluishGreen,
  OKABE_ITO.reddishPurple,
  OKABE_ITO.orange,
  OKABE_ITO.skyBlue,
  OKABE_ITO.black,
];

/** SVG stroke-dasharray values (CSS px) cycled alongside FAMILY_COLOURS ('' = solid). */
export const FAMILY_DASHES: readonly string[] = ['', '6 3', '2 2', '8 3 2 3', '1 3', '10 4'];

/** Style of the i-th family, cycling colours and dashes independently (7 x 6 distinct pairs). */
export function familyStyle(index: number): { colour: string; dash: string } {
  const i = Math.max(0, Math.floor(index));
  return { colour: FAMILY_COLOURS[i % FAMILY_COLOURS.length], dash: FAMILY_DASHES[i % FAMILY_DASHES.length] };
}
