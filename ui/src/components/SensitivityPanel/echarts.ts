// Only the echarts parts the sensitivity chart uses (bars and whiskers), loaded with the chart.
import { init, use, type EChartsType } from 'echarts/core';
import { BarChart, CustomChart } from 'echarts/charts';
import { GridComponent, LegendComponent, TooltipComponent } from 'echarts/components';
import { SVGRenderer } from 'echarts/renderers';

use([BarChart, CustomChart, GridComponent, LegendComponent, TooltipComponent, SVGRenderer]);

export { init, type EChartsType };
