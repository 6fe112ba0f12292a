/**
 * What every chart shares: sizes for an A4 page, our font, our colours.
 *
 * Colours: the eight colours of Okabe & Ito (2008), "Color Universal Design (CUD): how to make figures and
 * presentations that are friendly to colorblind people", https://jfly.uni-koeln.de/color/ — chosen to stay
 * distinguishable with the common forms of colour-vision deficiency. Which colour plays which part is our own
 * choice; yellow is left out because it is too faint on white paper. No chart tells things apart by colour
 * alone: line width, dashes, fill against outline and marker shape carry the same distinction.
 *
 * Sizes: a chart is 640 px wide and printed about 170 mm wide, so 1 px ≈ 0.266 mm ≈ 0.753 pt; 12 px type
 * prints at 9.0 pt, the smallest size we allow on paper.
 */

export const CHART_WIDTH = 640;
export const CHART_HEIGHT = 220;

/** Okabe & Ito's colours by their published names. */
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

/** What each colour means in our charts. */
export const PALETTE = {
  ink: OKABE_ITO.black,
  observed: OKABE_ITO.skyBlue,
  trend: OKABE_ITO.blue,
  adjusted: OKABE_ITO.orange,
  season: OKABE_ITO.bluishGreen,
  remainder: OKABE_ITO.black,
  unusual: OKABE_ITO.vermillion,
  rise: OKABE_ITO.blue,
  fall: OKABE_ITO.vermillion,
  baseline: OKABE_ITO.skyBlue,
  current: OKABE_ITO.blue,
  /** Grid lines: a neutral grey, not a data colour. */
  grid: '#d9d9d9',
} as const;

/** The family as SVG names it; the PDF and PNG renderers load the Source Sans 3 TrueType files. */
export const FONT_FAMILY = "'Source Sans 3', 'Source Sans Pro', Arial, sans-serif";

/** Smallest type on the page (9 pt printed, see above). */
export const LABEL_SIZE = 12;
export const TITLE_SIZE = 13;
