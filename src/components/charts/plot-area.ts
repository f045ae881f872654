/**
 * The rectangle a plot draws its data in, inside an SVG of a given size, and
 * the margins left around it for ticks and axis titles.
 */
export interface PlotMarginsPx {
  top: number;
  right: number;
  bottom: number;
  left: number;
}

export interface PlotAreaOptions {
  widthPx: number;
  heightPx: number;
  marginsPx: PlotMarginsPx;
}

export interface PlotArea {
  widthPx: number;
  heightPx: number;
  leftPx: number;
  rightPx: number;
  topPx: number;
  bottomPx: number;
  innerWidthPx: number;
  innerHeightPx: number;
}

export function checkPlotAreaOptions(options: PlotAreaOptions): PlotAreaOptions {
  const { widthPx, heightPx, marginsPx } = options;
  if (!(Number.isFinite(widthPx) && widthPx > 0)) {
    throw new RangeError(`plotArea: option "widthPx" must be a positive number; got ${widthPx}.`);
  }
  if (!(Number.isFinite(heightPx) && heightPx > 0)) {
    throw new RangeError(`plotArea: option "heightPx" must be a positive number; got ${heightPx}.`);
  }
  for (const side of ['top', 'right', 'bottom', 'left'] as const) {
    const value = marginsPx?.[side];
    if (!(Number.isFinite(value) && value >= 0)) {
      throw new RangeError(`plotArea: option "marginsPx.${side}" must be a number ≥ 0; got ${value}.`);
    }
  }
  if (marginsPx.left + marginsPx.right >= widthPx || marginsPx.top + marginsPx.bottom >= heightPx) {
    throw new RangeError(`plotArea: options "marginsPx" leave no room for the plot in ${widthPx} × ${heightPx} px.`);
  }
  return options;
}

export function plotArea(options: PlotAreaOptions): PlotArea {
  const { widthPx, heightPx, marginsPx } = checkPlotAreaOptions(options);
  return {
    widthPx,
    heightPx,
    leftPx: marginsPx.left,
    rightPx: widthPx - marginsPx.right,
    topPx: marginsPx.top,
    bottomPx: heightPx - marginsPx.bottom,
    innerWidthPx: widthPx - marginsPx.left - marginsPx.right,
    innerHeightPx: heightPx - marginsPx.top - marginsPx.bottom,
  };
}
