import type { Provider } from '@angular/core';
import { provideEchartsCore } from 'ngx-echarts';

/**
 * Provides ECharts to a lazy route or component: the library is fetched the first time a chart
 * is drawn, never in the initial bundle. Draw charts with the `echarts` directive of ngx-echarts.
 */
export function provideCharts(): Provider {
  return provideEchartsCore({ echarts: () => import('./echarts-setup') });
}
