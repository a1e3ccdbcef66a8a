import sharp, { type Exif } from 'sharp';

/**
 * Invented demo photographs of fluid-preserved specimens in glass jars, drawn as SVG and rendered
 * with sharp. Nothing here is a real photograph, a real collection or a real camera: the seeder
 * needs pictures that look like a conservator's survey shots (jar on a studio sweep, scale bar and
 * grey card in frame) and that say exactly where the fluid line, scale and card are, so that demo
 * marks and tests can be placed on them without guessing.
 *
 * Geometry is orthographic with a small camera tilt: horizontal circles (rim, base, fluid surface)
 * appear as flat ellipses, so a round jar's front edges bow downwards. "y of a level" always means
 * the front-centre point of that level, which is where the eye reads a fluid line.
 */

export type JarShape = 'cylinder' | 'rectangular' | 'oval';
export type SealKind = 'pitch' | 'wax' | 'silicone' | 'none';
export type SpecimenSilhouette = 'fish' | 'frog' | 'snake' | 'organ' | 'cephalopod' | 'generic';
export type JarView = 'front' | 'back' | 'left' | 'right' | 'top' | 'detail';

export interface JarPhotoParams {
	/** Deterministic variation (jar size, jitter, background texture). */
	seed: number;
	/** Default 1600 × 2000 (portrait). */
	width?: number;
	height?: number;
	shape: JarShape;
	silhouette: SpecimenSilhouette;
	seal: SealKind;
	/** Drawn on a paper label on the jar, e.g. 'STC.1898.014'. */
	objectNumber: string;
	/** 0..1, fluid height as a fraction of the jar's inner height. */
	fluidFill: number;
	/** sRGB 0..255 of the fluid (pale straw to dark amber over the years). */
	fluidColour: [number, number, number];
	/** 0..1 height of the specimen's top within the jar's inner height (default 0.8). */
	specimenTopFraction?: number;
	/** EXIF capture time, e.g. { local: '2019:06:14 10:32:05', offset: '+01:00' }. */
	captureTime: { local: string; offset: string };
	view?: JarView;
	/**
	 * Where the camera stood this time: the scene magnified by `zoom` (1 to 1.1) about the frame's
	 * centre, then moved by (dx, dy) px. A tripod is never put back exactly, which is why photos of
	 * different checks must be registered before they are compared. The truth follows the scene.
	 */
	camera?: { zoom: number; dx: number; dy: number };
}

/** Where things are, in photo pixels (for later demo marks and tests). */
export interface JarPhotoTruth {
	width: number;
	height: number;
	/** From the scale bar: pixels per millimetre in the plane of the jar's front. */
	pxPerMm: number;
	scaleBar: { from: [number, number]; to: [number, number]; lengthMm: number };
	/** The 18% grey card (sRGB 119,119,119), flat. */
	greyCard: { x: number; y: number; w: number; h: number };
	fluidLineY: number;
	innerBaseY: number;
	specimenTopY: number;
	/** The rim under the lid, where the seal runs (front centre), and the jar's centre line and half width. */
	rimY: number;
	centreX: number;
	halfWidth: number;
	/** Outer bounding box of jar and lid; in the detail view it runs past the frame. */
	jar: { x: number; y: number; w: number; h: number };
}

type Rgb = [number, number, number];
interface Box {
	x: number;
	y: number;
	w: number;
	h: number;
}

const DEFAULT_W = 1600;
const DEFAULT_H = 2000;
/** Pixels per mm at the default size: a 266 × 333 mm field, room for jars up to ~230 mm tall. */
const BASE_PX_PER_MM = 6;
const GREY_CARD: Rgb = [119, 119, 119];
const SCALE_MM = 100;

// ---------------------------------------------------------------------------------------------
// Small utilities

/** mulberry32: tiny, fast and the same on every platform, which is all the demo needs. */
function makeRng(seed: number): () => number {
	let a = (Math.floor(seed) ^ 0x9e3779b9) >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

const between = (rng: () => number, lo: number, hi: number): number => lo + (hi - lo) * rng();

/** Two decimals keep the SVG short and the truth equal to what was drawn. */
const r2 = (n: number): number => Math.round(n * 100) / 100;
const f = (n: number): string => String(r2(n));

const clampByte = (n: number): number => Math.max(0, Math.min(255, Math.round(n)));
const css = (c: Rgb): string => `rgb(${clampByte(c[0])},${clampByte(c[1])},${clampByte(c[2])})`;
const mix = (a: Rgb, b: Rgb, t: number): Rgb => [a[0] + (b[0] - a[0]) * t, a[1] + (b[1] - a[1]) * t, a[2] + (b[2] - a[2]) * t];
const scaleRgb = (c: Rgb, k: number): Rgb => [c[0] * k, c[1] * k, c[2] * k];

const escapeXml = (s: string): string =>
	s.replace(/[&<>"']/g, (ch) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&apos;' })[ch] ?? ch);

// ---------------------------------------------------------------------------------------------
// Parameters

interface Resolved {
	seed: number;
	width: number;
	height: number;
	shape: JarShape;
	silhouette: SpecimenSilhouette;
	seal: SealKind;
	objectNumber: string;
	fluidFill: number;
	fluid: Rgb;
	specimenTop: number;
	view: JarView;
}

const EXIF_LOCAL = /^\d{4}:\d{2}:\d{2} \d{2}:\d{2}:\d{2}$/;
const EXIF_OFFSET = /^[+-]\d{2}:\d{2}$/;

/** Bad seeder data should fail loudly here rather than draw a strange picture or write odd EXIF. */
function resolve(p: JarPhotoParams): Resolved {
	const unit = (name: string, v: number) => {
		if (!Number.isFinite(v) || v < 0 || v > 1) throw new RangeError(`${name} must be between 0 and 1, not ${v}.`);
		return v;
	};
	const size = (name: string, v: number) => {
		if (!Number.isInteger(v) || v < 200 || v > 8000) throw new RangeError(`${name} must be a whole number of pixels from 200 to 8000, not ${v}.`);
		return v;
	};
	for (const c of p.fluidColour) {
		if (!Number.isFinite(c) || c < 0 || c > 255) throw new RangeError(`fluidColour channels must be 0..255, not ${c}.`);
	}
	if (!EXIF_LOCAL.test(p.captureTime.local)) throw new RangeError(`captureTime.local must look like 2019:06:14 10:32:05, not ${p.captureTime.local}.`);
	if (!EXIF_OFFSET.test(p.captureTime.offset)) throw new RangeError(`captureTime.offset must look like +01:00, not ${p.captureTime.offset}.`);
	return {
		seed: p.seed,
		width: size('width', p.width ?? DEFAULT_W),
		height: size('height', p.height ?? DEFAULT_H),
		shape: p.shape,
		silhouette: p.silhouette,
		seal: p.seal,
		objectNumber: p.objectNumber,
		fluidFill: unit('fluidFill', p.fluidFill),
		fluid: [p.fluidColour[0], p.fluidColour[1], p.fluidColour[2]],
		specimenTop: unit('specimenTopFraction', p.specimenTopFraction ?? 0.8),
		view: p.view ?? 'front',
	};
}

// ---------------------------------------------------------------------------------------------
// Scene geometry

/** Outer jar size in mm, plausible for teaching-collection jars of each shape. */
interface JarMm {
	w: number;
	d: number;
	h: number;
}

function jarSizeMm(shape: JarShape, rng: () => number): JarMm {
	const h = between(rng, 165, 230);
	if (shape === 'cylinder') {
		const w = between(rng, 82, 110);
		return { w, d: w, h };
	}
	if (shape === 'oval') {
		const w = between(rng, 112, 138);
		return { w, d: w * between(rng, 0.55, 0.65), h };
	}
	return { w: between(rng, 118, 148), d: between(rng, 55, 75), h };
}

/** How the jar sits in the frame. */
interface Jar {
	round: boolean;
	cx: number;
	/** Outer half-width and the section ellipse's half-height (round) or the top face's depth (flat). */
	rx: number;
	ry: number;
	wall: number;
	rimY: number;
	baseY: number;
	innerBaseY: number;
	lidTopY: number;
	lidRx: number;
	lidRy: number;
	fluidLineY: number;
	specimenTopY: number;
	ppm: number;
	/** Vertical foreshortening of upright lengths. */
	vs: number;
}

interface Scene {
	width: number;
	height: number;
	jar: Jar;
	jarBox: Box;
	scaleBar: { from: [number, number]; to: [number, number]; vertical: boolean };
	greyCard: Box;
	/** Where the studio sweep turns from backdrop to floor. */
	horizonY: number;
	/** Floor foreshortening: a depth of 1 mm on the floor spans this many mm on screen. */
	floorK: number;
}

interface ViewSetup {
	ppm: number;
	tiltDeg: number;
	cx: number;
	baseY: number;
}

const LID_MM = 7;
const BASE_GLASS_MM = 9;
const WALL_MM = 4;

/** Width of the jar as this view sees it, and its depth along the line of sight. */
function visibleMm(size: JarMm, view: JarView): { w: number; d: number } {
	return view === 'left' || view === 'right' ? { w: size.d, d: size.w } : { w: size.w, d: size.d };
}

function placeJar(r: Resolved, size: JarMm, v: ViewSetup): Jar {
	const { w, d } = visibleMm(size, r.view);
	const tilt = (v.tiltDeg * Math.PI) / 180;
	const vs = Math.cos(tilt);
	const e = Math.sin(tilt);
	const round = r.shape !== 'rectangular';
	const ppm = v.ppm;
	const rx = (w / 2) * ppm;
	// A round section's ellipse half-height; a flat jar's top face shows its whole depth.
	const ry = round ? (e * d * ppm) / 2 : e * d * ppm;
	const rimY = v.baseY - (size.h - LID_MM) * ppm * vs;
	const innerBaseY = v.baseY - BASE_GLASS_MM * ppm * vs;
	const innerH = innerBaseY - rimY;
	const lidRx = rx + 2 * ppm;
	const lidRy = round ? (ry * lidRx) / rx : ry;
	return {
		round,
		cx: v.cx,
		rx,
		ry,
		wall: WALL_MM * ppm,
		rimY,
		baseY: v.baseY,
		innerBaseY,
		lidTopY: rimY - LID_MM * ppm * vs,
		lidRx,
		lidRy,
		fluidLineY: r2(innerBaseY - r.fluidFill * innerH),
		specimenTopY: r2(innerBaseY - r.specimenTop * innerH),
		ppm,
		vs,
	};
}

/** The outer box: lid top (its far edge) to the front of the base. */
function jarBox(j: Jar): Box {
	const top = j.round ? j.lidTopY - 2 * j.lidRy : j.lidTopY - j.lidRy;
	return { x: r2(j.cx - j.lidRx), y: r2(top), w: r2(2 * j.lidRx), h: r2(j.baseY - top) };
}

/** Upright ruler card: its 0 mm mark 5 mm above the floor, standing right of the jar. */
function uprightScale(j: Jar, ppm: number): Scene['scaleBar'] {
	const x = r2(j.cx + j.lidRx + 14 * ppm + 3.5 * ppm);
	const y0 = r2(j.baseY - 5 * ppm);
	return { from: [x, y0], to: [x, r2(y0 - SCALE_MM * ppm)], vertical: true };
}

function layout(r: Resolved, size: JarMm, rng: () => number): Scene {
	// The composition is made for a 4:5 stage and centred in frames of other proportions.
	const s = Math.min(r.width / DEFAULT_W, r.height / DEFAULT_H);
	const stage = { x: (r.width - DEFAULT_W * s) / 2, y: (r.height - DEFAULT_H * s) / 2, w: DEFAULT_W * s, h: DEFAULT_H * s };
	const ppm0 = BASE_PX_PER_MM * s;
	const jitter = between(rng, -0.012, 0.012) * stage.w;
	if (r.view === 'top') return layoutTop(r, size, stage, ppm0, jitter);
	if (r.view === 'detail') return layoutDetail(r, size, stage, ppm0);
	const jar = placeJar(r, size, { ppm: ppm0, tiltDeg: 3, cx: stage.x + 0.41 * stage.w + jitter, baseY: stage.y + 0.8 * stage.h });
	const cardW = 62 * ppm0;
	const cardH = 40 * ppm0;
	return {
		width: r.width,
		height: r.height,
		jar,
		jarBox: jarBox(jar),
		scaleBar: uprightScale(jar, ppm0),
		greyCard: roundBox({ x: stage.x + 0.05 * stage.w, y: jar.baseY + 12 * ppm0, w: cardW, h: cardH }),
		horizonY: jar.baseY - 45 * ppm0,
		floorK: 0.05,
	};
}

/** A high three-quarter view onto lid and seal; ruler and card lie flat on the floor in front. */
function layoutTop(r: Resolved, size: JarMm, stage: Box, ppm: number, jitter: number): Scene {
	const tilt = 40;
	const jar = placeJar(r, size, { ppm, tiltDeg: tilt, cx: stage.x + 0.5 * stage.w + jitter, baseY: stage.y + 0.78 * stage.h });
	const k = Math.sin((tilt * Math.PI) / 180);
	const y = r2(jar.baseY + 22 * ppm);
	const x0 = r2(stage.x + stage.w - 14 * ppm - (SCALE_MM + 4) * ppm);
	return {
		width: r.width,
		height: r.height,
		jar,
		jarBox: jarBox(jar),
		scaleBar: { from: [x0, y], to: [r2(x0 + SCALE_MM * ppm), y], vertical: false },
		greyCard: roundBox({ x: stage.x + 12 * ppm, y: jar.baseY + 16 * ppm, w: 62 * ppm, h: 40 * ppm * k }),
		horizonY: stage.y + 0.08 * stage.h,
		floorK: k,
	};
}

/**
 * A closer look at seal and fluid line: as much magnification as still leaves room beside the jar
 * for the grey card above the upright ruler.
 */
function layoutDetail(r: Resolved, size: JarMm, stage: Box, ppm0: number): Scene {
	const { w } = visibleMm(size, r.view);
	const fieldW = stage.w / ppm0;
	const fieldH = stage.h / ppm0;
	const zoom = Math.min(1.7, fieldH / 190, fieldW / (w + 72));
	const ppm = ppm0 * zoom;
	const cx = stage.x + 10 * ppm + (w / 2 + 2) * ppm;
	// Place once at baseY 0 to find the focus (halfway from lid to fluid line), then move it to mid-frame.
	const probe = placeJar(r, size, { ppm, tiltDeg: 3, cx, baseY: 0 });
	const focus = (probe.lidTopY + probe.fluidLineY) / 2;
	const jar = placeJar(r, size, { ppm, tiltDeg: 3, cx, baseY: stage.y + stage.h / 2 - focus });
	const colX = jar.cx + jar.lidRx + 12 * ppm;
	// Card (with its mount and print) above, a gap, then the ruler card (5 mm below 0 to 110 mm).
	const colH = (40 + 10 + 115) * ppm;
	const colTop = stage.y + (stage.h - colH) / 2;
	const rulerBottom = colTop + colH;
	const x = r2(colX + 3.5 * ppm);
	const y0 = r2(rulerBottom - 5 * ppm);
	return {
		width: r.width,
		height: r.height,
		jar,
		jarBox: jarBox(jar),
		scaleBar: { from: [x, y0], to: [x, r2(y0 - SCALE_MM * ppm)], vertical: true },
		greyCard: roundBox({ x: colX, y: colTop, w: 40 * ppm, h: 40 * ppm }),
		horizonY: jar.baseY - 45 * ppm,
		floorK: 0.05,
	};
}

const roundBox = (b: Box): Box => ({ x: Math.round(b.x), y: Math.round(b.y), w: Math.round(b.w), h: Math.round(b.h) });

// ---------------------------------------------------------------------------------------------
// Section curves: every horizontal level of a round jar is an ellipse whose front point is at y.

/** y of the front edge of level `y` at horizontal position x (x within the ellipse). */
function frontY(j: Jar, y: number, rx: number, ry: number, x: number): number {
	if (!j.round) return y;
	const u = Math.max(-1, Math.min(1, (x - j.cx) / rx));
	return y - ry + ry * Math.sqrt(1 - u * u);
}

/** Path commands from the left end of level y's front edge to its right end (current point at left). */
function frontEdgeLR(j: Jar, y: number, rx: number, ry: number, x1: number): string {
	if (!j.round) return `L${f(x1)},${f(y)}`;
	return `A${f(rx)},${f(ry)} 0 0 0 ${f(x1)},${f(frontY(j, y, rx, ry, x1))}`;
}

function frontEdgeRL(j: Jar, y: number, rx: number, ry: number, x0: number): string {
	if (!j.round) return `L${f(x0)},${f(y)}`;
	return `A${f(rx)},${f(ry)} 0 0 1 ${f(x0)},${f(frontY(j, y, rx, ry, x0))}`;
}

/** A band between two levels across the full width of an ellipse of half-width rx. */
function bandPath(j: Jar, top: number, bottom: number, rx: number, ry: number): string {
	const x0 = j.cx - rx;
	const x1 = j.cx + rx;
	return `M${f(x0)},${f(frontY(j, top, rx, ry, x0))} ${frontEdgeLR(j, top, rx, ry, x1)} L${f(x1)},${f(frontY(j, bottom, rx, ry, x1))} ${frontEdgeRL(j, bottom, rx, ry, x0)} Z`;
}

/** The whole visible solid between two levels: front band plus the top face of the upper level. */
function solidPath(j: Jar, top: number, bottom: number, rx: number, ry: number): string {
	const x0 = j.cx - rx;
	const x1 = j.cx + rx;
	const side = (y: number) => frontY(j, y, rx, ry, x0);
	if (!j.round) return `M${f(x0)},${f(top - ry)} L${f(x1)},${f(top - ry)} L${f(x1)},${f(bottom)} L${f(x0)},${f(bottom)} Z`;
	return `M${f(x0)},${f(side(top))} A${f(rx)},${f(ry)} 0 0 1 ${f(x1)},${f(side(top))} L${f(x1)},${f(side(bottom))} ${frontEdgeRL(j, bottom, rx, ry, x0)} Z`;
}

/** The top face of level y (ellipse or flat rectangle). */
function facePath(j: Jar, y: number, rx: number, ry: number): string {
	if (!j.round) return `M${f(j.cx - rx)},${f(y - ry)} H${f(j.cx + rx)} V${f(y)} H${f(j.cx - rx)} Z`;
	return `M${f(j.cx - rx)},${f(y - ry)} A${f(rx)},${f(ry)} 0 1 0 ${f(j.cx + rx)},${f(y - ry)} A${f(rx)},${f(ry)} 0 1 0 ${f(j.cx - rx)},${f(y - ry)} Z`;
}

const innerRx = (j: Jar) => j.rx - j.wall;
const innerRy = (j: Jar) => (j.round ? (j.ry * innerRx(j)) / j.rx : j.ry);

/** Fluid as seen: the front column plus the surface seen from slightly above. */
function fluidPath(j: Jar): string {
	// A dry jar has no fluid at all, not a film on its base ("M0,0" clips to nothing).
	if (j.fluidLineY >= j.innerBaseY) return 'M0,0';
	return solidPath(j, j.fluidLineY, j.innerBaseY, innerRx(j), innerRy(j));
}

// ---------------------------------------------------------------------------------------------
// Backdrop, shadows and studio props

function backdrop(sc: Scene, rng: () => number): string {
	const { width: W, height: H } = sc;
	const hz = Math.max(0, Math.min(1, sc.horizonY / H));
	const warm = between(rng, -3, 3);
	const top: Rgb = [186 + warm, 186, 184 - warm];
	const wall: Rgb = [214 + warm, 213, 209 - warm];
	const floor: Rgb = [204 + warm, 202, 197 - warm];
	const front: Rgb = [184 + warm, 182, 177 - warm];
	const lx = between(rng, 0.3, 0.55);
	const ly = between(rng, 0.3, 0.45);
	return `<defs>
<linearGradient id="bg" gradientUnits="userSpaceOnUse" x1="0" y1="0" x2="0" y2="${H}">
<stop offset="0" stop-color="${css(top)}"/><stop offset="${f(hz * 0.85)}" stop-color="${css(wall)}"/>
<stop offset="${f(Math.min(1, hz + 0.04))}" stop-color="${css(floor)}"/><stop offset="1" stop-color="${css(front)}"/></linearGradient>
<radialGradient id="spot" cx="${f(lx)}" cy="${f(ly)}" r="0.6"><stop offset="0" stop-color="#fff" stop-opacity="0.16"/><stop offset="1" stop-color="#fff" stop-opacity="0"/></radialGradient>
<radialGradient id="vig" cx="0.5" cy="0.47" r="0.75"><stop offset="0.55" stop-color="#000" stop-opacity="0"/><stop offset="1" stop-color="#000" stop-opacity="0.22"/></radialGradient>
<radialGradient id="soft"><stop offset="0" stop-color="#000" stop-opacity="1"/><stop offset="1" stop-color="#000" stop-opacity="0"/></radialGradient>
</defs>
<rect width="${W}" height="${H}" fill="url(#bg)"/><rect width="${W}" height="${H}" fill="url(#spot)"/><rect width="${W}" height="${H}" fill="url(#vig)"/>`;
}

/** Contact shadow under the base, a soft cast shadow behind to the right, light thrown through the fluid. */
function jarShadows(sc: Scene, fluid: Rgb): string {
	const j = sc.jar;
	// The base's own footprint on the floor: the section ellipse (or face depth) at the base.
	const footY = j.baseY - (j.round ? j.ry : j.ry / 2);
	const footRy = Math.max(j.round ? j.ry : j.ry / 2, 3 * j.ppm);
	const contact = `<ellipse cx="${f(j.cx)}" cy="${f(footY)}" rx="${f(j.rx * 1.1)}" ry="${f(footRy * 1.25 + 2 * j.ppm)}" fill="url(#soft)" opacity="0.4"/>`;
	const castRy = Math.max(footRy * 1.2, 6 * j.ppm);
	const castX = j.cx + j.rx * 0.55;
	const castY = footY - castRy * 0.45;
	const cast = `<ellipse cx="${f(castX)}" cy="${f(castY)}" rx="${f(j.rx * 1.45)}" ry="${f(castRy)}" fill="url(#soft)" opacity="0.16"/>`;
	const glow = `<ellipse cx="${f(castX + j.rx * 0.3)}" cy="${f(castY)}" rx="${f(j.rx * 0.55)}" ry="${f(castRy * 0.5)}" fill="${css(mix(fluid, [255, 255, 255], 0.3))}" opacity="0.12"/>`;
	return contact + cast + glow;
}

/** A propped card's soft shadow: two offset translucent copies are far cheaper than a blur filter. */
function propShadow(b: Box, ppm: number): string {
	const o1 = 1.2 * ppm;
	const o2 = 3 * ppm;
	return `<rect x="${f(b.x + o2)}" y="${f(b.y + o1)}" width="${f(b.w)}" height="${f(b.h + o1)}" rx="${f(2 * ppm)}" fill="#000" opacity="0.06"/>` +
		`<rect x="${f(b.x + o1)}" y="${f(b.y + o1 * 0.6)}" width="${f(b.w)}" height="${f(b.h)}" rx="${f(ppm)}" fill="#000" opacity="0.1"/>`;
}

function greyCard(sc: Scene): string {
	const b = sc.greyCard;
	const ppm = sc.jar.ppm;
	const k = sc.scaleBar.vertical ? 1 : sc.floorK;
	const m = 2.5 * ppm;
	const mount: Box = { x: b.x - m, y: b.y - m * k, w: b.w + 2 * m, h: b.h + (2 * m + 4 * ppm) * k };
	const words = '18% GREY · REFLECTANCE REFERENCE';
	const fs = Math.min(2.4 * ppm, (0.9 * mount.w) / (0.62 * words.length));
	const print = `<text x="${f(mount.x + mount.w / 2)}" y="0" font-family="serif" font-size="${f(fs)}" text-anchor="middle" fill="#55554f" transform="translate(0,${f(b.y + b.h + 4.2 * ppm * k)}) scale(1,${f(k)})">${words}</text>`;
	// The grey itself is one flat fill exactly on the truth box; nothing is drawn over it.
	return propShadow(mount, ppm) + `<rect x="${f(mount.x)}" y="${f(mount.y)}" width="${f(mount.w)}" height="${f(mount.h)}" fill="#efefeb"/>` +
		`<rect x="${b.x}" y="${b.y}" width="${b.w}" height="${b.h}" fill="${css(GREY_CARD)}"/>${print}`;
}

/**
 * A black-and-white photographic scale, drawn along +x in mm (0 at the origin) and turned upright
 * or laid on the floor by the transform; the line from..to runs along the centre of the blocks.
 */
function scaleBar(sc: Scene): string {
	const ppm = sc.jar.ppm;
	const [fx, fy] = sc.scaleBar.from;
	const t = sc.scaleBar.vertical
		? `translate(${f(fx)},${f(fy)}) rotate(-90) scale(${f(ppm)}) translate(0,-3.5)`
		: `translate(${f(fx)},${f(fy)}) scale(${f(ppm)},${f(ppm * sc.floorK)}) translate(0,-3.5)`;
	const blocks: string[] = [];
	for (let i = 0; i < 10; i++) blocks.push(`<rect x="${i * 10}" y="1" width="10" height="5" fill="${i % 2 === 0 ? '#181818' : '#f6f6f2'}"/>`);
	const ticks: string[] = [];
	for (let mm = 0; mm <= 100; mm += 5) {
		const long = mm % 10 === 0;
		ticks.push(`<line x1="${mm}" y1="6" x2="${mm}" y2="${long ? 9.2 : 7.8}" stroke="#181818" stroke-width="0.28"/>`);
		if (long) ticks.push(`<text x="${mm}" y="12.6" font-family="serif" font-size="2.6" text-anchor="middle" fill="#181818">${mm / 10}</text>`);
	}
	const card = `<rect x="-5" y="-1" width="115" height="16" rx="0.6" fill="#eeede8"/><rect x="-5" y="-1" width="115" height="16" rx="0.6" fill="none" stroke="#b9b8b2" stroke-width="0.2"/>`;
	const shadow = `<rect x="-4.4" y="-0.2" width="115" height="16.6" rx="0.8" fill="#000" opacity="0.12"/>`;
	return `<g transform="${t}">${shadow}${card}${blocks.join('')}<rect x="0" y="1" width="100" height="5" fill="none" stroke="#181818" stroke-width="0.25"/>${ticks.join('')}<text x="106.5" y="12.6" font-family="serif" font-size="2.4" text-anchor="middle" fill="#181818">cm</text></g>`;
}

// ---------------------------------------------------------------------------------------------
// Specimens: organic silhouettes in a 100-unit-wide design box with the top at y = 0

/** How a specimen part looks: seen through the fluid it is filtered; above the line it dries pale. */
type Paint = (c: Rgb) => string;

interface Art {
	height: number;
	/** Where the suspension thread is tied, in design units; null for specimens standing on the base. */
	attach: [number, number] | null;
	/** Horizontal squeeze when seen from the side (a fish is thin, a coiled snake is round). */
	sideSqueeze: number;
	draw: (paint: Paint, rng: () => number, toBase: number) => string;
}

function fish(): Art {
	const back: Rgb = [132, 124, 98];
	const belly: Rgb = [214, 204, 172];
	const fin: Rgb = [168, 150, 112];
	const body = 'M45,46 L55,46 C62,80 79,122 79,166 C79,208 66,240 50,262 C34,240 21,208 21,166 C21,122 38,80 45,46 Z';
	return {
		height: 262,
		attach: [50, 27],
		sideSqueeze: 0.32,
		draw: (p) => `
<path d="M44,50 C40,30 28,12 18,0 C34,6 46,16 50,27 C54,16 66,6 82,0 C72,12 60,30 56,50 Z" fill="${p(fin)}"/>
<path d="M77,140 C92,150 95,184 86,206 C84,190 81,178 76,174 Z" fill="${p(fin)}"/>
<path d="M24,118 C12,128 10,148 14,160 C18,150 21,144 24,142 Z" fill="${p(fin)}"/>
<path d="${body}" fill="${p(back)}"/>
<path d="${body}" fill="url(#vol)"/>
<path d="M45,60 C39,96 23,130 24,170 C25,208 36,240 50,258 C42,236 35,206 37,170 C39,130 45,98 45,60 Z" fill="${p(belly)}" opacity="0.85"/>
<path d="M50,58 C55,110 58,170 52,238" fill="none" stroke="${p([96, 88, 68])}" stroke-width="1.2" opacity="0.7"/>
<path d="M28,218 Q50,234 72,218" fill="none" stroke="${p([92, 82, 62])}" stroke-width="1.6"/>
<ellipse cx="60" cy="204" rx="8" ry="15" fill="${p(fin)}" opacity="0.7" transform="rotate(-18 60 204)"/>
<path d="M47,258 L50,262 L53,258" fill="none" stroke="${p([80, 72, 56])}" stroke-width="1.2"/>
<circle cx="41" cy="238" r="5" fill="${p([226, 222, 206])}"/><circle cx="40.5" cy="238.5" r="2" fill="${p([70, 64, 54])}"/>`,
	};
}

function frog(): Art {
	const skin: Rgb = [150, 140, 106];
	const pale: Rgb = [206, 196, 162];
	const flesh: Rgb = [184, 158, 124];
	const mirror = (d: string) => d.replace(/(-?\d+(?:\.\d+)?),(-?\d+(?:\.\d+)?)/g, (_m, a: string, b: string) => `${r2(100 - Number(a))},${b}`);
	const arm = 'M39,40 C31,42 25,48 22,56 C21,59 22,61 24,60 L24,64 L26,60 L28,63 L28,59 C30,54 34,50 40,48 Z';
	const thigh = 'M44,74 C35,77 26,85 22,93 C20,98 24,101 28,98 C33,94 39,89 47,84 Z';
	const shin = 'M23,92 C27,99 33,104 40,106 C42,108 41,111 38,110 C31,108 25,104 20,97 Z';
	const foot = 'M38,106 C36,112 33,118 28,123 L25,127 L29,125 L30,128.5 L32.5,125 L34.5,128 L35.5,123 L38,127 L38.5,121 C41,116 42,111 41,106 Z';
	const flap = 'M40,44 L29,47 L31,52 L39,55 Z';
	const both = (p: Paint, d: string, c: Rgb) => `<path d="${d}" fill="${p(c)}"/><path d="${mirror(d)}" fill="${p(c)}"/>`;
	return {
		height: 132,
		attach: [50, 2],
		sideSqueeze: 0.28,
		draw: (p) => {
			const pins = [[24, 63], [76, 63], [30, 127], [70, 127], [30, 49], [70, 49]]
				.map(([x, y]) => `<circle cx="${x}" cy="${y}" r="1.2" fill="${p([64, 64, 66])}"/><circle cx="${(x ?? 0) - 0.4}" cy="${(y ?? 0) - 0.4}" r="0.4" fill="${p([220, 220, 220])}"/>`)
				.join('');
			return `
<rect x="8" y="0" width="84" height="132" rx="2" fill="${p([226, 234, 228])}" opacity="0.3" stroke="${p([96, 112, 104])}" stroke-width="0.8"/>
<circle cx="50" cy="3.6" r="1.6" fill="none" stroke="${p([96, 112, 104])}" stroke-width="0.6"/>
${both(p, thigh, skin)}${both(p, shin, skin)}${both(p, foot, scaleRgb(skin, 1.05))}${both(p, arm, skin)}
<path d="M50,13 C59,13 67,17 68,24 C69,30 66,34 65,37 C68,46 69,56 67,66 C65,76 58,84 50,86 C42,84 35,76 33,66 C31,56 32,46 35,37 C34,34 31,30 32,24 C33,17 41,13 50,13 Z" fill="${p(skin)}"/>
<path d="M50,13 C59,13 67,17 68,24 C69,30 66,34 65,37 C68,46 69,56 67,66 C65,76 58,84 50,86 C42,84 35,76 33,66 C31,56 32,46 35,37 C34,34 31,30 32,24 C33,17 41,13 50,13 Z" fill="url(#vol)"/>
<ellipse cx="33" cy="22" rx="3" ry="2.4" fill="${p(scaleRgb(skin, 0.82))}"/><ellipse cx="67" cy="22" rx="3" ry="2.4" fill="${p(scaleRgb(skin, 0.82))}"/>
${both(p, flap, pale)}
<path d="M41,40 C45,37 55,37 59,40 C61,52 61,66 57,76 C53,79 47,79 43,76 C39,66 39,52 41,40 Z" fill="${p(flesh)}"/>
<path d="M42,47 C44,43 48,44 50,46 C52,44 56,43 58,47 C59,52 56,56 52,55 C50,57 47,57 45,55 C42,55 41,51 42,47 Z" fill="${p([124, 94, 70])}"/>
<ellipse cx="50" cy="43" rx="2.6" ry="3" fill="${p([136, 98, 82])}"/>
<path d="M45,59 C41,63 47,67 50,63 C53,59 59,65 55,69 C51,73 45,71 47,75" fill="none" stroke="${p([206, 190, 150])}" stroke-width="2.6" stroke-linecap="round"/>
<path d="M41,40 C45,37 55,37 59,40 C61,52 61,66 57,76 C53,79 47,79 43,76 C39,66 39,52 41,40 Z" fill="url(#vol)"/>
${pins}`;
		},
	};
}

function snake(): Art {
	const skin: Rgb = [128, 120, 86];
	const dark: Rgb = [86, 80, 58];
	const belly: Rgb = [190, 180, 144];
	const coils = [
		{ dx: 1, rx: 34 },
		{ dx: -1, rx: 38 },
		{ dx: 0.5, rx: 40 },
		{ dx: -0.5, rx: 41 },
		{ dx: 1.5, rx: 39 },
	];
	const gap = 12.5;
	const ry = 9;
	const thick = 14;
	const cy0 = ry + thick / 2;
	const height = cy0 + (coils.length - 1) * gap + ry + thick / 2;
	return {
		height,
		attach: null,
		sideSqueeze: 1,
		draw: (p, _rng, toBase) => {
			// Far halves first, then the glass rod the snake is coiled round, then the near halves
			// from the top down, so each lower turn lies in front of the one above it.
			const arc = (i: number, near: boolean, stroke: string, w: number, extra = '') => {
				const c = coils[i] ?? { dx: 0, rx: 40 };
				const cy = cy0 + i * gap;
				return `<path d="M${50 + c.dx - c.rx},${cy} A${c.rx},${ry} 0 0 ${near ? 0 : 1} ${50 + c.dx + c.rx},${cy}" fill="none" stroke="${stroke}" stroke-width="${w}" stroke-linecap="round"${extra}/>`;
			};
			const far = coils.map((_c, i) => arc(i, false, p(scaleRgb(skin, 0.78)), thick)).join('');
			const near = coils
				.map((_c, i) =>
					arc(i, true, p(skin), thick) +
					arc(i, true, p(dark), thick * 0.55, ` stroke-dasharray="5 7" stroke-dashoffset="${i * 4}" opacity="0.55"`) +
					arc(i, true, p(belly), 2.2, ` transform="translate(0 ${thick * 0.36})" opacity="0.5"`),
				)
				.join('');
			const rod = `<rect x="47" y="1" width="6" height="${f(Math.max(toBase - 1, height))}" fill="${p([214, 228, 220])}" opacity="0.4" stroke="${p([110, 130, 120])}" stroke-width="0.6"/>`;
			const c0 = coils[0] ?? { dx: 0, rx: 34 };
			const hx = 50 + c0.dx + c0.rx * 0.35;
			const head = `<path d="M${hx - 8},${cy0 + ry - 2} C${hx - 2},${cy0 + ry - 9} ${hx + 14},${cy0 + ry - 8} ${hx + 17},${cy0 + ry - 3} C${hx + 14},${cy0 + ry + 3} ${hx},${cy0 + ry + 4} ${hx - 8},${cy0 + ry - 2} Z" fill="${p(scaleRgb(skin, 0.92))}"/>` +
				`<circle cx="${hx + 9}" cy="${cy0 + ry - 4}" r="1.3" fill="${p([60, 56, 44])}"/>`;
			return far + rod + near + head;
		},
	};
}

function organ(): Art {
	const flesh: Rgb = [194, 168, 138];
	const vessel: Rgb = [210, 194, 168];
	return {
		height: 120,
		attach: [49, 0],
		sideSqueeze: 0.7,
		draw: (p) => `
<path d="M40,34 L40,6 C40,1 56,1 56,6 L56,34 Z" fill="${p(vessel)}"/>
<path d="M56,34 L58,10 C60,5 72,6 71,12 L68,34 Z" fill="${p(scaleRgb(vessel, 0.94))}"/>
<ellipse cx="48" cy="4" rx="8" ry="3" fill="${p(scaleRgb(vessel, 0.8))}"/>
<path d="M20,32 C4,46 6,80 30,100 C40,108 47,112 52,120 C58,109 70,100 80,88 C98,66 95,38 78,29 C66,23 58,27 50,33 C42,25 30,25 20,32 Z" fill="${p(flesh)}"/>
<path d="M20,32 C4,46 6,80 30,100 C40,108 47,112 52,120 C58,109 70,100 80,88 C98,66 95,38 78,29 C66,23 58,27 50,33 C42,25 30,25 20,32 Z" fill="url(#vol)"/>
<path d="M30,40 C38,56 40,78 50,100 M62,38 C60,56 66,74 62,92" fill="none" stroke="${p([150, 118, 96])}" stroke-width="1.8" stroke-linecap="round"/>
<ellipse cx="32" cy="40" rx="12" ry="7" fill="${p([226, 212, 180])}" opacity="0.85"/>
<ellipse cx="72" cy="40" rx="9" ry="6" fill="${p([226, 212, 180])}" opacity="0.8"/>
<path d="M24,62 C28,80 36,92 46,102" fill="none" stroke="${p([230, 220, 198])}" stroke-width="3" opacity="0.4" stroke-linecap="round"/>`,
	};
}

/** A tapering arm: a filled outline along a cubic centre line, wide at the root, fine at the tip. */
function taperedArm(pts: [number, number][], w0: number, w1: number): string {
	const n = 18;
	const [a, b, c, d] = pts as [[number, number], [number, number], [number, number], [number, number]];
	const at = (t: number): [number, number] => {
		const u = 1 - t;
		return [u * u * u * a[0] + 3 * u * u * t * b[0] + 3 * u * t * t * c[0] + t * t * t * d[0], u * u * u * a[1] + 3 * u * u * t * b[1] + 3 * u * t * t * c[1] + t * t * t * d[1]];
	};
	const left: string[] = [];
	const right: string[] = [];
	for (let i = 0; i <= n; i++) {
		const t = i / n;
		const [x, y] = at(t);
		const [x2, y2] = at(Math.min(1, t + 0.01));
		const [x1, y1] = at(Math.max(0, t - 0.01));
		const len = Math.hypot(x2 - x1, y2 - y1) || 1;
		const nx = -(y2 - y1) / len;
		const ny = (x2 - x1) / len;
		const w = (w0 + (w1 - w0) * t) / 2;
		left.push(`${f(x + nx * w)},${f(y + ny * w)}`);
		right.unshift(`${f(x - nx * w)},${f(y - ny * w)}`);
	}
	return `M${left.join(' L')} L${right.join(' L')} Z`;
}

function cephalopod(): Art {
	const skin: Rgb = [214, 186, 164];
	const deep: Rgb = [190, 158, 138];
	return {
		height: 212,
		attach: [50, 0],
		sideSqueeze: 0.8,
		draw: (p, rng) => {
			const arms: string[] = [];
			for (let i = 0; i < 8; i++) {
				const sx = 36 + (i * 28) / 7;
				const spread = (i - 3.5) / 3.5;
				const dx = spread * between(rng, 26, 42);
				const end = between(rng, 180, 212);
				const curl = between(rng, -14, 14);
				const pts: [number, number][] = [[sx, 112], [sx + dx * 0.3, 140], [sx + dx * 1.1 + curl, end - 34], [sx + dx * 0.8 - curl, end]];
				arms.push(`<path d="${taperedArm(pts, 8, 1)}" fill="${p(i % 2 === 0 ? skin : deep)}"/>`);
			}
			const spots: string[] = [];
			for (let i = 0; i < 9; i++) spots.push(`<circle cx="${f(between(rng, 34, 66))}" cy="${f(between(rng, 14, 88))}" r="${f(between(rng, 0.6, 1.4))}" fill="${p([160, 122, 106])}" opacity="0.45"/>`);
			return `${arms.join('')}
<path d="M50,0 C72,0 80,30 78,60 C76,82 66,96 50,98 C34,96 24,82 22,60 C20,30 28,0 50,0 Z" fill="${p(skin)}"/>
<path d="M50,0 C72,0 80,30 78,60 C76,82 66,96 50,98 C34,96 24,82 22,60 C20,30 28,0 50,0 Z" fill="url(#vol)"/>
<path d="M50,4 C62,6 66,34 64,60 C62,80 58,92 50,96 C56,78 58,40 50,4 Z" fill="${p([232, 212, 194])}" opacity="0.5"/>
${spots.join('')}
<ellipse cx="50" cy="108" rx="21" ry="14" fill="${p(skin)}"/><ellipse cx="50" cy="108" rx="21" ry="14" fill="url(#vol)"/>
<ellipse cx="38" cy="106" rx="5" ry="4" fill="${p([96, 80, 72])}"/><ellipse cx="62" cy="106" rx="5" ry="4" fill="${p([96, 80, 72])}"/>`;
		},
	};
}

function generic(rng: () => number): Art {
	// A lumpy mass: a circle perturbed by a few low harmonics, shifted so its top touches y = 0.
	const harmonics = [2, 3, 5].map((k) => ({ k, a: between(rng, 0.03, 0.1), ph: between(rng, 0, Math.PI * 2) }));
	const pts: [number, number][] = [];
	for (let i = 0; i < 48; i++) {
		const th = (i / 48) * Math.PI * 2;
		const r = 40 * (1 + harmonics.reduce((s, h) => s + h.a * Math.cos(h.k * th + h.ph), 0));
		pts.push([50 + r * Math.cos(th), 50 + r * 1.15 * Math.sin(th)]);
	}
	const minY = Math.min(...pts.map((q) => q[1]));
	const top = pts.reduce((best, q) => (q[1] < best[1] ? q : best));
	const d = `M${pts.map(([x, y]) => `${f(x)},${f(y - minY)}`).join(' L')} Z`;
	const maxY = Math.max(...pts.map((q) => q[1])) - minY;
	return {
		height: maxY,
		attach: [top[0], 0],
		sideSqueeze: 0.6,
		draw: (p) => `<path d="${d}" fill="${p([176, 152, 118])}" stroke="${p([140, 118, 90])}" stroke-width="1.5" stroke-linejoin="round"/>
<path d="${d}" fill="url(#vol)"/>
<path d="M30,${f(maxY * 0.5)} C40,${f(maxY * 0.42)} 56,${f(maxY * 0.62)} 70,${f(maxY * 0.55)}" fill="none" stroke="${p([130, 106, 82])}" stroke-width="1.4" opacity="0.7"/>`,
	};
}

function specimenArt(kind: SpecimenSilhouette, rng: () => number): Art {
	switch (kind) {
		case 'fish':
			return fish();
		case 'frog':
			return frog();
		case 'snake':
			return snake();
		case 'organ':
			return organ();
		case 'cephalopod':
			return cephalopod();
		case 'generic':
			return generic(rng);
	}
}

// ---------------------------------------------------------------------------------------------
// The jar

/** Specimen colour seen through fluid: a filter by the fluid's own colour over half the jar's depth. */
function throughFluid(fluid: Rgb): Paint {
	const t = fluid.map((c) => Math.min(1, c / 228) ** 0.6) as Rgb;
	return (c) => css([c[0] * t[0], c[1] * t[1], c[2] * t[2]]);
}

/** Exposed specimen tissue dries pale and chalky: a useful thing for a demo condition photo to show. */
const dried: Paint = (c) => css(mix(c, [232, 226, 208], 0.3));

function glassGradient(j: Jar, shape: JarShape): string {
	// Across the width: walls seen obliquely go dark and green, with a thin bright line where the
	// light refracts through them. Highlights are separate shapes (see highlights()).
	const stops: [number, string, number][] =
		shape === 'rectangular'
			? [[0, '#16251f', 0.78], [0.028, '#2a3c34', 0.5], [0.031, '#ffffff', 0.65], [0.037, '#ffffff', 0.04], [0.963, '#ffffff', 0.04], [0.969, '#ffffff', 0.55], [0.972, '#2a3c34', 0.5], [1, '#16251f', 0.78]]
			: [[0, '#16251f', 0.74], [0.018, '#2a3c34', 0.5], [0.04, '#3a4d44', 0.14], [0.052, '#ffffff', 0.3], [0.06, '#ffffff', 0], [0.94, '#ffffff', 0], [0.948, '#ffffff', 0.24], [0.96, '#3a4d44', 0.14], [0.982, '#2a3c34', 0.5], [1, '#16251f', 0.74]];
	const s = stops.map(([o, c, a]) => `<stop offset="${o}" stop-color="${c}" stop-opacity="${a}"/>`).join('');
	const x0 = j.cx - j.rx;
	return `<linearGradient id="glass" gradientUnits="userSpaceOnUse" x1="${f(x0)}" y1="0" x2="${f(x0 + 2 * j.rx)}" y2="0">${s}</linearGradient>
<radialGradient id="hl"><stop offset="0" stop-color="#fff" stop-opacity="0.9"/><stop offset="0.7" stop-color="#fff" stop-opacity="0.6"/><stop offset="1" stop-color="#fff" stop-opacity="0"/></radialGradient>
<linearGradient id="hlflat" x1="0" y1="0" x2="1" y2="0"><stop offset="0" stop-color="#fff" stop-opacity="0"/><stop offset="0.2" stop-color="#fff" stop-opacity="0.2"/><stop offset="0.85" stop-color="#fff" stop-opacity="0.24"/><stop offset="1" stop-color="#fff" stop-opacity="0"/></linearGradient>`;
}

/**
 * Reflections of the studio's soft boxes: tall, soft-ended on a round jar, a crisp panel on a flat
 * face. They sit outside 12–20 % of the jar's width, which stays clear for sampling the fluid.
 */
function highlights(j: Jar, shape: JarShape): string {
	const w = 2 * j.rx;
	const x0 = j.cx - j.rx;
	const top = j.rimY + 4 * j.ppm * j.vs;
	const h = j.innerBaseY - 2 * j.ppm * j.vs - top;
	const strip = (a: number, b: number, fill: string, opacity: number) =>
		`<rect x="${f(x0 + a * w)}" y="${f(top)}" width="${f((b - a) * w)}" height="${f(h)}" fill="${fill}" opacity="${opacity}"/>`;
	if (shape === 'rectangular') return strip(0.05, 0.11, 'url(#hlflat)', 1) + strip(0.78, 0.86, 'url(#hlflat)', 0.5);
	if (shape === 'oval') return strip(0.065, 0.115, 'url(#hl)', 0.85) + strip(0.74, 0.86, 'url(#hl)', 0.35);
	return strip(0.07, 0.105, 'url(#hl)', 1) + strip(0.78, 0.86, 'url(#hl)', 0.4);
}

function fluidLayers(j: Jar, fluid: Rgb, rng: () => number): string {
	// Old fluid drops a fine sediment on the inner base. Drawn from the stream even for a dry jar,
	// so that the fill level does not reshuffle the label's jitter.
	const sedimented = rng() >= 0.5;
	if (j.fluidLineY >= j.innerBaseY) return '';
	const rxi = innerRx(j);
	const ryi = innerRy(j);
	const dark = scaleRgb(fluid, 0.55);
	const edge = `<linearGradient id="fedge" gradientUnits="userSpaceOnUse" x1="${f(j.cx - rxi)}" y1="0" x2="${f(j.cx + rxi)}" y2="0">
<stop offset="0" stop-color="${css(dark)}" stop-opacity="0.5"/><stop offset="0.06" stop-color="${css(dark)}" stop-opacity="0"/>
<stop offset="0.94" stop-color="${css(dark)}" stop-opacity="0"/><stop offset="1" stop-color="${css(dark)}" stop-opacity="0.5"/></linearGradient>`;
	const sedimentTop = Math.max(j.fluidLineY, j.innerBaseY - 3 * j.ppm * j.vs);
	const sediment = sedimented ? `<path d="${bandPath(j, sedimentTop, j.innerBaseY, rxi, ryi)}" fill="${css(scaleRgb(fluid, 0.7))}" opacity="0.45"/>` : '';
	const depth = `<linearGradient id="fdepth" gradientUnits="userSpaceOnUse" x1="0" y1="${f(j.fluidLineY)}" x2="0" y2="${f(j.innerBaseY)}">
<stop offset="0" stop-color="#fff" stop-opacity="0.04"/><stop offset="0.5" stop-color="#fff" stop-opacity="0"/><stop offset="1" stop-color="#000" stop-opacity="0.07"/></linearGradient>`;
	// Nearly opaque: the fluid should read as its recorded colour, the backdrop only faintly through.
	return `<defs>${edge}${depth}</defs>
<path d="${fluidPath(j)}" fill="${css(fluid)}" fill-opacity="0.93"/>
${sediment}
<path d="${fluidPath(j)}" fill="url(#fedge)"/><path d="${fluidPath(j)}" fill="url(#fdepth)"/>`;
}

/** The meniscus: the fluid's surface ellipse, lit from above, and the dark line where it meets the glass. */
function meniscus(j: Jar, fluid: Rgb): string {
	if (j.fluidLineY >= j.innerBaseY) return '';
	const rxi = innerRx(j);
	const ryi = innerRy(j);
	const x0 = j.cx - rxi;
	const x1 = j.cx + rxi;
	const y = j.fluidLineY;
	const surface = `<path d="${facePath(j, y, rxi, ryi)}" fill="${css(mix(fluid, [250, 250, 246], 0.35))}" opacity="0.85"/>`;
	const edge = `<path d="M${f(x0)},${f(frontY(j, y, rxi, ryi, x0))} ${frontEdgeLR(j, y, rxi, ryi, x1)}" fill="none" stroke="${css(scaleRgb(fluid, 0.4))}" stroke-width="${f(Math.max(1.5, 0.35 * j.ppm))}" opacity="0.85"/>`;
	// Total internal reflection gives a thin silvery band just under the surface.
	const silver = `<path d="M${f(x0)},${f(frontY(j, y, rxi, ryi, x0) + 0.7 * j.ppm)} ${frontEdgeLR(j, y + 0.7 * j.ppm, rxi, ryi, x1)}" fill="none" stroke="#ffffff" stroke-width="${f(Math.max(1, 0.25 * j.ppm))}" opacity="0.35"/>`;
	return surface + edge + silver;
}

function baseGlass(j: Jar): string {
	const band = bandPath(j, j.innerBaseY, j.baseY, j.rx, j.ry);
	const x0 = j.cx - j.rx + j.wall * 0.5;
	const x1 = j.cx + j.rx - j.wall * 0.5;
	const rxb = j.rx - j.wall * 0.5;
	const innerLine = `<path d="M${f(x0)},${f(frontY(j, j.innerBaseY, rxb, j.ry, x0))} ${frontEdgeLR(j, j.innerBaseY, rxb, j.ry, x1)}" fill="none" stroke="#ffffff" stroke-width="${f(0.5 * j.ppm)}" opacity="0.5"/>`;
	return `<path d="${band}" fill="#7d978a" opacity="0.42"/>${innerLine}`;
}

function body(j: Jar, shape: JarShape): string {
	const d = solidPath(j, j.rimY, j.baseY, j.rx, j.ry);
	return `<path d="${d}" fill="url(#glass)"/>${highlights(j, shape)}<path d="${d}" fill="none" stroke="#2a3a33" stroke-width="${f(Math.max(1.2, 0.3 * j.ppm))}" opacity="0.55"/>`;
}

function lid(j: Jar): string {
	const side = bandPath(j, j.lidTopY, j.rimY, j.lidRx, j.lidRy);
	const top = facePath(j, j.lidTopY, j.lidRx, j.lidRy);
	const stroke = `stroke="#2a3a33" stroke-width="${f(Math.max(1.2, 0.3 * j.ppm))}" stroke-opacity="0.6"`;
	// A reflection of the soft box runs diagonally over the lid's top face.
	const sheen = `<linearGradient id="lidsheen" x1="0" y1="0" x2="1" y2="1"><stop offset="0.2" stop-color="#fff" stop-opacity="0"/><stop offset="0.42" stop-color="#fff" stop-opacity="0.45"/><stop offset="0.6" stop-color="#fff" stop-opacity="0"/></linearGradient>`;
	return `<defs>${sheen}</defs><path d="${side}" fill="#8fa89b" fill-opacity="0.55" ${stroke}/><path d="${top}" fill="#cfdcd4" fill-opacity="0.45" ${stroke}/><path d="${top}" fill="url(#lidsheen)"/>`;
}

function sealBand(j: Jar, seal: SealKind, rng: () => number): string {
	const top = j.rimY - 0.55 * LID_MM * j.ppm * j.vs;
	const rx = j.lidRx + 0.6 * j.ppm;
	const ry = j.round ? (j.lidRy * rx) / j.lidRx : j.lidRy;
	if (seal === 'none') {
		// A bare ground-glass joint shows as a frosted line.
		return `<path d="${bandPath(j, j.rimY - 0.4 * j.ppm, j.rimY + 0.9 * j.ppm, j.rx, j.ry)}" fill="#f4f6f2" opacity="0.5"/>`;
	}
	const depth = seal === 'silicone' ? 5 : seal === 'wax' ? 5.5 : 7;
	const bottom = j.rimY + depth * j.ppm * j.vs;
	const band = bandPath(j, top, bottom, rx, ry);
	if (seal === 'silicone') {
		return `<path d="${band}" fill="#a6abad" fill-opacity="0.55" stroke="#d8dcdc" stroke-opacity="0.6" stroke-width="${f(0.5 * j.ppm)}"/>`;
	}
	// Old sealing wax is dull, between ochre and oxblood, greyed by dust.
	const colour: Rgb = seal === 'pitch' ? [27, 25, 23] : mix(mix([172, 128, 72], [142, 70, 56], rng()), [128, 120, 110], 0.22);
	const drips: string[] = [];
	const n = seal === 'pitch' ? 5 : 3;
	for (let i = 0; i < n; i++) {
		const x = j.cx + between(rng, -0.9, 0.9) * rx;
		const w = between(rng, 1.2, 3) * j.ppm;
		const len = between(rng, 0.5, seal === 'pitch' ? 3.5 : 1.8) * j.ppm * j.vs;
		const y = frontY(j, bottom, rx, ry, x) - 0.5;
		drips.push(`M${f(x - w / 2)},${f(y)} Q${f(x - w / 2)},${f(y + len)} ${f(x)},${f(y + len)} Q${f(x + w / 2)},${f(y + len)} ${f(x + w / 2)},${f(y)} Z`);
	}
	const sheenY = top + 1.2 * j.ppm;
	const x0 = j.cx - rx * 0.96;
	const x1 = j.cx + rx * 0.96;
	const sheen = `<path d="M${f(x0)},${f(frontY(j, sheenY, rx, ry, x0))} ${frontEdgeLR(j, sheenY, rx, ry, x1)}" fill="none" stroke="#ffffff" stroke-width="${f(0.6 * j.ppm)}" opacity="${seal === 'pitch' ? 0.22 : 0.12}"/>`;
	const bead = `<linearGradient id="bead" gradientUnits="userSpaceOnUse" x1="0" y1="${f(top - ry)}" x2="0" y2="${f(bottom + 3 * j.ppm)}">
<stop offset="0" stop-color="${css(scaleRgb(colour, 0.75))}"/><stop offset="0.25" stop-color="${css(mix(colour, [255, 255, 255], seal === 'pitch' ? 0.12 : 0.1))}"/>
<stop offset="0.6" stop-color="${css(colour)}"/><stop offset="1" stop-color="${css(scaleRgb(colour, 0.62))}"/></linearGradient>`;
	return `<defs>${bead}</defs><path d="${band} ${drips.join(' ')}" fill="url(#bead)"/>${sheen}`;
}

/** The paper label on the jar's front, with the object number in a serif hand. */
function frontLabel(j: Jar, text: string, rng: () => number, back: boolean, fluid: Rgb): string {
	const lw = 1.0 * j.rx;
	const lh = Math.min(0.34 * lw, 36 * j.ppm) * j.vs;
	const cx = j.cx + between(rng, -0.04, 0.04) * j.rx;
	const bottom = j.innerBaseY - 5 * j.ppm * j.vs;
	const top = bottom - lh;
	const x0 = cx - lw / 2;
	const x1 = cx + lw / 2;
	const rot = between(rng, -0.8, 0.8);
	const paper: Rgb = mix([238, 230, 206], [222, 206, 168], rng());
	const shape = `M${f(x0)},${f(frontY(j, top, j.rx, j.ry, x0))} ${frontEdgeLR(j, top, j.rx, j.ry, x1)} L${f(x1)},${f(frontY(j, bottom, j.rx, j.ry, x1))} ${frontEdgeRL(j, bottom, j.rx, j.ry, x0)} Z`;
	const midY = frontY(j, (top + bottom) / 2, j.rx, j.ry, cx);
	const fs = Math.min(0.4 * lh / j.vs, (0.82 * lw) / (0.62 * Math.max(4, text.length)));
	const ink = '#2b2620';
	const rule = (inset: number, w: number) => `<rect x="${f(x0 + inset)}" y="${f(midY - lh / 2 + inset * j.vs)}" width="${f(lw - 2 * inset)}" height="${f(lh - 2 * inset * j.vs)}" fill="none" stroke="${ink}" stroke-width="${f(w)}" opacity="0.75"/>`;
	const foxing: string[] = [];
	for (let i = 0; i < 5; i++) foxing.push(`<circle cx="${f(between(rng, x0 + 4, x1 - 4))}" cy="${f(between(rng, midY - lh / 2 + 4, midY + lh / 2 - 4))}" r="${f(between(rng, 0.3, 1.1) * j.ppm)}" fill="#9a7448" opacity="${f(between(rng, 0.06, 0.16))}"/>`);
	const shade = j.round
		? `<linearGradient id="lshade" x1="0" y1="0" x2="1" y2="0"><stop offset="0" stop-color="#000" stop-opacity="0.18"/><stop offset="0.35" stop-color="#000" stop-opacity="0"/><stop offset="0.8" stop-color="#000" stop-opacity="0"/><stop offset="1" stop-color="#000" stop-opacity="0.14"/></linearGradient>`
		: `<linearGradient id="lshade" x1="0" y1="0" x2="1" y2="0"><stop offset="0" stop-color="#000" stop-opacity="0"/><stop offset="1" stop-color="#000" stop-opacity="0.04"/></linearGradient>`;
	const label = (fill: Rgb, inkOpacity: number, mirrored: boolean) => {
		const words = `<text x="${f(cx)}" y="${f(midY + 0.35 * fs * j.vs)}" font-family="serif" font-size="${f(fs)}" text-anchor="middle" fill="${ink}" opacity="${inkOpacity}"${mirrored ? ` transform="translate(${f(2 * cx)},0) scale(-1,1)"` : ''}>${escapeXml(text)}</text>`;
		const vScaled = j.vs < 0.99 ? `<g transform="translate(0,${f(midY)}) scale(1,${f(j.vs)}) translate(0,${f(-midY)})">${words}</g>` : words;
		return `<path d="${shape}" fill="${css(fill)}"/>${mirrored ? '' : rule(0.9 * j.ppm, Math.max(1, 0.22 * j.ppm)) + rule(1.6 * j.ppm, Math.max(0.6, 0.1 * j.ppm))}${vScaled}${mirrored ? '' : foxing.join('')}<path d="${shape}" fill="url(#lshade)"/>`;
	};
	const g = (inner: string) => `<defs>${shade}</defs><g transform="rotate(${f(rot)} ${f(cx)} ${f(midY)})">${inner}</g>`;
	if (!back) return g(label(paper, 0.92, false));
	// Seen from behind, through the jar: the back of the paper, the ink showing faintly through.
	const wet = fluidTintRgb(fluid);
	const seen = (c: Rgb): Rgb => [c[0] * wet[0], c[1] * wet[1], c[2] * wet[2]];
	return g(`<g clip-path="url(#cfluid)">${label(seen(scaleRgb(paper, 0.92)), 0.12, true)}</g><g clip-path="url(#cair)">${label(scaleRgb(paper, 0.92), 0.12, true)}</g>`);
}

/** Transmission through the jar's full depth of fluid (a label on the far side is seen through all of it). */
function fluidTintRgb(fluid: Rgb): Rgb {
	return fluid.map((c) => Math.min(1, c / 228)) as Rgb;
}

/** From the side, a round jar's label shows as a narrow curved strip at one edge. */
function edgeLabel(j: Jar, view: JarView): string {
	if (!j.round) return '';
	const lh = Math.min(0.34 * j.rx, 36 * j.ppm);
	const bottom = j.innerBaseY - 5 * j.ppm;
	const w = 0.12 * j.rx;
	const x = view === 'left' ? j.cx + j.rx - w - 0.3 * j.ppm : j.cx - j.rx + 0.3 * j.ppm;
	const dir = view === 'left' ? 1 : 0;
	return `<defs><linearGradient id="eshade" x1="0" y1="0" x2="1" y2="0"><stop offset="${1 - dir}" stop-color="#000" stop-opacity="0.35"/><stop offset="${dir}" stop-color="#000" stop-opacity="0.02"/></linearGradient></defs>
<rect x="${f(x)}" y="${f(frontY(j, bottom - lh, j.rx, j.ry, x))}" width="${f(w)}" height="${f(lh)}" fill="#e6dcc0"/><rect x="${f(x)}" y="${f(frontY(j, bottom - lh, j.rx, j.ry, x))}" width="${f(w)}" height="${f(lh)}" fill="url(#eshade)"/>`;
}

interface SpecimenPlacement {
	svg: (paint: Paint) => string;
	attach: [number, number] | null;
}

/** Fit the specimen inside the jar with its top exactly at specimenTopY. */
function placeSpecimen(j: Jar, art: Art, view: JarView, rng: () => number): SpecimenPlacement {
	const innerW = 2 * innerRx(j);
	const gap = art.attach ? 8 * j.ppm * j.vs : 0;
	const availH = Math.max(1, j.innerBaseY - j.specimenTopY - gap);
	const side = view === 'left' || view === 'right';
	const squeeze = side ? art.sideSqueeze : 1;
	const s = Math.min((0.64 * innerW) / (100 * squeeze), availH / art.height);
	const sx = s * squeeze * (view === 'back' || view === 'right' ? -1 : 1);
	const sy = s * j.vs;
	const cx = j.cx + between(rng, -0.02, 0.02) * innerW;
	const toBase = (j.innerBaseY - j.specimenTopY) / sy;
	// Both passes (in fluid, in air) must draw the very same shape, so each gets the same stream.
	const artSeed = Math.floor(rng() * 2 ** 31);
	const t = `translate(${f(cx)},${f(j.specimenTopY)}) scale(${f(sx)},${f(sy)}) translate(-50,0)`;
	return {
		svg: (paint) => `<g transform="${t}">${art.draw(paint, makeRng(artSeed), toBase)}</g>`,
		attach: art.attach ? [cx + (art.attach[0] - 50) * sx, j.specimenTopY + art.attach[1] * sy] : null,
	};
}

function thread(j: Jar, attach: [number, number], wet: Paint): string {
	const [x, y] = attach;
	const w = f(Math.max(2, 0.4 * j.ppm));
	const cotton: Rgb = [196, 190, 172];
	const split = Math.min(Math.max(j.fluidLineY, j.rimY), y);
	const dry = split > j.rimY ? `<line x1="${f(x)}" y1="${f(j.rimY)}" x2="${f(x)}" y2="${f(split)}" stroke="${css(cotton)}" stroke-width="${w}"/>` : '';
	const inFluid = y > split ? `<line x1="${f(x)}" y1="${f(split)}" x2="${f(x)}" y2="${f(y)}" stroke="${wet(cotton)}" stroke-width="${w}"/>` : '';
	return dry + inFluid;
}

function jar(sc: Scene, r: Resolved, rng: () => number): string {
	const j = sc.jar;
	const wet = throughFluid(r.fluid);
	const art = specimenArt(r.silhouette, rng);
	const spec = placeSpecimen(j, art, r.view, rng);
	const inner = solidPath(j, j.rimY, j.innerBaseY, innerRx(j), innerRy(j));
	const clips = `<defs>${glassGradient(j, r.shape)}
<clipPath id="cfluid"><path d="${fluidPath(j)}"/></clipPath>
<clipPath id="cair"><path clip-rule="evenodd" d="M0,0 H${sc.width} V${sc.height} H0 Z ${fluidPath(j)}"/></clipPath>
<clipPath id="cinner"><path d="${inner}"/></clipPath>
<radialGradient id="vol" cx="0.42" cy="0.4" r="0.68"><stop offset="0" stop-color="#fff" stop-opacity="0.16"/><stop offset="0.55" stop-color="#fff" stop-opacity="0"/><stop offset="0.82" stop-color="#000" stop-opacity="0.08"/><stop offset="1" stop-color="#000" stop-opacity="0.3"/></radialGradient></defs>`;
	const airTint = `<path d="${inner}" fill="#a9bcb2" fill-opacity="0.12"/>`;
	const backLabel = r.view === 'back' ? frontLabel(j, r.objectNumber, rng, true, r.fluid) : '';
	const specimen = `<g clip-path="url(#cinner)">${spec.attach ? thread(j, spec.attach, wet) : ''}<g clip-path="url(#cfluid)">${spec.svg(wet)}</g><g clip-path="url(#cair)">${spec.svg(dried)}</g></g>`;
	let label = '';
	if (r.view === 'front' || r.view === 'detail' || r.view === 'top') label = frontLabel(j, r.objectNumber, rng, false, r.fluid);
	else if (r.view === 'left' || r.view === 'right') label = edgeLabel(j, r.view);
	return clips + airTint + fluidLayers(j, r.fluid, rng) + backLabel + specimen + meniscus(j, r.fluid) + baseGlass(j) + body(j, r.shape) + lid(j) + sealBand(j, r.seal, rng) + label;
}

// ---------------------------------------------------------------------------------------------
// Assembly

function truthOf(sc: Scene): JarPhotoTruth {
	const { from, to } = sc.scaleBar;
	return {
		width: sc.width,
		height: sc.height,
		pxPerMm: Math.hypot(to[0] - from[0], to[1] - from[1]) / SCALE_MM,
		scaleBar: { from, to, lengthMm: SCALE_MM },
		greyCard: { ...sc.greyCard },
		fluidLineY: sc.jar.fluidLineY,
		innerBaseY: r2(sc.jar.innerBaseY),
		specimenTopY: sc.jar.specimenTopY,
		rimY: r2(sc.jar.rimY),
		centreX: r2(sc.jar.cx),
		halfWidth: r2(sc.jar.rx),
		jar: { ...sc.jarBox },
	};
}

export function jarPhotoSvg(p: JarPhotoParams): { svg: string; truth: JarPhotoTruth } {
	const r = resolve(p);
	// Separate streams, so that changing one part (say the label) does not reshuffle the others.
	const base = makeRng(r.seed);
	const stream = () => makeRng(Math.floor(base() * 2 ** 31));
	const sizeRng = stream();
	const layoutRng = stream();
	const bgRng = stream();
	const jarRng = stream();
	const size = jarSizeMm(r.shape, sizeRng);
	const sc = layout(r, size, layoutRng);
	const cam = cameraOf(p.camera, r.width, r.height);
	const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${r.width}" height="${r.height}" viewBox="0 0 ${r.width} ${r.height}">
<g transform="matrix(${cam.zoom} 0 0 ${cam.zoom} ${cam.tx} ${cam.ty})">${backdrop(sc, bgRng)}${jarShadows(sc, r.fluid)}${jar(sc, r, jarRng)}${scaleBar(sc)}${greyCard(sc)}</g></svg>`;
	return { svg, truth: moveTruth(truthOf(sc), cam) };
}

interface Camera {
	zoom: number;
	tx: number;
	ty: number;
}

/** The camera as x' = zoom·x + tx: magnified about the centre, moved, and never uncovering the frame's edge. */
function cameraOf(c: JarPhotoParams['camera'], width: number, height: number): Camera {
	if (!c) return { zoom: 1, tx: 0, ty: 0 };
	if (!(c.zoom >= 1 && c.zoom <= 1.1)) throw new RangeError(`camera.zoom must be from 1 to 1.1, not ${c.zoom}.`);
	const clamp = (v: number, lo: number) => Math.min(0, Math.max(lo, v));
	return {
		zoom: c.zoom,
		tx: r2(clamp((width * (1 - c.zoom)) / 2 + c.dx, width * (1 - c.zoom))),
		ty: r2(clamp((height * (1 - c.zoom)) / 2 + c.dy, height * (1 - c.zoom))),
	};
}

function moveTruth(t: JarPhotoTruth, c: Camera): JarPhotoTruth {
	if (c.zoom === 1 && c.tx === 0 && c.ty === 0) return t;
	const x = (v: number) => r2(c.zoom * v + c.tx);
	const y = (v: number) => r2(c.zoom * v + c.ty);
	const pt = ([a, b]: [number, number]): [number, number] => [x(a), y(b)];
	const box = (b: Box): Box => ({ x: x(b.x), y: y(b.y), w: r2(b.w * c.zoom), h: r2(b.h * c.zoom) });
	return {
		...t,
		pxPerMm: t.pxPerMm * c.zoom,
		scaleBar: { from: pt(t.scaleBar.from), to: pt(t.scaleBar.to), lengthMm: t.scaleBar.lengthMm },
		greyCard: box(t.greyCard),
		fluidLineY: y(t.fluidLineY),
		innerBaseY: y(t.innerBaseY),
		specimenTopY: y(t.specimenTopY),
		rimY: y(t.rimY),
		centreX: x(t.centreX),
		halfWidth: r2(t.halfWidth * c.zoom),
		jar: box(t.jar),
	};
}

/**
 * Fine luminance grain as a small tile of faint black and white specks: photographs are never
 * perfectly smooth, and it stops JPEG banding in the gradients. Plain "over" compositing of an
 * alpha tile costs far less than a soft-light blend; half the specks lighten and half darken, so
 * a mid grey (the card) moves by well under one level.
 */
function grainTile(seed: number): { data: Buffer; size: number } {
	const size = 256;
	const rng = makeRng(seed ^ 0x5bd1e995);
	const data = Buffer.alloc(size * size * 4);
	for (let i = 0; i < size * size; i++) {
		const v = rng() < 0.5 ? 0 : 255;
		data[i * 4] = v;
		data[i * 4 + 1] = v;
		data[i * 4 + 2] = v;
		data[i * 4 + 3] = Math.round(rng() * 7);
	}
	return { data, size };
}

/**
 * An invented camera and lens: the seeder must never imply a real manufacturer. Orientation is
 * not here: withExif cannot set it (libvips writes the image's own orientation, 1, over it).
 */
function exifFor(p: JarPhotoParams, rng: () => number): Exif {
	const exposure = ['1/30', '1/60', '1/125'][Math.floor(rng() * 3)] ?? '1/60';
	const fNumber = ['8', '11'][Math.floor(rng() * 2)] ?? '8';
	const iso = ['100', '200'][Math.floor(rng() * 2)] ?? '100';
	return {
		IFD0: {
			Make: 'Demo Optics',
			Model: 'Survey 24',
			Software: 'Meniscus demo seeder',
			// No closing "(…)": libvips drops a trailing " (…)" from string values, taking it for
			// the description it appends to tags itself.
			ImageDescription: `Invented demo photograph of ${p.objectNumber}, ${p.view ?? 'front'} view`,
			DateTime: p.captureTime.local,
		},
		IFD2: {
			DateTimeOriginal: p.captureTime.local,
			DateTimeDigitized: p.captureTime.local,
			OffsetTimeOriginal: p.captureTime.offset,
			OffsetTime: p.captureTime.offset,
			ExposureTime: exposure,
			FNumber: fNumber,
			ISOSpeedRatings: iso,
			FocalLength: '50',
			LensMake: 'Demo Optics',
			LensModel: 'Demo 50mm F2.8 Macro',
			// libvips otherwise writes 65535 ("uncalibrated"); the pixels are sRGB.
			ColorSpace: '1',
		},
	};
}

export async function renderJarPhoto(p: JarPhotoParams): Promise<{ jpeg: Buffer; truth: JarPhotoTruth }> {
	const { svg, truth } = jarPhotoSvg(p);
	const grain = grainTile(p.seed);
	const jpeg = await sharp(Buffer.from(svg))
		.composite([{ input: grain.data, raw: { width: grain.size, height: grain.size, channels: 4 }, tile: true, blend: 'over' }])
		.jpeg({ quality: 86 })
		.withExif(exifFor(p, makeRng(p.seed ^ 0x2545f491)))
		.toBuffer();
	return { jpeg, truth };
}
