import type uPlot from 'uplot';

/**
 * Stands in for uPlot in jsdom (no canvas): records what the component does with the chart, so
 * tests can see the series it was given.
 */
export class FakeUPlot {
  static instances: FakeUPlot[] = [];
  static pxRatio = 1;
  static tzDate(date: Date): Date {
    return date;
  }

  data: uPlot.AlignedData;
  readonly setDataCalls: uPlot.AlignedData[] = [];
  destroyed = false;

  constructor(
    readonly opts: uPlot.Options,
    data: uPlot.AlignedData,
    readonly target: HTMLElement,
  ) {
    this.data = data;
    FakeUPlot.instances.push(this);
  }

  setData(data: uPlot.AlignedData): void {
    this.data = data;
    this.setDataCalls.push(data);
  }

  setSize(): void {}

  destroy(): void {
    this.destroyed = true;
  }
}
