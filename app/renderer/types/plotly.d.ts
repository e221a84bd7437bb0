// Minimal declarations for plotly.js-dist-min (the package ships none): the calls the app makes.
declare module 'plotly.js-dist-min' {
  export type Data = Record<string, unknown>;
  export type Layout = Record<string, unknown>;
  export type Config = Record<string, unknown>;
  export interface ImageOptions { format: 'png' | 'svg' | 'jpeg' | 'webp'; width?: number; height?: number; filename?: string; scale?: number }
  export interface PlotlyStatic {
    react(root: HTMLElement, data: Data[], layout?: Layout, config?: Config): Promise<HTMLElement>;
    restyle(root: HTMLElement, update: Record<string, unknown>, traces?: number | number[]): Promise<HTMLElement>;
    relayout(root: HTMLElement, update: Record<string, unknown>): Promise<HTMLElement>;
    purge(root: HTMLElement): void;
    toImage(root: HTMLElement, options: ImageOptions): Promise<string>;
    downloadImage(root: HTMLElement, options: ImageOptions): Promise<string>;
    Plots: { resize(root: HTMLElement): void };
  }
  const Plotly: PlotlyStatic;
  export default Plotly;
}
