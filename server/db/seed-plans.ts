import { max, min } from 'simple-statistics';
import fs from 'node:fs';
import path from 'node:path';
import crypto from 'node:crypto';
import { PNG } from 'pngjs';
import { and, asc, eq } from 'drizzle-orm';
import type { Deps } from '../deps';
import type { SeedContext } from './seed-context';
import { sites } from './schema/sites';
import { DEMO_PLANS, DEMO_REFERENCE_POINT, DEMO_SITE, type DemoPlan } from './demo/library-layout';
import { createPlan } from '../modules/plans/plans-service';
import { createZone } from '../modules/zones/zones-service';
import type { SessionUser } from '@shared/schemas/auth';
import type { ZoneUseType } from '@shared/schemas/zones';

/** Image pixels per plan metre for the generated demo plans. */
const PX_PER_M = 20;

type Rgb = [number, number, number];
const COLOURS: Record<string, Rgb> = {
  paper: [250, 249, 245], room: [236, 233, 225], wall: [52, 56, 64], task: [120, 128, 140],
  asphalt: [214, 216, 219], paving: [228, 222, 208], building: [196, 190, 182], bay: [250, 250, 250],
};

/** A simple drawing surface over a pngjs image in plan metres (y up). */
function canvas(widthM: number, heightM: number) {
  const w = Math.round(widthM * PX_PER_M), h = Math.round(heightM * PX_PER_M);
  const png = new PNG({ width: w, height: h });
  const set = (x: number, y: number, c: Rgb) => {
    if (x < 0 || y < 0 || x >= w || y >= h) return;
    const i = (y * w + x) * 4;
    png.data[i] = c[0]; png.data[i + 1] = c[1]; png.data[i + 2] = c[2]; png.data[i + 3] = 255;
  };
  const px = (xM: number) => Math.round(xM * PX_PER_M);
  const py = (yM: number) => Math.round((heightM - yM) * PX_PER_M);
  return {
    png,
    fill(c: Rgb) { for (let y = 0; y < h; y++) for (let x = 0; x < w; x++) set(x, y, c); },
    /** Fills a polygon by scanline (even-odd), in plan metres. */
    polygon(poly: [number, number][], c: Rgb) {
      for (let y = 0; y < h; y++) {
        const yM = heightM - (y + 0.5) / PX_PER_M;
        const xs: number[] = [];
        for (let i = 0; i < poly.length; i++) {
          const [ax, ay] = poly[i], [bx, by] = poly[(i + 1) % poly.length];
          if ((ay <= yM) !== (by <= yM)) xs.push(ax + ((yM - ay) / (by - ay)) * (bx - ax));
        }
        xs.sort((a, b) => a - b);
        for (let k = 0; k + 1 < xs.length; k += 2) for (let x = Math.ceil(xs[k] * PX_PER_M - 0.5); x < xs[k + 1] * PX_PER_M - 0.5; x++) set(x, y, c);
      }
    },
    /** A straight line of the given thickness (pixels), optionally dashed. */
    line(a: [number, number], b: [number, number], c: Rgb, thickness = 3, dashPx = 0) {
      const [x0, y0, x1, y1] = [px(a[0]), py(a[1]), px(b[0]), py(b[1])];
      const steps = Math.max(Math.abs(x1 - x0), Math.abs(y1 - y0), 1);
      const r = Math.floor(thickness / 2);
      for (let s = 0; s <= steps; s++) {
        if (dashPx && Math.floor(s / dashPx) % 2 === 1) continue;
        const x = Math.round(x0 + ((x1 - x0) * s) / steps), y = Math.round(y0 + ((y1 - y0) * s) / steps);
        for (let dy = -r; dy <= r; dy++) for (let dx = -r; dx <= r; dx++) set(x + dx, y + dy, c);
      }
    },
    outline(poly: [number, number][], c: Rgb, thickness = 3, dashPx = 0) {
      poly.forEach((p, i) => this.line(p, poly[(i + 1) % poly.length], c, thickness, dashPx));
    },
  };
}

/** Draws a demo plan: rooms filled and walled, task areas dashed, outdoor areas paved (no text labels). */
export function drawDemoPlan(plan: DemoPlan): Buffer {
  const c = canvas(plan.widthM, plan.heightM);
  c.fill(COLOURS.paper);
  const outdoor = plan.zones.every((z) => z.kind === 'outdoor');
  if (outdoor) {
    // The library's footprint, with the daylight reference probe on its roof.
    const [rx, ry] = DEMO_REFERENCE_POINT;
    c.polygon([[rx - 16, ry - 4], [rx + 16, ry - 4], [rx + 16, ry + 4], [rx - 16, ry + 4]], COLOURS.building);
    c.outline([[rx - 16, ry - 4], [rx + 16, ry - 4], [rx + 16, ry + 4], [rx - 16, ry + 4]], COLOURS.wall, 3);
    c.line([rx - 0.4, ry], [rx + 0.4, ry], COLOURS.wall, 5);
    c.line([rx, ry - 0.4], [rx, ry + 0.4], COLOURS.wall, 5);
  }
  for (const z of plan.zones.filter((z) => z.kind !== 'task_area')) c.polygon(z.polygon, z.kind === 'outdoor' ? (z.useType === 'car_park' ? COLOURS.asphalt : COLOURS.paving) : COLOURS.room);
  for (const z of plan.zones) {
    if (z.kind === 'room') c.outline(z.polygon, COLOURS.wall, 5);
    else if (z.kind === 'task_area') c.outline(z.polygon, COLOURS.task, 2, 6);
    else c.outline(z.polygon, COLOURS.task, 2);
    if (z.useType === 'car_park') {
      // Parking bay lines every 2.5 m along the lower and upper rows.
      const xs = z.polygon.map((p) => p[0]), ys = z.polygon.map((p) => p[1]);
      const [x0, x1, y0, y1] = [min(xs), max(xs), min(ys), max(ys)];
      for (let x = x0 + 2.5; x < x1; x += 2.5) {
        c.line([x, y0], [x, y0 + 5], COLOURS.bay, 2);
        c.line([x, y1 - 5], [x, y1], COLOURS.bay, 2);
      }
    }
    if (z.useType === 'stairs') {
      const xs = z.polygon.map((p) => p[0]), ys = z.polygon.map((p) => p[1]);
      for (let x = min(xs) + 0.3; x < max(xs); x += 0.3) c.line([x, min(ys)], [x, max(ys)], COLOURS.task, 1);
    }
  }
  return PNG.sync.write(c.png);
}

const QUILLBANK_PLAN: DemoPlan = {
  key: 'hall', name: 'Assembly hall', widthM: 30, heightM: 18,
  zones: [
    { key: 'floor', name: 'Assembly floor', kind: 'room', useType: 'warehouse_traffic', polygon: [[0, 0], [22, 0], [22, 18], [0, 18]], demoLevelLux: 300, demoFalloff: 0.2 },
    { key: 'bench', name: 'Inspection bench', kind: 'task_area', useType: 'technical_drawing', polygon: [[4, 4], [10, 4], [10, 7], [4, 7]], demoLevelLux: 800, demoFalloff: 0.05 },
    { key: 'exit', name: 'Exit corridor', kind: 'room', useType: 'exit_route', polygon: [[22, 0], [30, 0], [30, 18], [22, 18]], demoLevelLux: 120, demoFalloff: 0.2 },
  ],
};

export async function seedPlan(deps: Deps, actor: SessionUser, siteId: number, plan: DemoPlan) {
  const dir = path.join(deps.config.dataDir, 'uploads');
  fs.mkdirSync(dir, { recursive: true });
  const tmp = path.join(dir, `seed-${crypto.randomUUID()}.png`);
  fs.writeFileSync(tmp, drawDemoPlan(plan));
  const created = await createPlan(deps, actor, siteId, { path: tmp, originalname: `${plan.key}.png` }, { name: plan.name, widthM: plan.widthM });
  for (const z of plan.zones) {
    createZone(deps, actor, created.id, { name: z.name, kind: z.kind, useType: z.useType as ZoneUseType, planeHeightM: z.kind === 'outdoor' ? 0 : 0.75, wallBandM: z.kind === 'room' ? 0.5 : 0, polygon: z.polygon });
  }
}

function firstSite(deps: Deps, organizationId: number, name?: string) {
  return deps.db.select().from(sites).where(and(eq(sites.organizationId, organizationId), ...(name ? [eq(sites.name, name)] : []))).orderBy(asc(sites.id)).get();
}

/** Plans step: the library's three plans with their zones, and one plan of the second organisation. */
export async function seedPlans(deps: Deps, ctx: SeedContext) {
  const library = firstSite(deps, ctx.demoOrgId, DEMO_SITE.name);
  if (!library) throw new Error('The plans seed step needs the demo site from the surveys step: list the surveys module before plans in server/modules.ts');
  const surveyor: SessionUser = { id: ctx.usersByEmail['surveyor@luxtrail.test'], email: 'surveyor@luxtrail.test', name: 'seed', role: 'surveyor', organizationId: ctx.demoOrgId, organizationName: '' };
  for (const plan of DEMO_PLANS) await seedPlan(deps, surveyor, library.id, plan);

  const works = firstSite(deps, ctx.otherOrgId);
  if (works) {
    const otherAdmin: SessionUser = { id: ctx.usersByEmail['admin@elsewhere.test'], email: 'admin@elsewhere.test', name: 'seed', role: 'admin', organizationId: ctx.otherOrgId, organizationName: '' };
    await seedPlan(deps, otherAdmin, works.id, QUILLBANK_PLAN);
  }
}
