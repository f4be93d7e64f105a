import { useEffect, useLayoutEffect, useRef } from 'react';
import Box from '@mui/material/Box';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';
import { buildChartOptions, SERIES_COUNT, type ChartFrame } from './chart-options';

/** Data with a column for every series the options declare (missing ones empty). */
function complete(data: uPlot.AlignedData): uPlot.AlignedData {
  if (data.length >= SERIES_COUNT) return data;
  const empty = () => new Array<undefined>(data[0]?.length ?? 0).fill(undefined);
  return [
    ...data,
    ...Array.from({ length: SERIES_COUNT - data.length }, empty),
  ] as uPlot.AlignedData;
}

export interface LevelInflowChartProps {
  data: uPlot.AlignedData;
  frame: ChartFrame;
  timeZone: string;
  levelUnit: string;
  flowUnit: string;
  height?: number;
  /** a sentence for screen readers saying what the chart shows */
  description: string;
}

/**
 * The uPlot chart, created once per set of units and zone and then fed with setData; resized by
 * a ResizeObserver and destroyed on unmount.
 */
export function LevelInflowChart({
  data,
  frame,
  timeZone,
  levelUnit,
  flowUnit,
  height = 320,
  description,
}: LevelInflowChartProps) {
  const containerRef = useRef<HTMLDivElement>(null);
  const plotRef = useRef<uPlot | null>(null);
  const latest = useRef({ data: complete(data), frame });

  useLayoutEffect(() => {
    latest.current = { data: complete(data), frame };
    plotRef.current?.setData(latest.current.data);
  }, [data, frame]);

  useEffect(() => {
    const container = containerRef.current;
    if (!container) return undefined;
    const plot = new uPlot(
      buildChartOptions({
        width: Math.max(320, Math.floor(container.clientWidth)),
        height,
        timeZone,
        levelUnit,
        flowUnit,
        frame: () => latest.current.frame,
      }),
      latest.current.data,
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
  }, [timeZone, levelUnit, flowUnit, height]);

  return (
    <Box
      ref={containerRef}
      role="img"
      aria-label={description}
      data-testid="level-inflow-chart"
      sx={{ width: '100%', minHeight: height }}
    />
  );
}
