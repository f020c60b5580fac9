// Only the echarts parts the dataset scatter uses; loaded lazily when the plot is first drawn.
import { init, use, type EChartsType } from 'echarts/core';
import { ScatterChart } from 'echarts/charts';
import { GridComponent, TooltipComponent } from 'echarts/components';
import { CanvasRenderer } from 'echarts/renderers';

use([ScatterChart, GridComponent, TooltipComponent, CanvasRenderer]);

export { init, type EChartsType };
