/**
 * The sketch's plan (x–y) and elevation (x–z) as plain shapes in metres, from the engine's own geometry
 * (so the drawing shows exactly what will be meshed). Both views span the same x range, so drawn side
 * by side at one scale they line up. The absorbing layers outside openings are drawn schematically
 * (their real depth is chosen by the solver); everything else is to scale.
 */
import type { Geometry } from '../../../engine/scenario/index.ts';
import type { WallCondition, WallKey } from '../../../engine/scenario/types.ts';
import { formatLength, formatNumber, type LengthUnit } from './units.ts';
import type { Box } from '../../../engine/core/space.ts';

/** A rectangle in view coordinates: a is horizontal (x), b vertical (y in plan, z in elevation). */
export interface Rect2 { a0: number; a1: number; b0: number; b1: number }

export type ShapeKind = 'section' | 'branch' | 'hidden-branch' | 'lining' | 'absorber' | 'room';

export interface Shape { kind: ShapeKind; rect: Rect2; name: string; label?: string }

/** A dimension line: along a (horizontal) at height `at`, or along b (vertical) at abscissa `at`. */
export interface Dimension { along: 'a' | 'b'; from: number; to: number; at: number; text: string }

export interface Marker { kind: 'source' | 'receiver' | 'inlet' | 'outlet'; a: number; b: number; label: string }

export interface WallLine { key: WallKey; condition: string; from: [number, number]; to: [number, number]; open: boolean }

export interface View {
  name: 'plan' | 'elevation';
  /** Axis names for the labels: horizontal, vertical. */
  axes: ['x', 'y'] | ['x', 'z'];
  /** What the view must show, dimensions and absorbing layers included. */
  extent: Rect2;
  shapes: Shape[];
  dimensions: Dimension[];
  markers: Marker[];
  walls: WallLine[];
}

function span(box: Box, view: View['name']): Rect2 {
  return view === 'plan' ? { a0: box.x0, a1: box.x1, b0: box.y0, b1: box.y1 } : { a0: box.x0, a1: box.x1, b0: box.z0, b1: box.z1 };
}

function union(rects: Rect2[]): Rect2 {
  return {
    a0: Math.min(...rects.map((r) => r.a0)), a1: Math.max(...rects.map((r) => r.a1)),
    b0: Math.min(...rects.map((r) => r.b0)), b1: Math.max(...rects.map((r) => r.b1)),
  };
}

/** Schematic depth of an absorbing layer and gap for dimension lines, from the size of the drawing. */
function sizes(bounds: Box): { layer: number; gap: number } {
  const big = Math.max(bounds.x1 - bounds.x0, bounds.y1 - bounds.y0, bounds.z1 - bounds.z0);
  return { layer: 0.07 * big, gap: 0.09 * big };
}

export function ductViews(g: Geometry, unit: LengthUnit): [View, View] {
  return [ductView(g, unit, 'plan'), ductView(g, unit, 'elevation')];
}

function ductView(g: Geometry, unit: LengthUnit, name: View['name']): View {
  const duct = g.duct!, { layer, gap } = sizes(g.bounds), across = name === 'plan' ? 'y' : 'z';
  const shapes: Shape[] = [], dimensions: Dimension[] = [], markers: Marker[] = [];
  const all = span(g.bounds, name);
  for (const s of duct.sections) {
    const rect = name === 'plan' ? { a0: s.x0, a1: s.x1, b0: s.y0, b1: s.y1 } : { a0: s.x0, a1: s.x1, b0: s.z0, b1: s.z1 };
    const size = name === 'plan' ? s.width : s.height;
    shapes.push({ kind: 'section', rect, name: s.name, label: `${name === 'plan' ? 'W' : 'H'} ${formatLength(size, unit, 4)}` });
  }
  for (const l of g.linings ?? []) {
    if (l.face[1] === (name === 'plan' ? 'z' : 'y')) continue; // seen face-on: it would cover the section
    shapes.push({ kind: 'lining', rect: span(l.region, name), name: l.tag, label: `lining ${formatLength(l.thickness, unit, 3)}` });
  }
  for (const b of duct.branches) {
    const inView = b.side[1] === across;
    shapes.push({ kind: inView ? 'branch' : 'hidden-branch', rect: span(b.box, name), name: b.name, label: inView ? b.name : undefined });
    if (inView) {
      const r = span(b.box, name), depth = r.b1 - r.b0, at = r.a1 + 0.25 * gap;
      dimensions.push({ along: 'b', from: r.b0, to: r.b1, at, text: formatLength(depth, unit, 4) });
    }
  }
  for (const a of absorbers(g, name, layer)) shapes.push(a);
  const inlet = duct.inlet, outlet = duct.outlet;
  const mid = (r: { y0: number; y1: number; z0: number; z1: number }) => (name === 'plan' ? (r.y0 + r.y1) / 2 : (r.z0 + r.z1) / 2);
  markers.push({ kind: 'inlet', a: inlet.x, b: mid(inlet.rect), label: 'inlet' });
  markers.push({ kind: 'outlet', a: outlet.x, b: mid(outlet.rect), label: termination(outlet.termination) });
  // Chain of section lengths below the duct, overall length under it when there is more than one section.
  const below = all.b0 - gap;
  for (const s of duct.sections) dimensions.push({ along: 'a', from: s.x0, to: s.x1, at: below, text: formatLength(s.x1 - s.x0, unit, 4) });
  if (duct.sections.length > 1) dimensions.push({ along: 'a', from: all.a0, to: all.a1, at: below - gap, text: formatLength(all.a1 - all.a0, unit, 4) });
  // Widths and heights stand in the section labels; the ports' labels need room beside the layers.
  const extent = union([
    all, ...shapes.map((s) => s.rect),
    { a0: all.a0 - layer - 1.2 * gap, a1: all.a1 + layer + 1.2 * gap, b0: below - (duct.sections.length > 1 ? 1.6 : 0.6) * gap, b1: all.b1 + 0.4 * gap },
  ]);
  return { name, axes: name === 'plan' ? ['x', 'y'] : ['x', 'z'], extent, shapes, dimensions, markers, walls: [] };
}

function termination(t: unknown): string {
  if (t === 'anechoic') return 'outlet (anechoic)';
  if (t === 'rigid') return 'closed end';
  if (t !== null && typeof t === 'object' && 'absorption' in t) return `end plate α = ${formatNumber((t as { absorption: number }).absorption, 3)}`;
  return 'end plate (impedance)';
}

/** The absorbing layers beyond the inlet, an anechoic outlet and open branch ends, drawn `depth` deep. */
function absorbers(g: Geometry, view: View['name'], depth: number): Shape[] {
  const duct = g.duct!, out: Shape[] = [];
  const across = (r: { y0: number; y1: number; z0: number; z1: number }) => (view === 'plan' ? { b0: r.y0, b1: r.y1 } : { b0: r.z0, b1: r.z1 });
  out.push({ kind: 'absorber', rect: { a0: duct.inlet.x - depth, a1: duct.inlet.x, ...across(duct.inlet.rect) }, name: 'inlet' });
  if (duct.outlet.termination === 'anechoic') out.push({ kind: 'absorber', rect: { a0: duct.outlet.x, a1: duct.outlet.x + depth, ...across(duct.outlet.rect) }, name: 'outlet' });
  for (const b of duct.branches) {
    if (b.end !== 'open' || b.side[1] !== (view === 'plan' ? 'y' : 'z')) continue;
    const r = span(b.box, view), up = b.side[0] === '+';
    out.push({ kind: 'absorber', rect: { a0: r.a0, a1: r.a1, b0: up ? r.b1 : r.b0 - depth, b1: up ? r.b1 + depth : r.b0 }, name: b.name, label: 'open end' });
  }
  return out;
}

// ---- room ----

export function roomViews(g: Geometry, unit: LengthUnit): [View, View] {
  return [roomView(g, unit, 'plan'), roomView(g, unit, 'elevation')];
}

/** A wall condition in words for the drawing's legend. */
export function wallWords(w: WallCondition): string {
  if (w === 'rigid') return 'rigid';
  if (w === 'open') return 'open (free field beyond)';
  if ('absorption' in w) return `α = ${formatNumber(w.absorption, 3)}`;
  return `z = ${formatNumber(w.impedance[0], 3)} ${w.impedance[1] < 0 ? '−' : '+'} j${formatNumber(Math.abs(w.impedance[1]), 3)}`;
}

function roomView(g: Geometry, unit: LengthUnit, name: View['name']): View {
  const room = g.room!, [lx, ly, lz] = room.size, { layer, gap } = sizes(g.bounds);
  const lb = name === 'plan' ? ly : lz, second = name === 'plan' ? 'y' : 'z';
  const shapes: Shape[] = [{ kind: 'room', rect: { a0: 0, a1: lx, b0: 0, b1: lb }, name: 'room' }];
  // Walls seen edge-on in this view: x- and x+ at the ends, the pair of the view's vertical axis below and above.
  const edges: [WallKey, [number, number], [number, number]][] = [
    ['x-', [0, 0], [0, lb]], ['x+', [lx, 0], [lx, lb]],
    [`${second}-` as WallKey, [0, 0], [lx, 0]], [`${second}+` as WallKey, [0, lb], [lx, lb]],
  ];
  const walls: WallLine[] = edges.map(([key, from, to]) => ({ key, condition: wallWords(room.walls[key]), from, to, open: room.walls[key] === 'open' }));
  for (const w of walls) {
    if (!w.open) continue;
    const vertical = w.from[0] === w.to[0], outward = w.key[1] === '+' ? 1 : -1;
    const rect = vertical
      ? { a0: outward > 0 ? lx : -layer, a1: outward > 0 ? lx + layer : 0, b0: 0, b1: lb }
      : { a0: 0, a1: lx, b0: outward > 0 ? lb : -layer, b1: outward > 0 ? lb + layer : 0 };
    shapes.push({ kind: 'absorber', rect, name: `wall ${w.key}` });
  }
  const pick = (p: [number, number, number]) => ({ a: p[0], b: name === 'plan' ? p[1] : p[2] });
  const markers: Marker[] = [
    ...room.sources.map((s) => ({ kind: 'source' as const, ...pick(s.position), label: s.name })),
    ...room.receivers.map((r) => ({ kind: 'receiver' as const, ...pick(r.position), label: r.name })),
  ];
  const dimensions: Dimension[] = [
    { along: 'a', from: 0, to: lx, at: -layer - gap, text: formatLength(lx, unit, 4) },
    { along: 'b', from: 0, to: lb, at: lx + layer + gap, text: formatLength(lb, unit, 4) },
  ];
  const extent = { a0: -layer - 0.5 * gap, a1: lx + layer + 1.6 * gap, b0: -layer - 1.6 * gap, b1: lb + layer + 0.5 * gap };
  return { name, axes: name === 'plan' ? ['x', 'y'] : ['x', 'z'], extent, shapes, dimensions, markers, walls };
}

/** Two views drawn one above the other at one scale: both get the same horizontal extent. */
export function alignViews(views: [View, View]): [View, View] {
  const a0 = Math.min(views[0].extent.a0, views[1].extent.a0), a1 = Math.max(views[0].extent.a1, views[1].extent.a1);
  return [{ ...views[0], extent: { ...views[0].extent, a0, a1 } }, { ...views[1], extent: { ...views[1].extent, a0, a1 } }];
}
