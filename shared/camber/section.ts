// Gross section properties of the generic shapes a precast plant makes. Dimensions in inches.
// Each shape is a sum of rectangles (and, for hollow-core, circles removed), so area, centroid and
// inertia follow from the parallel-axis theorem; perimeter is the exposed outline for V/S.

export interface SectionProps {
  area: number; // in²
  inertia: number; // in⁴, about the horizontal centroidal axis
  yb: number; // in, centroid height from the bottom
  height: number; // in
  volumeToSurface: number; // in
}

interface Part {
  area: number;
  y: number; // centroid height of the part from the bottom
  i0: number; // own inertia
}

const rect = (b: number, h: number, yBottom: number): Part => ({ area: b * h, y: yBottom + h / 2, i0: (b * h ** 3) / 12 });
const circle = (d: number, yCentre: number): Part => ({ area: (Math.PI * d * d) / 4, y: yCentre, i0: (Math.PI * d ** 4) / 64 });

function combine(add: Part[], remove: Part[] = []): { area: number; inertia: number; yb: number } {
  const parts = [...add.map((p) => ({ ...p, s: 1 })), ...remove.map((p) => ({ ...p, s: -1 }))];
  const area = parts.reduce((a, p) => a + p.s * p.area, 0);
  const yb = parts.reduce((a, p) => a + p.s * p.area * p.y, 0) / area;
  const inertia = parts.reduce((a, p) => a + p.s * (p.i0 + p.area * (p.y - yb) ** 2), 0);
  return { area, inertia, yb };
}

export type ShapeInput =
  | { shape: 'rectangle'; width: number; height: number }
  | { shape: 'double-tee'; flangeWidth: number; flangeThickness: number; stemCount?: number; stemWidthTop: number; stemWidthBottom: number; height: number }
  | { shape: 'hollow-core'; width: number; height: number; voidCount: number; voidDiameter: number }
  | { shape: 'inverted-tee'; webWidth: number; height: number; ledgeWidth: number; ledgeHeight: number }
  | { shape: 'i-girder'; topFlangeWidth: number; topFlangeThickness: number; webWidth: number; bottomFlangeWidth: number; bottomFlangeThickness: number; height: number };

/** Section properties from the dimensions of a generic shape (gross section, in). */
export function sectionFromShape(s: ShapeInput): SectionProps {
  let props: { area: number; inertia: number; yb: number };
  let perimeter: number;
  switch (s.shape) {
    case 'rectangle':
      props = combine([rect(s.width, s.height, 0)]);
      perimeter = 2 * (s.width + s.height);
      break;
    case 'double-tee': {
      const n = s.stemCount ?? 2;
      const stemH = s.height - s.flangeThickness;
      // A tapered stem is a rectangle of mean width plus two triangles; we model it as a trapezoid.
      const stems: Part[] = [];
      for (let k = 0; k < n; k++) stems.push(trapezoid(s.stemWidthBottom, s.stemWidthTop, stemH, 0));
      props = combine([rect(s.flangeWidth, s.flangeThickness, stemH), ...stems]);
      const side = Math.hypot(stemH, (s.stemWidthTop - s.stemWidthBottom) / 2);
      perimeter = 2 * s.flangeWidth + 2 * s.flangeThickness + n * (2 * side + s.stemWidthBottom - s.stemWidthTop);
      break;
    }
    case 'hollow-core': {
      const voids = Array.from({ length: s.voidCount }, () => circle(s.voidDiameter, s.height / 2));
      props = combine([rect(s.width, s.height, 0)], voids);
      // Voids are sealed at the ends in practice, so only the outer outline dries (common practice).
      perimeter = 2 * (s.width + s.height);
      break;
    }
    case 'inverted-tee':
      props = combine([rect(s.ledgeWidth, s.ledgeHeight, 0), rect(s.webWidth, s.height - s.ledgeHeight, s.ledgeHeight)]);
      perimeter = 2 * s.ledgeWidth + 2 * s.height;
      break;
    case 'i-girder': {
      const webH = s.height - s.topFlangeThickness - s.bottomFlangeThickness;
      props = combine([
        rect(s.bottomFlangeWidth, s.bottomFlangeThickness, 0),
        rect(s.webWidth, webH, s.bottomFlangeThickness),
        rect(s.topFlangeWidth, s.topFlangeThickness, s.height - s.topFlangeThickness),
      ]);
      perimeter = 2 * s.topFlangeWidth + 2 * s.bottomFlangeWidth - 2 * s.webWidth + 2 * s.height;
      break;
    }
  }
  return { ...props, height: s.height, volumeToSurface: props.area / perimeter };
}

/** Trapezoid of bottom width b1 and top width b2, height h, base at yBottom. */
function trapezoid(b1: number, b2: number, h: number, yBottom: number): Part {
  const area = ((b1 + b2) / 2) * h;
  const yc = (h * (b1 + 2 * b2)) / (3 * (b1 + b2));
  const i0 = (h ** 3 * (b1 * b1 + 4 * b1 * b2 + b2 * b2)) / (36 * (b1 + b2));
  return { area, y: yBottom + yc, i0 };
}
