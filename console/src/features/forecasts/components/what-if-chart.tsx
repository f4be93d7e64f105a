import { useEffect, useLayoutEffect, useRef } from 'react';
import Box from '@mui/material/Box';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';

export interface WhatIfChartProps {
  data: uPlot.AlignedData;
  /** builds the options for a width; a new function rebuilds the chart */
  options: (width: number) => uPlot.Options;
  height: number;
  /** a sentence for screen readers saying what the chart shows */
  description: string;
  testId: string;
}

/** One uPlot chart of the what-if results: built per options, fed with setData, resized. */
export function WhatIfChart({ data, options, height, description, testId }: WhatIfChartProps) {
  const containerRef = useRef<HTMLDivElement>(null);
  const plotRef = useRef<uPlot | null>(null);
  const latest = useRef(data);

  useLayoutEffect(() => {
    latest.current = data;
    plotRef.current?.setData(data);
  }, [data]);

  useEffect(() => {
    const container = containerRef.current;
    if (!container) return undefined;
    const plot = new uPlot(
      options(Math.max(320, Math.floor(container.clientWidth))),
      latest.current,
      container,
    );
    plotRef.current = plot;
    const observer = new ResizeObserver((entries) => {
      const width = entries[0]?.contentRect.width;
      if (width && width > 0) plot.setSize({ width: Math.floor(width), height });
    });
    observer.observe(container);
    return () => {
      observer.disconnect();
      plot.destroy();
      plotRef.current = null;
    };
  }, [options, height]);

  return (
    <Box
      ref={containerRef}
      role="img"
      aria-label={description}
      data-testid={testId}
      sx={{ width: '100%', minHeight: height }}
    />
  );
}
