import { use } from 'echarts/core'
import { BarChart, LineChart } from 'echarts/charts'
import { GridComponent, LegendComponent, MarkAreaComponent, MarkLineComponent, TooltipComponent } from 'echarts/components'
import { SVGRenderer } from 'echarts/renderers'

// only the parts the design plots use; this module is loaded with the plots, never on first load
use([LineChart, BarChart, GridComponent, LegendComponent, TooltipComponent, MarkLineComponent, MarkAreaComponent, SVGRenderer])

/** Colours of our palette (src/styles/theme.css) for canvas-free SVG charts, which cannot read CSS variables. */
export const CHART_COLOURS = {
  voc: '#2b6a67',
  vmp: '#c9871a',
  limit: '#b3261e',
  window: 'rgba(43, 106, 103, 0.10)',
  pass: '#2b6a67',
  warn: '#c9871a',
  fail: '#b3261e',
  info: '#56686a',
  ink: '#1b2a2b',
  rule: '#dcdfd8',
} as const
