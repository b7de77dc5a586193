import { describe, expect, it } from 'vitest';
import { compactCount, histogramData, xyExtent } from '../../../src/components/charts/chart-specs';

describe('shared chart helpers', () => {
  it('gives both XY scales one extent: the unit circle with a margin, or the widest point', () => {
    expect(xyExtent([Float64Array.of(-1, 0, 1), Float64Array.of(0, 1, 0)])).toBeCloseTo(1.1, 12);
    // A gain fault of 1.6 pushes the answers outside the unit circle; the scale follows.
    expect(xyExtent([Float64Array.of(-1.6, 1.6), Float64Array.of(0.2, -0.3)])).toBeCloseTo(1.76, 12);
  });

  it('puts each histogram count at the centre of its bin', () => {
    const [x, cos, sin] = histogramData({ edgesLsb: [-1, -0.5, 0, 0.5], binsPerLsb: 2, cos: [1, 2, 3, 4], sin: [4, 3, 2, 1] });
    expect(x).toEqual([-0.75, -0.25, 0.25, 0.75]);
    expect(cos).toEqual([1, 2, 3, 4]);
    expect(sin).toEqual([4, 3, 2, 1]);
    expect(histogramData(null)).toEqual([[], [], []]);
  });

  it('writes large counts short enough for the axis', () => {
    expect([compactCount(0), compactCount(9500), compactCount(250_000), compactCount(1_200_000), compactCount(2_000_000)]).toEqual(['0', '9,500', '250k', '1.2M', '2M']);
  });
});
