/**
 * The one vega-lite config every chart uses: sizes for an A4 page, our font, our colours, no interaction.
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
import type { Config } from 'vega-lite';
import { vegaLocale } from './locale.js';

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

const cache = new Map<string, Config>();

/** The config for a locale (number and month names follow it); built once per locale. */
export function chartConfig(locale: string): Config {
  let config = cache.get(locale);
  if (config === undefined) {
    config = buildConfig(locale);
    cache.set(locale, config);
  }
  return config;
}

function buildConfig(locale: string): Config {
  return {
    locale: vegaLocale(locale),
    background: 'white',
    padding: 4,
    font: FONT_FAMILY,
    // Figures are read on paper and in email: no tooltips, no pointer cursor, no ARIA roles on inner marks
    // (the root <svg> is one labelled image).
    aria: false,
    mark: { tooltip: false, color: PALETTE.trend },
    view: { stroke: null },
    axis: {
      labelFont: FONT_FAMILY,
      labelFontSize: LABEL_SIZE,
      labelColor: PALETTE.ink,
      titleFont: FONT_FAMILY,
      titleFontSize: LABEL_SIZE,
      titleFontWeight: 'normal',
      titleColor: PALETTE.ink,
      domainColor: PALETTE.ink,
      tickColor: PALETTE.ink,
      gridColor: PALETTE.grid,
      labelOverlap: 'parity',
      labelSeparation: 8,
      labelFlush: true,
    },
    axisX: { grid: false, title: null },
    legend: {
      orient: 'top',
      direction: 'horizontal',
      title: null,
      labelFont: FONT_FAMILY,
      labelFontSize: LABEL_SIZE,
      labelColor: PALETTE.ink,
      labelLimit: 320,
      symbolSize: 160,
      symbolStrokeWidth: 2,
      columnPadding: 16,
      padding: 0,
      offset: 6,
    },
    header: {
      labelFont: FONT_FAMILY,
      labelFontSize: TITLE_SIZE,
      labelColor: PALETTE.ink,
      title: null,
    },
    text: { font: FONT_FAMILY, fontSize: LABEL_SIZE, color: PALETTE.ink },
    title: { font: FONT_FAMILY, fontSize: TITLE_SIZE, color: PALETTE.ink },
  };
}

/**
 * The time axis: short month names between years ("2021 Apr Jul Oct 2022"), day and month for weekly and daily
 * data, hours for hourly data. The scale is UTC, so the labels do not depend on the machine's time zone.
 */
export const TIME_AXIS = {
  title: null,
  format: { year: '%Y', quarter: '%b', month: '%b', week: '%-d %b', date: '%-d %b', hours: '%H:%M', minutes: '%H:%M' },
} as const;

/** Size and fitting shared by the single-view charts: the whole figure, axes included, is 640 × 220. */
export const FIT = {
  width: CHART_WIDTH,
  height: CHART_HEIGHT,
  autosize: { type: 'fit', contains: 'padding' },
} as const;
