/**
 * The slice of ECharts the product draws with, registered once. Imported lazily (see
 * `provideCharts`), so the charts library loads only on pages that show a chart.
 */
import { HeatmapChart, LineChart, ScatterChart } from 'echarts/charts';
import {
  DataZoomComponent,
  GridComponent,
  LegendComponent,
  MarkAreaComponent,
  MarkLineComponent,
  TitleComponent,
  TooltipComponent,
  VisualMapComponent,
} from 'echarts/components';
import { use } from 'echarts/core';
import { CanvasRenderer } from 'echarts/renderers';

use([
  CanvasRenderer,
  DataZoomComponent,
  GridComponent,
  HeatmapChart,
  LegendComponent,
  LineChart,
  MarkAreaComponent,
  MarkLineComponent,
  ScatterChart,
  TitleComponent,
  TooltipComponent,
  VisualMapComponent,
]);

// ngx-echarts calls the module's `init`.
export { init } from 'echarts/core';
