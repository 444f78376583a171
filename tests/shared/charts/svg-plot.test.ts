// The paper chart: scale mapping, ticks, escaping and drawn coordinates, checked against hand computations.
import { describe, expect, it } from 'vitest';
import { axisScale, escapeXml, formatTick, linearTicks, logTicks, svgPlot, type PlotSpec } from '../../../shared/charts/svg-plot.js';

/** The plot frame: the one rect with fill="none". */
function frame(svg: string) {
  const m = /<rect x="([\d.]+)" y="([\d.]+)" width="([\d.]+)" height="([\d.]+)" fill="none"/.exec(svg);
  if (!m) throw new Error('no frame');
  const [x, y, w, h] = m.slice(1).map(Number);
  return { x, y, w, h };
}

const base: PlotSpec = {
  width: 400,
  height: 300,
  x: { title: 'Current (per unit of rated)', min: 1, max: 100, scale: 'log' },
  y: { title: 'Time (s)', min: 0, max: 50 },
  series: [{ label: 'curve', points: [[1, 0], [10, 25], [100, 50]], stroke: '#1565c0' }],
};

describe('axisScale', () => {
  it('maps linearly (hand computed: 0..50 onto 10..110, 10 → 10 + 10/50·100 = 30, 50 → 110)', () => {
    const s = axisScale({ min: 0, max: 50 }, 10, 110);
    expect(s(0)).toBe(10);
    expect(s(10)).toBeCloseTo(30, 12);
    expect(s(50)).toBe(110);
  });
  it('maps log10 values (hand computed: 1..100 onto 0..200, 10 is half way → 100; 2 → 200·log10(2)/2 = 30.103)', () => {
    const s = axisScale({ min: 1, max: 100, scale: 'log' }, 0, 200);
    expect(s(1)).toBe(0);
    expect(s(10)).toBeCloseTo(100, 12);
    expect(s(2)).toBeCloseTo(30.103, 3);
    expect(s(100)).toBeCloseTo(200, 12);
  });
  it('maps a reversed range (screen y grows downwards: 0..10 onto 250..50, 5 → 150)', () => {
    expect(axisScale({ min: 0, max: 10 }, 250, 50)(5)).toBe(150);
  });
  it('refuses a log axis that reaches zero', () => {
    expect(() => axisScale({ min: 0, max: 10, scale: 'log' }, 0, 1)).toThrow(/log axis/);
  });
});

describe('ticks', () => {
  it('log ticks are 1, 2, 5 × 10^n inside the range', () => {
    expect(logTicks(1, 100)).toEqual([1, 2, 5, 10, 20, 50, 100]);
    expect(logTicks(0.3, 30)).toEqual([0.5, 1, 2, 5, 10, 20]);
    expect(logTicks(1, 10000)).toEqual([1, 2, 5, 10, 20, 50, 100, 200, 500, 1000, 2000, 5000, 10000]);
  });
  it('linear ticks take a nice step (0..50 in about 5 steps → 10; 0..1 → 0.2)', () => {
    expect(linearTicks(0, 50)).toEqual([0, 10, 20, 30, 40, 50]);
    expect(linearTicks(0, 1)).toEqual([0, 0.2, 0.4, 0.6, 0.8, 1]);
    expect(linearTicks(-3, 7, 5)).toEqual([-2, 0, 2, 4, 6]);
  });
  it('tick labels are short plain numbers', () => {
    expect([0.5, 1, 20, 1000, 0.002].map(formatTick)).toEqual(['0.5', '1', '20', '1000', '0.002']);
    expect(formatTick(0.1 + 0.2)).toBe('0.3');
  });
  it('draws the log tick labels on the x axis', () => {
    const svg = svgPlot(base);
    for (const t of ['1', '2', '5', '10', '20', '50', '100']) expect(svg).toContain(`>${t}</text>`);
  });
});

describe('escaping', () => {
  it('escapes the five XML characters', () => {
    expect(escapeXml(`a<b & "c" 'd'>`)).toBe('a&lt;b &amp; &quot;c&quot; &apos;d&apos;&gt;');
  });
  it('escapes titles, labels and annotations in the SVG', () => {
    const svg = svgPlot({
      ...base,
      x: { ...base.x, title: 'I < 2 & more' },
      series: [{ ...base.series[0], label: 'R&D "curve"' }],
      bands: [{ x0: 2, x1: 5, fill: '#ff9800', label: '<band>' }],
      annotations: [{ x: 10, y: 25, text: 'a>b' }],
    });
    expect(svg).toContain('I &lt; 2 &amp; more');
    expect(svg).toContain('R&amp;D &quot;curve&quot;');
    expect(svg).toContain('&lt;band&gt;');
    expect(svg).toContain('a&gt;b');
    expect(svg).not.toMatch(/<band>|R&D/);
  });
});

describe('svgPlot', () => {
  it('is one svg element with a size, a viewBox, Roboto text and no CSS classes or foreignObject', () => {
    const svg = svgPlot(base);
    expect(svg.startsWith('<svg xmlns="http://www.w3.org/2000/svg" version="1.1" width="400" height="300" viewBox="0 0 400 300">')).toBe(true);
    expect(svg.endsWith('</svg>')).toBe(true);
    expect(svg).not.toMatch(/class=|<style|foreignObject/);
    expect(svg).toContain('font-family="Roboto"');
    expect(svg).toContain('>Current (per unit of rated)</text>');
    expect(svg).toContain('>Time (s)</text>');
  });

  it("places a polyline's points inside the frame (hand computed: x log 1..100, y 0..50)", () => {
    const svg = svgPlot(base);
    const f = frame(svg);
    const pts = /<polyline points="([^"]+)"/.exec(svg)![1].split(' ').map((p) => p.split(',').map(Number));
    // (1, 0) → left bottom corner; (10, 25) → centre (10 is half way on log 1..100, 25 half of 50); (100, 50) → right top.
    expect(pts[0][0]).toBeCloseTo(f.x, 1);
    expect(pts[0][1]).toBeCloseTo(f.y + f.h, 1);
    expect(pts[1][0]).toBeCloseTo(f.x + f.w / 2, 1);
    expect(pts[1][1]).toBeCloseTo(f.y + f.h / 2, 1);
    expect(pts[2][0]).toBeCloseTo(f.x + f.w, 1);
    expect(pts[2][1]).toBeCloseTo(f.y, 1);
  });

  it('breaks a line at a point a log axis cannot show and draws dash, markers, band and legend', () => {
    const svg = svgPlot({
      ...base,
      series: [
        { label: 'broken', points: [[1, 1], [2, 2], [0, 3], [5, 4], [10, 5]], stroke: '#000000', dash: [4, 2] },
        { label: 'shots', points: [[7, 20]], stroke: '#c62828', line: false, marker: 'triangle' },
        { label: 'sq', points: [[3, 10]], stroke: '#2e7d32', line: false, marker: 'square' },
        { label: 'x', points: [[4, 10]], stroke: '#6a1b9a', line: false, marker: 'cross' },
        { label: 'o', points: [[6, 10]], stroke: '#6a1b9a', line: false, marker: 'circle' },
      ],
      bands: [{ x0: 5, x1: 10, fill: '#ff9800', label: 'segment' }],
    });
    expect(svg.match(/<polyline /g)).toHaveLength(2);
    expect(svg).toContain('stroke-dasharray="4,2"');
    expect(svg).toMatch(/<polygon points=/);
    expect(svg).toMatch(/<circle /);
    expect(svg).toMatch(/<path d="M/);
    expect(svg).toContain('fill-opacity="0.15"');
    expect(svg).toContain('>segment</text>');
    for (const l of ['broken', 'shots', 'sq', 'x', 'o']) expect(svg).toContain(`>${l}</text>`);
  });
});
