// Only the echarts parts the profile plots use, so the lazy chart chunk stays small.
import { init, use, type EChartsType } from 'echarts/core';
import { LineChart } from 'echarts/charts';
import {
  GridComponent,
  LegendComponent,
  MarkLineComponent,
  TitleComponent,
  TooltipComponent,
  ToolboxComponent,
} from 'echarts/components';
import { SVGRenderer } from 'echarts/renderers';

use([
  LineChart,
  GridComponent,
  LegendComponent,
  MarkLineComponent,
  TitleComponent,
  TooltipComponent,
  ToolboxComponent,
  SVGRenderer,
]);

export { init, type EChartsType };
