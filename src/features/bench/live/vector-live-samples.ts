// A vectoring run's live chart data and latest summary, outside React (as live-samples.ts is for
// rotation): the score client adds to it, the chart loop reads it when `version` moves.
import { VectorPlotData } from '../../../components/charts/vector-plot-data';
import type { VectorConfig, VectorScoreSummary } from '../../../../shared/vectoring';

export class VectorLiveSamples {
  readonly plot: VectorPlotData;
  summary: VectorScoreSummary | null = null;
  summaryVersion = 0;

  constructor(readonly config: VectorConfig) {
    this.plot = new VectorPlotData(config);
  }

  setSummary(s: VectorScoreSummary) {
    this.summary = s;
    this.summaryVersion++;
  }
}
