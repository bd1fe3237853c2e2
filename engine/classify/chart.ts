/**
 * The Chart: a Scene understood. Every item has one role; axes carry fitted
 * scales; marks are grouped into series with recovered data values.
 */
import type { Rgba } from '../color/types.js';
import type { Box, Scene } from '../read/scene.js';
import type { ChartKind } from '../report/types.js';

export type Role = 'mark' | 'guide' | 'label' | 'legend' | 'decoration';

export type SubRole =
  | 'mark/bar'
  | 'mark/line'
  | 'mark/area'
  | 'mark/point'
  | 'mark/wedge'
  | 'mark/cell'
  | 'mark/other'
  | 'guide/grid'
  | 'guide/axis'
  | 'guide/tick'
  | 'guide/frame'
  | 'guide/background'
  | 'guide/colorbar'
  | 'guide/other'
  | 'label/tick'
  | 'label/axis-title'
  | 'label/title'
  | 'label/legend'
  | 'label/data'
  | 'label/other'
  | 'legend/swatch'
  | 'legend/box'
  | 'decoration/page'
  | 'decoration/shadow'
  | 'decoration/3d-face'
  | 'decoration/other';

export interface ItemRole {
  role: Role;
  sub: SubRole;
}

export type AxisName = 'x' | 'y' | 'y2';
export type ScaleType = 'linear' | 'log' | 'band' | 'time';

export interface AxisTick {
  value: number | string;
  /** Position along the axis in world units (x for horizontal axes, y for vertical). */
  position: number;
  /** Scene index of the tick label. */
  label: number | null;
}

export interface Axis {
  name: AxisName;
  /** Which world coordinate the axis maps to. */
  direction: 'horizontal' | 'vertical';
  scale: ScaleType;
  ticks: AxisTick[];
  /** Numeric axes: position = a·f(value) + b, f = identity (linear, time) or log10. */
  fit: { a: number; b: number; residual: number } | null;
  /** Band axes: category names in drawing order along the axis, with their centre positions. */
  bands: { name: string; position: number }[] | null;
  /** Drawn range [min, max] in data units (numeric axes) or the categories (band). */
  domain: (number | string)[];
  /** Scene index of the axis line when one is drawn. */
  line: number | null;
}

export interface DataPoint {
  x: number | string | null;
  y: number;
  /** Heatmaps: the cell's value (from a colour bar), with x and y the cell's categories/positions. */
  value?: number | null;
  yCategory?: number | string | null;
  /** Scene indices of the items that show this point. */
  items: number[];
}

export interface Series {
  name: string | null;
  color: Rgba | null;
  colorHex: string | null;
  axis: 'y' | 'y2';
  markType: SubRole;
  items: number[];
  points: DataPoint[];
}

export interface Wedge {
  item: number;
  label: string | null;
  color: Rgba | null;
  /** Centre and radii in world units (for tilted pies: of the un-projected circle). */
  cx: number;
  cy: number;
  innerRadius: number;
  outerRadius: number;
  /** Angles in radians, clockwise from 12 o'clock, as drawn (tilted pies: un-projected). */
  start: number;
  end: number;
  /** The data share (see PieInfo.shareBasis). */
  share: number;
  /** Angle over the total angle drawn in the wedge's ring (tilted pies: un-projected angles). */
  angleShare: number;
  /** Sector area over the total sector area (tilted pies: un-projected). */
  areaShare: number;
  /** Scene index of the text linked as this wedge's label. */
  labelItem: number | null;
  /** How far the wedge is pulled out from the common centre (0 when in place). */
  offset: number;
  /** Side-wall items belonging to this wedge (extruded pies). */
  walls: number[];
}

export interface PieInfo {
  cx: number;
  cy: number;
  radius: number;
  innerRadius: number;
  wedges: Wedge[];
  /**
   * Top-face ellipse when the pie is tilted: centre on the page, semi-axes,
   * rotation (radians), tilt (radians). cx/cy of the PieInfo are the drawn
   * centre of the circle (the apex), which differs from the ellipse centre
   * under perspective.
   */
  ellipse: { cx: number; cy: number; rx: number; ry: number; angle: number; tilt: number } | null;
  /** Items that are side walls of an extruded pie. */
  walls: number[];
  /** Wedges pulled out from the centre. */
  exploded: number[];
  /** Radius differs between wedges (rose / polar-area charts). */
  radiusVaries: boolean;
  /** Offset copies of wedges drawn as shadows (decoration/shadow). */
  shadows: number[];
  /**
   * What `share` measures: 'angle' for pies and donuts (tilted pies:
   * un-projected angle); 'radius' for roses whose wedges all have the same
   * angle, where the share is of radial extent (outer − inner radius).
   */
  shareBasis: 'angle' | 'radius';
}

export interface LegendEntry {
  swatch: number;
  label: number | null;
  name: string | null;
  color: Rgba | null;
}

export interface ColorBar {
  /** Items that draw the bar (vector cells or an image). */
  items: number[];
  /** Colours sampled from the low to the high end. */
  colors: Rgba[];
  /** Data value at each end, when tick labels give it. */
  low: number | null;
  high: number | null;
}

export interface Chart {
  scene: Scene;
  kind: ChartKind;
  threeD: boolean;
  orientation: 'vertical' | 'horizontal' | null;
  plotArea: Box | null;
  /** The colour behind the data (plot background, else page, else white). */
  background: Rgba;
  /** The page colour (root background or white). */
  page: Rgba;
  roles: ItemRole[];
  axes: { x: Axis | null; y: Axis | null; y2: Axis | null };
  series: Series[];
  legend: LegendEntry[];
  pie: PieInfo | null;
  colorBar: ColorBar | null;
  /** Indices of the 3D extrusion faces of bars (decoration/3d-face). */
  extrusions: number[];
  title: string | null;
}
