// Keeps a uPlot's plotting area square (equal x and y scale when both ranges are equal), by
// widening or narrowing the canvas until the area's width equals its height. Axis sizes and
// padding do not depend on the width, so one correction lands; the guard stops any oscillation.
import uPlot from 'uplot';

const MAX_CORRECTIONS = 3;

export function squarePlotHooks(): uPlot.Hooks.Arrays {
  let corrections = 0;
  const square = (u: uPlot) => {
    const wCss = u.bbox.width / uPlot.pxRatio;
    const hCss = u.bbox.height / uPlot.pxRatio;
    const diff = Math.round(hCss - wCss);
    if (diff === 0 || corrections >= MAX_CORRECTIONS) {
      corrections = 0;
      return;
    }
    corrections++;
    u.setSize({ width: u.width + diff, height: u.height });
  };
  return { ready: [square], setSize: [square] };
}
