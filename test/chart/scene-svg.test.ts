/**
 * The scene writer on small scenes worked by hand: each mark becomes the SVG element that draws it (SVG 1.1
 * 2nd ed., W3C: §9 basic shapes, §8 paths, §10 text, §14.3 clipping paths), text sits on the baseline the
 * scene asks for, ids stay under the chart's prefix, numbers are rounded by one rule, and no text — a label,
 * a group's name — can become markup.
 */
import { describe, expect, it } from 'vitest';
import { num, sceneToSvg } from '../../src/chart/scene-svg.js';
import type { Scene } from '../../src/vocabulary/scene.js';
import { findAll, parseXml, textOf, type XmlElement } from './xml.js';

const LABEL = { idPrefix: 'water-yoy', title: 'Title', desc: 'Description' };
const INK = { colour: '#000000', width: 1 };

function scene(marks: Scene['marks']): Scene {
  return { width: 100, height: 50, background: 'white', marks };
}

function only(root: XmlElement, name: string): XmlElement {
  const found = findAll(root, (e) => e.name === name);
  expect(found, name).toHaveLength(1);
  return found[0];
}

describe('sceneToSvg', () => {
  it('opens with the labelled root, <title> and <desc>, then the white background', () => {
    const root = parseXml(sceneToSvg(scene([]), LABEL));
    expect(root.attrs).toMatchObject({
      role: 'img',
      'aria-labelledby': 'water-yoy-title water-yoy-desc',
      width: '100',
      height: '50',
      viewBox: '0 0 100 50',
    });
    const kids = root.children.filter((c): c is XmlElement => typeof c === 'object');
    expect(kids.map((k) => k.name).slice(0, 3)).toEqual(['title', 'desc', 'rect']);
    expect(kids[0].attrs.id).toBe('water-yoy-title');
    expect(kids[1].attrs.id).toBe('water-yoy-desc');
    expect(kids[2].attrs.fill).toBe('white');
  });

  it('writes rects, lines and broken polylines with their paint', () => {
    const svg = sceneToSvg(
      scene([
        { type: 'rect', x: 1, y: 2, width: 3, height: 4, fill: '#0072B2', fillOpacity: 0.45 },
        { type: 'rect', x: 1, y: 2, width: 0, height: 4, fill: '#0072B2' },
        { type: 'line', x1: 0, y1: 0.5, x2: 10, y2: 0.5, stroke: { ...INK, dash: [6, 4], opacity: 0.55 } },
        {
          type: 'path',
          segments: [
            [0, 0, 10, 5],
            [20, 0, 30, 5, 40, 0],
          ],
          stroke: { colour: '#56B4E9', width: 1.25, cap: 'round', join: 'round' },
        },
      ]),
      LABEL,
    );
    const root = parseXml(svg);
    // The zero-width rect draws nothing and is left out: one rect besides the background.
    const rects = findAll(root, (e) => e.name === 'rect');
    expect(rects).toHaveLength(2);
    expect(rects[1].attrs).toMatchObject({ x: '1', y: '2', width: '3', height: '4', 'fill-opacity': '0.45' });
    expect(only(root, 'line').attrs).toMatchObject({ 'stroke-dasharray': '6,4', 'stroke-opacity': '0.55' });
    const path = only(root, 'path');
    // Two runs: a move and a line, then a move and two lines.
    expect(path.attrs.d).toBe('M0,0L10,5M20,0L30,5L40,0');
    expect(path.attrs).toMatchObject({ fill: 'none', 'stroke-linecap': 'round', 'stroke-linejoin': 'round' });
  });

  it('sizes symbols as vega does: √size across', () => {
    // Size 64: √64 = 8 across, so a radius (half width) of 4.
    const root = parseXml(
      sceneToSvg(
        scene([
          { type: 'symbol', shape: 'circle', x: 10, y: 10, size: 64, fill: '#000000' },
          { type: 'symbol', shape: 'diamond', x: 30, y: 10, size: 64, fill: '#D55E00' },
          { type: 'symbol', shape: 'square', x: 50, y: 10, size: 64, fill: 'white', stroke: INK },
        ]),
        LABEL,
      ),
    );
    expect(only(root, 'circle').attrs).toMatchObject({ cx: '10', cy: '10', r: '4' });
    expect(only(root, 'path').attrs.d).toBe('M26,10L30,6L34,10L30,14Z');
    const rects = findAll(root, (e) => e.name === 'rect');
    expect(rects[1].attrs).toMatchObject({ x: '46', y: '6', width: '8', height: '8', stroke: '#000000' });
  });

  it('puts text on the alphabetic baseline its baseline asks for, rotated about its anchor', () => {
    const text = { type: 'text' as const, x: 20, y: 30, size: 12, weight: 'normal' as const, fill: '#000000' };
    const root = parseXml(
      sceneToSvg(
        scene([
          { ...text, text: 'top', anchor: 'start', baseline: 'top' },
          { ...text, text: 'mid', anchor: 'middle', baseline: 'middle', weight: 'bold' },
          { ...text, text: 'up', anchor: 'end', baseline: 'bottom', angle: -90 },
        ]),
        LABEL,
      ),
    );
    const [top, mid, up] = findAll(root, (e) => e.name === 'text');
    // top: 30 + 0.79 × 12 = 39.48; middle: 30 + 0.30 × 12 = 33.6; bottom: 30 − 0.21 × 12 = 27.48.
    expect(top.attrs).toMatchObject({ x: '20', y: '39.48', 'font-size': '12' });
    expect(top.attrs['text-anchor']).toBeUndefined();
    expect(mid.attrs).toMatchObject({ y: '33.6', 'text-anchor': 'middle', 'font-weight': 'bold' });
    expect(up.attrs).toMatchObject({ y: '27.48', 'text-anchor': 'end', transform: 'rotate(-90 20 30)' });
  });

  it('gives clip paths ids under the chart’s prefix, in order, and moves groups', () => {
    const clipped = (name: string): Scene['marks'][number] => ({
      type: 'group',
      name,
      x: 5,
      y: 6,
      clip: { width: 50, height: 20 },
      marks: [],
    });
    const root = parseXml(sceneToSvg(scene([clipped('plot'), clipped('other')]), LABEL));
    const clips = findAll(root, (e) => e.name === 'clipPath').map((e) => e.attrs.id);
    expect(clips).toEqual(['water-yoy-clip1', 'water-yoy-clip2']);
    const groups = findAll(root, (e) => e.name === 'g' && e.attrs.class === 'plot');
    expect(groups[0].attrs).toMatchObject({ transform: 'translate(5,6)', 'clip-path': 'url(#water-yoy-clip1)' });
  });

  it('escapes text and keeps names to letters, digits and hyphens, so nothing can become markup', () => {
    const hostile = `</text><script>alert(1)</script><text onload="x" a='b'> & 😀`;
    const svg = sceneToSvg(
      scene([
        {
          type: 'group',
          name: `x" onclick="alert(1)`,
          x: 0,
          y: 0,
          marks: [
            {
              type: 'text',
              x: 0,
              y: 0,
              text: hostile,
              anchor: 'start',
              baseline: 'alphabetic',
              size: 12,
              weight: 'normal',
              fill: '#000000',
            },
          ],
        },
      ]),
      { idPrefix: '"><script>', title: hostile, desc: hostile },
    );
    expect(svg).not.toMatch(/<script|onclick="|onload="/i);
    const root = parseXml(svg);
    const texts = findAll(root, (e) => e.name === 'text');
    expect(texts.map(textOf)).toEqual([hostile]);
    expect(textOf(only(root, 'title'))).toBe(hostile);
    expect(findAll(root, (e) => Object.keys(e.attrs).some((a) => /^on/i.test(a)))).toEqual([]);
    expect(root.attrs['aria-labelledby']).toMatch(/^[a-z][a-z0-9-]* [a-z][a-z0-9-]*$/);
  });

  it('rounds numbers to 0.01 px, never writing −0, and gives the same bytes every time', () => {
    expect([num(1 / 3), num(2 / 3), num(-0.001), num(12), num(-3.25)]).toEqual(['0.33', '0.67', '0', '12', '-3.25']);
    const s = scene([{ type: 'line', x1: Math.PI, y1: Math.E, x2: 1e-9, y2: 99.995, stroke: INK }]);
    expect(sceneToSvg(s, LABEL)).toBe(sceneToSvg(structuredClone(s), LABEL));
    expect(sceneToSvg(s, LABEL)).toContain('x1="3.14" y1="2.72" x2="0" y2="100"');
  });
});
