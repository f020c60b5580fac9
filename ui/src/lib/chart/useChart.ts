import { useCallback, useEffect, useRef, useState } from 'react';
import { saveUrl } from '../download.js';
import type { EChartsCoreOption } from 'echarts/core';
import type { EChartsType } from './echarts.js';

export interface ChartOptions {
  /** Canvas for large plots (fast), SVG for small ones (crisp). */
  renderer?: 'canvas' | 'svg';
  dark?: boolean;
  /** Chart events (`mouseover`, `globalout`, …); the latest handlers are always called. */
  events?: Record<string, (params: unknown) => void>;
}

export interface ChartHandle {
  /** Attach to the element the chart draws into (give it a size). */
  ref: React.RefObject<HTMLDivElement | null>;
  /** True once echarts has loaded and drawn. */
  ready: boolean;
  /** Save the chart as PNG (twice the screen resolution) or SVG, named `fileName`. */
  exportImage(type: 'png' | 'svg', fileName: string, background: string): Promise<void>;
}

const load = () => import('./echarts.js');

/**
 * One echarts instance per element: loaded lazily, redrawn whenever `option` changes (not merged), resized
 * with its element, disposed on unmount. Every chart of the ui draws through this hook.
 */
export function useChart(option: object | null, { renderer = 'canvas', dark = false, events }: ChartOptions = {}) {
  const ref = useRef<HTMLDivElement | null>(null);
  const [chart, setChart] = useState<EChartsType | null>(null);
  const handlers = useRef(events);
  useEffect(() => {
    handlers.current = events;
  }, [events]);

  useEffect(() => {
    let disposed = false;
    let instance: EChartsType | null = null;
    let observer: ResizeObserver | null = null;
    void load().then(({ init }) => {
      const el = ref.current;
      if (disposed || !el) return;
      instance = init(el, dark ? 'dark' : undefined, { renderer });
      for (const name of ['mouseover', 'mouseout', 'globalout', 'click', 'legendselectchanged'])
        instance.on(name, (p: unknown) => handlers.current?.[name]?.(p));
      observer = typeof ResizeObserver === 'undefined' ? null : new ResizeObserver(() => instance?.resize());
      observer?.observe(el);
      setChart(instance);
    });
    return () => {
      disposed = true;
      observer?.disconnect();
      instance?.dispose();
      setChart(null);
    };
  }, [renderer, dark]);

  useEffect(() => {
    if (chart && option) chart.setOption(option as EChartsCoreOption, true);
    else if (chart) chart.clear();
  }, [chart, option]);

  const exportImage = useCallback(
    async (type: 'png' | 'svg', fileName: string, background: string) => {
      if (!chart || !option) return;
      if (type === renderer || (type === 'png' && renderer === 'canvas')) {
        saveUrl(chart.getDataURL({ type, pixelRatio: 2, backgroundColor: background }), fileName);
        return;
      }
      // The screen chart uses the other renderer: draw the same option once off-screen.
      const { init } = await load();
      const host = document.createElement('div');
      host.style.cssText = `position:fixed;left:-10000px;top:0;width:${chart.getWidth()}px;height:${chart.getHeight()}px`;
      document.body.appendChild(host);
      const copy = init(host, dark ? 'dark' : undefined, { renderer: type === 'svg' ? 'svg' : 'canvas' });
      try {
        copy.setOption(option as EChartsCoreOption, true);
        saveUrl(copy.getDataURL({ type, pixelRatio: 2, backgroundColor: background }), fileName);
      } finally {
        copy.dispose();
        host.remove();
      }
    },
    [chart, option, renderer, dark],
  );

  return { ref, ready: chart !== null, exportImage } satisfies ChartHandle;
}
