// A soak on the Bench page as the page reads it: the shared books (SoakAccumulator), the pass
// under way, and the timeline as uPlot columns. Nothing here touches the DOM: the books are read
// only when the page asks (at most once a frame), so a soak of many short passes costs the page
// the same as one of a few long ones.
import type uPlot from 'uplot';
import type { SoakAccumulator, SoakSpec, SoakSummary, SoakTimelinePoint, UnstableCode } from '../../../../shared/soak';

/** Unstable codes listed on the page while the soak runs; the saved session keeps every listed one. */
export const UNSTABLE_ON_PAGE = 12;

export interface SoakView {
  spec: SoakSpec;
  /** The pass under way (1-based), or the last one once the soak has ended. */
  pass: number;
  /** The whole soak's figures over its booked passes; null until the first pass is booked. */
  summary: SoakSummary | null;
  unstable: { count: number; first: UnstableCode[] };
}

export class SoakLive {
  /** Bumped whenever a pass is booked: the timeline chart redraws when it moves. */
  version = 0;
  private acc: SoakAccumulator | null = null;
  private pass = 0;

  constructor(readonly spec: SoakSpec) {}

  passStarted(pass: number) {
    this.pass = pass;
  }

  passBooked(acc: SoakAccumulator) {
    this.acc = acc;
    this.version++;
  }

  view(): SoakView {
    const a = this.acc;
    return {
      spec: this.spec,
      pass: this.pass,
      summary: a && a.passes > 0 ? a.summary() : null,
      unstable: { count: a?.unstableCount ?? 0, first: a ? a.unstableCodes().slice(0, UNSTABLE_ON_PAGE) : [] },
    };
  }

  timelineData(): uPlot.AlignedData {
    return soakTimelineData(this.acc?.timeline() ?? [], this.spec);
  }
}

/**
 * The timeline as uPlot columns: [x, model mismatches, unstable codes so far, link errors, codes
 * re-asked]. x is the point's last pass for a soak of passes, and minutes from the soak's start to
 * the point's end for a soak of a duration. A merged point sums its passes, as the saved one does.
 */
export function soakTimelineData(points: readonly SoakTimelinePoint[], spec: SoakSpec): uPlot.AlignedData {
  const x = points.map((p) => (spec.kind === 'passes' ? p.pass + p.passes - 1 : (p.atMs + p.elapsedMs) / 60_000));
  return [x, points.map((p) => p.mismatches), points.map((p) => p.unstableCodes), points.map((p) => p.linkErrors), points.map((p) => p.retries)];
}
