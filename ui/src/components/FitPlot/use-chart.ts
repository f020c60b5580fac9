import { useEffect, useRef } from 'react';

type Chart = { dispose(): void; resize(): void; setOption(o: unknown): void };

/** Draws an echarts option into a div (echarts loaded lazily), redrawn on change and on resize. */
export function useChart(option: unknown, scheme: string) {
  const ref = useRef<HTMLDivElement>(null);
  useEffect(() => {
    let disposed = false;
    let chart: Chart | null = null;
    const onResize = () => chart?.resize();
    // Lazy: echarts loads only when a fit is first drawn.
    void import('./echarts.js').then(({ init }) => {
      if (disposed || !ref.current) return;
      chart = init(ref.current, scheme === 'dark' ? 'dark' : undefined, { renderer: 'svg' });
      chart.setOption(option);
      window.addEventListener('resize', onResize);
    });
    return () => {
      disposed = true;
      window.removeEventListener('resize', onResize);
      chart?.dispose();
    };
  }, [option, scheme]);
  return ref;
}
