/** A plan or an elevation drawn to scale in SVG from the view's shapes (model/drawing.ts). */
import type { Dimension, Marker, Shape, View } from '../model/drawing.ts';

const WIDTH = 600;

interface Frame { s: number; a0: number; b1: number; X(a: number): number; Y(b: number): number }

function frame(view: View, pxPerM: number): Frame {
  const { a0, b1 } = view.extent;
  return { s: pxPerM, a0, b1, X: (a) => (a - a0) * pxPerM, Y: (b) => (b1 - b) * pxPerM };
}

/** px per m that fits the widest of the views into the drawing width. */
export function commonScale(views: readonly View[]): number {
  const widest = Math.max(...views.map((v) => v.extent.a1 - v.extent.a0));
  return WIDTH / widest;
}

const FILL: Record<Shape['kind'], string> = {
  section: 'var(--draw-air)', branch: 'var(--draw-air)', 'hidden-branch': 'none', lining: 'url(#qg-hatch-lining)', absorber: 'url(#qg-hatch-absorber)', room: 'var(--draw-air)',
};

function ShapeView({ shape, f }: { shape: Shape; f: Frame }) {
  const { rect } = shape, x = f.X(rect.a0), y = f.Y(rect.b1), w = (rect.a1 - rect.a0) * f.s, h = (rect.b1 - rect.b0) * f.s;
  const outline = shape.kind === 'absorber' || shape.kind === 'lining' ? 'none' : 'var(--draw-line)';
  const showLabel = shape.label !== undefined && (shape.kind === 'section' || shape.kind === 'branch' || shape.kind === 'room');
  return (
    <g className={`shape ${shape.kind}`} data-name={shape.name}>
      <rect x={x} y={y} width={Math.max(w, 0.5)} height={Math.max(h, 0.5)} fill={FILL[shape.kind]} stroke={outline}
        strokeWidth={shape.kind === 'hidden-branch' ? 1 : 1.5} strokeDasharray={shape.kind === 'hidden-branch' ? '5 3' : undefined} />
      {showLabel && w > 46 && h > 26 && (
        <text x={x + w / 2} y={y + h / 2} textAnchor="middle" className="shape-label">
          <tspan x={x + w / 2} dy="-0.2em" className="name">{shape.name}</tspan>
          <tspan x={x + w / 2} dy="1.2em">{shape.label}</tspan>
        </text>
      )}
    </g>
  );
}

function DimensionView({ d, f }: { d: Dimension; f: Frame }) {
  if (d.along === 'a') {
    const x0 = f.X(d.from), x1 = f.X(d.to), y = f.Y(d.at);
    return (
      <g className="dimension">
        <line x1={x0} y1={y} x2={x1} y2={y} markerStart="url(#qg-arrow)" markerEnd="url(#qg-arrow)" />
        <line x1={x0} y1={y - 5} x2={x0} y2={y + 5} /><line x1={x1} y1={y - 5} x2={x1} y2={y + 5} />
        <text x={(x0 + x1) / 2} y={y - 4} textAnchor="middle">{d.text}</text>
      </g>
    );
  }
  const x = f.X(d.at), y0 = f.Y(d.from), y1 = f.Y(d.to), cy = (y0 + y1) / 2;
  return (
    <g className="dimension">
      <line x1={x} y1={y0} x2={x} y2={y1} markerStart="url(#qg-arrow)" markerEnd="url(#qg-arrow)" />
      <line x1={x - 5} y1={y0} x2={x + 5} y2={y0} /><line x1={x - 5} y1={y1} x2={x + 5} y2={y1} />
      <text x={x - 4} y={cy} textAnchor="middle" transform={`rotate(-90 ${x - 4} ${cy})`}>{d.text}</text>
    </g>
  );
}

function MarkerView({ m, f }: { m: Marker; f: Frame }) {
  const x = f.X(m.a), y = f.Y(m.b);
  switch (m.kind) {
    case 'source':
      return <g className="marker source"><path d={`M ${x} ${y - 7} L ${x + 6.5} ${y + 5} L ${x - 6.5} ${y + 5} Z`} /><text x={x + 9} y={y - 6}>{m.label}</text></g>;
    case 'receiver':
      return <g className="marker receiver"><circle cx={x} cy={y} r={5.5} /><path d={`M ${x - 4} ${y} H ${x + 4} M ${x} ${y - 4} V ${y + 4}`} /><text x={x + 9} y={y + 13}>{m.label}</text></g>;
    case 'inlet':
      return <g className="marker port"><path d={`M ${x - 34} ${y} H ${x - 4}`} markerEnd="url(#qg-arrow-solid)" /><text x={x - 6} y={y + 17} textAnchor="end">{m.label}</text></g>;
    case 'outlet':
      return <g className="marker port"><path d={`M ${x + 4} ${y} H ${x + 34}`} markerEnd="url(#qg-arrow-solid)" /><text x={x + 6} y={y + 17}>{m.label}</text></g>;
  }
}

export function ViewDrawing({ view, pxPerM, title }: { view: View; pxPerM: number; title: string }) {
  const f = frame(view, pxPerM), width = (view.extent.a1 - view.extent.a0) * pxPerM, height = (view.extent.b1 - view.extent.b0) * pxPerM;
  const pad = 40;
  return (
    <figure className={`drawing ${view.name}`} data-view={view.name}>
      <figcaption>{title} <span className="axes">({view.axes[0]} → , {view.axes[1]} ↑)</span></figcaption>
      <svg viewBox={`${-pad} ${-pad / 2} ${width + 2 * pad} ${height + pad}`} role="img" aria-label={`${title}, to scale`}>
        {view.shapes.filter((s) => s.kind === 'absorber').map((s, i) => <ShapeView key={`a${i}`} shape={s} f={f} />)}
        {view.shapes.filter((s) => s.kind !== 'absorber' && s.kind !== 'hidden-branch' && s.kind !== 'lining').map((s, i) => <ShapeView key={`s${i}`} shape={s} f={f} />)}
        {view.shapes.filter((s) => s.kind === 'lining' || s.kind === 'hidden-branch').map((s, i) => <ShapeView key={`l${i}`} shape={s} f={f} />)}
        {view.walls.map((w) => (
          <line key={w.key} className={`wall ${w.open ? 'open' : w.condition === 'rigid' ? 'rigid' : 'surface'}`} x1={f.X(w.from[0])} y1={f.Y(w.from[1])} x2={f.X(w.to[0])} y2={f.Y(w.to[1])}>
            <title>{`wall ${w.key}: ${w.condition}`}</title>
          </line>
        ))}
        {view.dimensions.map((d, i) => <DimensionView key={`d${i}`} d={d} f={f} />)}
        {view.markers.map((m, i) => <MarkerView key={`m${i}`} m={m} f={f} />)}
      </svg>
    </figure>
  );
}

export function DrawingLegend({ room }: { room: boolean }) {
  return (
    <ul className="legend">
      <li><svg width="22" height="12"><rect width="22" height="12" fill="url(#qg-hatch-absorber)" stroke="none" /></svg> absorbing layer (air continues without reflection; depth schematic)</li>
      {!room && <li><svg width="22" height="12"><rect width="22" height="12" fill="url(#qg-hatch-lining)" /></svg> porous lining</li>}
      {!room && <li><svg width="22" height="12"><rect x="1" y="1" width="20" height="10" fill="none" stroke="var(--draw-line)" strokeDasharray="5 3" /></svg> branch above or below the drawing plane</li>}
      {room && <li><svg width="22" height="12"><line x1="0" y1="6" x2="22" y2="6" className="wall rigid" /></svg> rigid wall</li>}
      {room && <li><svg width="22" height="12"><line x1="0" y1="6" x2="22" y2="6" className="wall surface" /></svg> absorbing or impedance wall</li>}
      {room && <li><svg width="14" height="14"><path d="M 7 1 L 13 12 L 1 12 Z" className="legend-source" /></svg> source <svg width="14" height="14"><circle cx="7" cy="7" r="5" className="legend-receiver" /></svg> receiver</li>}
    </ul>
  );
}

/** Patterns and arrowheads shared by every drawing on the page (rendered once: ids are page-wide). */
export function DrawingDefs() {
  return (
    <svg width="0" height="0" style={{ position: 'absolute' }} aria-hidden="true">
    <defs>
      <pattern id="qg-hatch-absorber" width="7" height="7" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
        <rect width="7" height="7" fill="var(--draw-absorber-bg)" /><line x1="0" y1="0" x2="0" y2="7" stroke="var(--draw-absorber)" strokeWidth="2" />
      </pattern>
      <pattern id="qg-hatch-lining" width="5" height="5" patternUnits="userSpaceOnUse" patternTransform="rotate(-45)">
        <rect width="5" height="5" fill="var(--draw-lining-bg)" /><line x1="0" y1="0" x2="0" y2="5" stroke="var(--draw-lining)" strokeWidth="1.5" />
      </pattern>
      <marker id="qg-arrow" viewBox="0 0 10 10" refX="10" refY="5" markerWidth="7" markerHeight="7" orient="auto-start-reverse"><path d="M 0 1 L 10 5 L 0 9" fill="none" stroke="var(--draw-dim)" strokeWidth="1.5" /></marker>
      <marker id="qg-arrow-solid" viewBox="0 0 10 10" refX="9" refY="5" markerWidth="8" markerHeight="8" orient="auto"><path d="M 0 0 L 10 5 L 0 10 Z" fill="var(--accent)" /></marker>
    </defs>
    </svg>
  );
}
