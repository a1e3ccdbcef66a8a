/**
 * What Meniscus keeps from a photograph's EXIF (CIPA DC-008 / JEITA CP-3451, "Exif 2.3"), as pure
 * functions over the tag object exifr returns with `reviveValues: false` (raw values, tag names as
 * keys). EXIF times carry no zone: the raw DateTimeOriginal string is kept as written, the
 * OffsetTimeOriginal tag (Exif 2.31) gives its offset when the camera wrote one, and only then is an
 * absolute time computed. GPS position and serial numbers identify a place and a camera: they are
 * kept with the master but never written into a derivative, and shown only to those who may
 * download the original.
 */
export interface StoredExif {
	capture: { raw: string | null; offset: string | null; subSec: string | null };
	camera: { make: string | null; model: string | null };
	lens: { model: string | null };
	exposure: { exposureTime: number | null; fNumber: number | null; iso: number | null; focalLengthMm: number | null };
	orientation: number | null;
	software: string | null;
	/** Kept with the master only. */
	private: { gps: { latitude: number; longitude: number; altitudeM: number | null } | null; bodySerial: string | null; lensSerial: string | null };
}

const str = (v: unknown): string | null => {
	if (typeof v === 'string') {
		const t = v.replace(/\u0000+$/, '').trim();
		return t === '' ? null : t.slice(0, 200);
	}
	if (typeof v === 'number' && Number.isFinite(v)) return String(v);
	return null;
};

const num = (v: unknown): number | null => {
	if (typeof v === 'number' && Number.isFinite(v)) return v;
	// Rationals sometimes arrive as [numerator, denominator].
	if (Array.isArray(v) && v.length === 2 && typeof v[0] === 'number' && typeof v[1] === 'number' && v[1] !== 0) return v[0] / v[1];
	return null;
};

/** "+01:00", "-05:30"; anything else is not an offset. */
export const OFFSET = /^[+-](0\d|1[0-4]):[0-5]\d$/;
/** "YYYY:MM:DD HH:MM:SS" as EXIF writes it (some software writes dashes in the date). */
const EXIF_TIME = /^(\d{4})[:-](\d{2})[:-](\d{2})[ T](\d{2}):(\d{2}):(\d{2})$/;

/** The absolute time of a capture, or null when the camera did not record its offset. */
export function captureInstant(raw: string | null, offset: string | null): Date | null {
	if (!raw || !offset || !OFFSET.test(offset)) return null;
	const m = EXIF_TIME.exec(raw);
	if (!m) return null;
	const iso = `${m[1]}-${m[2]}-${m[3]}T${m[4]}:${m[5]}:${m[6]}${offset}`;
	const d = new Date(iso);
	return Number.isNaN(d.getTime()) ? null : d;
}

/** GPS degrees from the EXIF [deg, min, sec] triplet and its N/S or E/W reference. */
export function gpsDegrees(dms: unknown, ref: unknown): number | null {
	if (typeof dms === 'number' && Number.isFinite(dms)) return (ref === 'S' || ref === 'W' ? -1 : 1) * Math.abs(dms);
	if (!Array.isArray(dms) || dms.length < 1) return null;
	const parts = dms.map(num);
	if (parts.some((p) => p === null)) return null;
	const [d = 0, m = 0, s = 0] = parts as number[];
	const v = d + m / 60 + s / 3600;
	if (!Number.isFinite(v)) return null;
	return ref === 'S' || ref === 'W' ? -v : v;
}

export function summariseExif(tags: Record<string, unknown> | null | undefined): StoredExif {
	const t = tags ?? {};
	const orientation = num(t.Orientation);
	const lat = gpsDegrees(t.GPSLatitude, t.GPSLatitudeRef);
	const lon = gpsDegrees(t.GPSLongitude, t.GPSLongitudeRef);
	const alt = num(t.GPSAltitude);
	const offset = str(t.OffsetTimeOriginal) ?? str(t.OffsetTime);
	return {
		capture: {
			raw: str(t.DateTimeOriginal) ?? str(t.CreateDate) ?? str(t.DateTime),
			offset: offset && OFFSET.test(offset) ? offset : null,
			subSec: str(t.SubSecTimeOriginal),
		},
		camera: { make: str(t.Make), model: str(t.Model) },
		lens: { model: str(t.LensModel) ?? str(t.Lens) },
		exposure: {
			exposureTime: num(t.ExposureTime),
			fNumber: num(t.FNumber),
			iso: num(t.ISO) ?? num(t.ISOSpeedRatings) ?? num(Array.isArray(t.ISOSpeedRatings) ? t.ISOSpeedRatings[0] : null),
			focalLengthMm: num(t.FocalLength),
		},
		orientation: orientation !== null && orientation >= 1 && orientation <= 8 ? orientation : null,
		software: str(t.Software),
		private: {
			gps: lat !== null && lon !== null && Math.abs(lat) <= 90 && Math.abs(lon) <= 180 ? { latitude: lat, longitude: lon, altitudeM: alt } : null,
			bodySerial: str(t.BodySerialNumber) ?? str(t.SerialNumber) ?? str(t.CameraSerialNumber),
			lensSerial: str(t.LensSerialNumber),
		},
	};
}

/** "1/125 s", "2 s": how photographers read an exposure time. */
export function formatExposure(seconds: number | null): string | null {
	if (seconds === null || seconds <= 0) return null;
	if (seconds >= 1) return `${Number(seconds.toFixed(1))} s`;
	return `1/${Math.round(1 / seconds)} s`;
}

export function cameraName(e: StoredExif): string | null {
	const { make, model } = e.camera;
	if (!make && !model) return null;
	if (make && model && model.toLowerCase().startsWith(make.toLowerCase())) return model;
	return [make, model].filter(Boolean).join(' ');
}
