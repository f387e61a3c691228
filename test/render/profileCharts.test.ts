/** The profile's time chart: a short period fills the plot, times of day label a single day, the top sits on a tick. */
import { describe, expect, it } from 'vitest';
import { renderTimeChart } from '@trivar/core';

/** Half-hourly labels of one day, as profileClock writes them. */
const halfHours = (i: number) => `2026-03-10 ${String(Math.floor(i / 2)).padStart(2, '0')}:${i % 2 ? '30' : '00'}`;

describe('renderTimeChart', () => {
  it('spreads 48 intervals over the whole plot width, labelled by time of day', () => {
    const values = Float64Array.from({ length: 48 }, (_, i) => (i === 40 ? 45.9 : 10 + (i % 5)));
    const svg = renderTimeChart({ title: 't', unit: 'A', series: [{ name: 'line A', values }], labelOf: halfHours, mode: 'mean' });
    const xs = /points="([^"]+)"/.exec(svg)![1]!.split(' ').map((p) => Number(p.split(',')[0]));
    expect(xs).toHaveLength(48);
    // Plot from x = 58 to 900 − 16 = 884: 826 px over 48 columns, each point in its column's middle.
    expect(xs[0]).toBeCloseTo(58 + 826 / 96, 1);
    expect(xs[47]).toBeCloseTo(884 - 826 / 96, 1);
    const ticks = [...svg.matchAll(/y="296" text-anchor="(?:middle|end)" fill="#444">([^<]+)</g)].map((m) => m[1]);
    expect(ticks[0]).toBe('00:00');
    expect(ticks[5]).toBe('23:30');
    // The highest value (45.9) under the top of the plot, which is the tick 50.
    expect(svg).toMatch(/<text x="52" y="38" text-anchor="end" fill="#444">50<\/text>/);
  });

  it('keeps dates on the axis for a period over several days, one pixel column per column', () => {
    const n = 3 * 1440;
    const label = (i: number) => `2025-01-0${1 + Math.floor(i / 1440)} 00:00`;
    const svg = renderTimeChart({ title: 't', unit: 'A', series: [{ name: 'x', values: Float64Array.from({ length: n }, (_, i) => i % 7) }], labelOf: label });
    const ticks = [...svg.matchAll(/y="296" text-anchor="(?:middle|end)" fill="#444">([^<]+)</g)].map((m) => m[1]);
    expect(ticks[0]).toBe('2025-01-01');
    expect(ticks[5]).toBe('2025-01-03');
    expect(svg).toContain('points="58.5,');
  });
});
