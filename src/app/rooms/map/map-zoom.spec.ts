import { fitTransform, MapZoom } from './map-zoom';

describe('fitTransform', () => {
  it('centres the points in the view with 48 px padding', () => {
    const t = fitTransform(
      [
        { x: 0, y: 0 },
        { x: 100, y: 50 },
      ],
      300,
      200,
    );
    if (!t) throw new Error('a transform for two points');
    // (300 - 96) / 100 = 2.04 and (200 - 96) / 50 = 2.08, capped at 1.6.
    expect(t.k).toBe(1.6);
    expect(t.apply([50, 25])).toEqual([150, 100]);
  });

  it('zooms out for a wide room and answers nothing without points or without a size', () => {
    const t = fitTransform(
      [
        { x: -500, y: 0 },
        { x: 500, y: 10 },
      ],
      648,
      400,
    );
    expect(t?.k).toBeCloseTo(0.552, 6);
    expect(fitTransform([], 300, 200)).toBeNull();
    expect(fitTransform([{ x: 0, y: 0 }], 0, 0)).toBeNull();
  });
});

describe('MapZoom', () => {
  let svg: SVGSVGElement;
  let overlay: SVGSVGElement;
  beforeEach(() => {
    const ns = 'http://www.w3.org/2000/svg';
    svg = document.createElementNS(ns, 'svg');
    overlay = document.createElementNS(ns, 'svg');
    svg.setAttribute('style', 'width: 400px; height: 300px; display: block');
    document.body.append(svg, overlay);
  });
  afterEach(() => {
    svg.remove();
    overlay.remove();
  });

  it('centres on a point at 1.5x or more and hands every programmatic change to apply', () => {
    const seen: string[] = [];
    const zoom = new MapZoom(svg, overlay, (t) => seen.push(t.toString()));
    zoom.centreOn(100, 40);
    expect(zoom.transform.k).toBe(1.5);
    expect(zoom.transform.apply([100, 40])).toEqual([200, 150]);
    expect(zoom.invert([200, 150])).toEqual([100, 40]);
    zoom.scaleBy(2);
    expect(zoom.transform.k).toBe(3);
    expect(seen.length).toBe(2);
    expect(svg.style.transform).withContext('no gesture layer without a pointer').toBe('');
  });
});
