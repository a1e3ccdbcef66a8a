import { createRequire } from 'node:module';
import PDFDocument from 'pdfkit';
import { CHECK_LABELS, PARTS } from '../../check/vocabulary.ts';
import { PHOTO_LABELS } from '../../photos/vocabulary.ts';
import { LABELS } from '../../specimen/vocabulary.ts';
import { PART_STYLE, SEVERITY_STYLE } from '../../marks/palette.ts';
import { CHANGE_CLASSES } from '../../compare/changes.ts';
import type { ReportData } from './checkReport.ts';
import { treatmentSections } from './treatmentSection.ts';

/**
 * The condition report of one check as an A4 PDF: black text of 9.5 pt and more, a header and a
 * "page N of M" footer on every page. pdfkit needs TrueType files, so the app's face (Figtree)
 * comes from the npm package that ships it as TTF.
 */
const require = createRequire(import.meta.url);
const FONT = {
	regular: require.resolve('@expo-google-fonts/figtree/400Regular/Figtree_400Regular.ttf'),
	bold: require.resolve('@expo-google-fonts/figtree/700Bold/Figtree_700Bold.ttf'),
};
const MARGIN = { top: 64, bottom: 56, left: 50, right: 50 };
const BODY = 9.5;
const GREY = '#444444';

export const CAUTION =
	'Meniscus gives no safety advice of its own. Local regulations, your organisation’s risk assessment and qualified practice govern all work with preserved specimens.';

const FORMALDEHYDE = { 'not-tested': 'Not tested', negative: 'Negative', positive: 'Positive' } as const;
const dash = (v: string | number | null | undefined) => (v === null || v === undefined || v === '' ? '—' : String(v));

export function reportFileName(d: Pick<ReportData, 'check'>): string {
	const safe = d.check.specimen.objectNumber.replace(/[^A-Za-z0-9._-]+/g, '_') || 'specimen';
	return `${safe}-condition-${d.check.checkedOn}.pdf`;
}

export async function reportPdf(d: ReportData): Promise<Buffer> {
	const { check, specimen } = d;
	const doc = new PDFDocument({ size: 'A4', margins: MARGIN, bufferPages: true, info: { Title: `Condition report ${check.specimen.objectNumber} ${check.checkedOn}`, Author: 'Meniscus' } });
	doc.registerFont('body', FONT.regular);
	doc.registerFont('bold', FONT.bold);
	const chunks: Buffer[] = [];
	doc.on('data', (c: Buffer) => chunks.push(c));
	const done = new Promise<void>((resolve) => doc.on('end', () => resolve()));
	const width = doc.page.width - MARGIN.left - MARGIN.right;
	const left = MARGIN.left;

	const heading = (text: string) => {
		if (doc.y > doc.page.height - MARGIN.bottom - 60) doc.addPage();
		doc.moveDown(0.8).font('bold').fontSize(13).fillColor('black').text(text, left, doc.y, { width });
		doc.moveDown(0.3).font('body').fontSize(BODY);
	};
	const pairs = (rows: [string, string][]) => {
		for (const [k, v] of rows) {
			const y = doc.y;
			const h = Math.max(doc.font('bold').fontSize(BODY).heightOfString(k, { width: 140 }), doc.font('body').heightOfString(v, { width: width - 150 }));
			if (y + h > doc.page.height - MARGIN.bottom) doc.addPage();
			const top = doc.y;
			doc.font('bold').text(k, left, top, { width: 140 });
			doc.font('body').text(v, left + 150, top, { width: width - 150 });
			doc.x = left;
			doc.y = top + h + 3;
		}
	};
	const para = (text: string, font: 'body' | 'bold' = 'body') => doc.font(font).fontSize(BODY).fillColor('black').text(text, left, doc.y, { width });

	// Title
	doc.font('bold').fontSize(18).fillColor('black').text(`Condition report: ${check.specimen.objectNumber}`, left, MARGIN.top, { width });
	doc.font('body').fontSize(11).text(check.specimen.title, { width });

	heading('Specimen');
	pairs([
		['Object number', specimen.objectNumber],
		['Title', specimen.title],
		['Location', d.location],
		['Preservative', [LABELS.preservative[specimen.preservativeKind], specimen.preservativeRecorded].filter(Boolean).join(' — recorded as: ')],
		['Container', `${LABELS.shape[specimen.containerShape]}, ${LABELS.material[specimen.containerMaterial]}, ${specimen.innerWidthMm}${specimen.innerDepthMm ? ` × ${specimen.innerDepthMm}` : ''} × ${specimen.innerHeightMm} mm inside; ${LABELS.closure[specimen.closureType]}`],
		['Seal', LABELS.seal[specimen.sealType]],
		['Hazards', check.specimen.hazards.length ? check.specimen.hazards.map((h) => LABELS.hazard[h.flag as keyof typeof LABELS.hazard] + (h.note ? ` (${h.note})` : '')).join('; ') : 'None recorded'],
	]);
	doc.font('body').fontSize(BODY).fillColor('black').text(`Caution: ${CAUTION}`, left, doc.y + 2, { width });

	heading('The check');
	pairs([
		['Date', check.checkedOn],
		['Reason', CHECK_LABELS.reason[check.reason]],
		['Examiner', check.examiner.name],
		['State', CHECK_LABELS.state[check.state]],
	]);

	/** A ruled table; a row that does not fit goes to the next page whole. */
	const table = (cols: { t: string; w: number }[], rows: string[][]) => {
		const row = (cells: string[], bold: boolean) => {
			doc.font(bold ? 'bold' : 'body').fontSize(BODY);
			const h = Math.max(...cells.map((c, i) => doc.heightOfString(c, { width: cols[i]!.w - 6 }))) + 6;
			if (doc.y + h > doc.page.height - MARGIN.bottom) doc.addPage();
			const top = doc.y;
			let x = left;
			cells.forEach((c, i) => {
				doc.text(c, x + 3, top + 3, { width: cols[i]!.w - 6 });
				x += cols[i]!.w;
			});
			doc.moveTo(left, top + h).lineTo(left + width, top + h).lineWidth(0.5).strokeColor(GREY).stroke();
			doc.x = left;
			doc.y = top + h;
		};
		row(cols.map((c) => c.t), true);
		for (const r of rows) row(r, false);
	};

	heading('Parts');
	table(
		[{ t: 'Part', w: 95 }, { t: 'Grade', w: 80 }, { t: 'Terms', w: 140 }, { t: 'Note', w: width - 315 }],
		PARTS.map((part) => {
			const p = check.parts[part];
			return [CHECK_LABELS.part[part], p.grade ? CHECK_LABELS.grade[p.grade] : 'Not graded', p.terms.join(', ') || '—', p.note || '—'];
		}),
	);
	doc.moveDown(0.5);
	pairs([
		['Overall grade', (check.overallGrade ? CHECK_LABELS.grade[check.overallGrade] : 'Not graded') + (check.overallOverrideReason ? ` (set by hand: ${check.overallOverrideReason})` : '')],
		['Priority', check.priority ? CHECK_LABELS.priority[check.priority] : '—'],
		['Next check due', dash(check.nextCheckDue)],
	]);
	if (check.notes) pairs([['Notes', check.notes]]);

	heading('Fluid');
	const f = check.fluid;
	if (!f) para('No fluid readings were recorded.');
	else
		pairs([
			['Meter reading', f.readingPercentVol === null ? '—' : `${f.readingPercentVol} % vol at ${dash(f.tempC)} °C (${f.glass} glass meter)`],
			['Real strength at 20 °C', f.realPercentVol === null ? '—' : `${f.realPercentVol.toFixed(1)} % vol (corrected by the OIML R 22 tables)`],
			['Formaldehyde test', FORMALDEHYDE[f.formaldehyde]],
			['pH', dash(f.pH)],
			['Fluid level', f.levelMm === null ? '—' : `${f.levelMm} mm above the inner base`],
			['Method', dash(f.method)],
		]);

	heading('Changes since the previous check');
	if (!d.changes) para('There is no earlier check with photographs to compare with.');
	else {
		const s = d.changes.summary;
		para(`Compared with the check of ${d.changes.previousDate}. ${d.changes.note}`);
		doc.moveDown(0.3);
		pairs(CHANGE_CLASSES.map((c) => [`Marks ${c}`, String(s.counts[c])]));
		const moved = s.changes.filter((c) => c.change !== 'unchanged');
		if (moved.length) {
			para(moved.map((c) => `${c.change}: ${CHECK_LABELS.part[c.part]}, ${c.term}`).join('; ') + '.');
		}
		const lv = s.levelFromReadings;
		doc.moveDown(0.3);
		para(lv.changeMm === null ? `Fluid level change from the readings: ${lv.reason}` : `Fluid level change from the readings: ${lv.changeMm > 0 ? '+' : ''}${lv.changeMm} mm over ${lv.days} days (${lv.beforeMm} → ${lv.afterMm} mm).`);
	}

	treatmentSections({ heading, pairs, para, table, width, moveDown: (n) => doc.moveDown(n) }, check.id, d.treatments);

	heading('Review');
	pairs(
		check.reviewer
			? [
					['Reviewer', check.reviewer.name],
					['Decision', check.state === 'approved' ? 'Approved' : check.state === 'returned' ? 'Returned for changes' : CHECK_LABELS.state[check.state]],
					['Date', dash(check.reviewedAt?.slice(0, 10))],
					['Comment', dash(check.reviewComment)],
				]
			: [['Reviewer', 'Not yet reviewed']],
	);

	if (d.photos.length) {
		for (const p of d.photos) {
			doc.addPage();
			doc.font('bold').fontSize(13).fillColor('black').text(`Photograph: ${PHOTO_LABELS.view[p.view]}, ${PHOTO_LABELS.stage[p.stage].toLowerCase()}`, left, MARGIN.top, { width });
			doc.font('body').fontSize(BODY).text(`${p.fileName} · ${p.marks} mark${p.marks === 1 ? '' : 's'}`, { width });
			doc.moveDown(0.4);
			const maxH = doc.page.height - MARGIN.bottom - doc.y - 120;
			const k = Math.min(width / p.width, maxH / p.height);
			const top = doc.y;
			doc.image(p.jpeg, left + (width - p.width * k) / 2, top, { width: p.width * k, height: p.height * k });
			doc.y = top + p.height * k + 10;
			legend(doc, left, width);
		}
	} else {
		heading('Photographs');
		para('No photographs were taken for this check.');
	}

	const range = doc.bufferedPageRange();
	for (let i = 0; i < range.count; i++) {
		doc.switchToPage(range.start + i);
		const bottom = doc.page.margins.bottom;
		doc.page.margins.bottom = 0;
		doc.font('body').fontSize(9).fillColor('black');
		doc.text(`Meniscus · ${check.specimen.objectNumber} · check of ${check.checkedOn}`, left, 32, { width, lineBreak: false });
		doc.moveTo(left, 48).lineTo(left + width, 48).lineWidth(0.5).strokeColor(GREY).stroke();
		doc.text(`Page ${i + 1} of ${range.count}`, left, doc.page.height - 36, { width, align: 'right', lineBreak: false });
		doc.page.margins.bottom = bottom;
	}
	doc.end();
	await done;
	return Buffer.concat(chunks);
}

/** The parts by colour and letter, and the severities by line, as the canvas legend shows them. */
function legend(doc: PDFKit.PDFDocument, left: number, width: number) {
	doc.font('bold').fontSize(BODY).fillColor('black').text('Legend', left, doc.y, { width });
	let x = left;
	let y = doc.y + 4;
	for (const part of PARTS) {
		const s = PART_STYLE[part];
		const label = `${s.code}  ${s.label}`;
		const w = doc.font('body').widthOfString(label) + 26;
		if (x + w > left + width) {
			x = left;
			y += 16;
		}
		doc.rect(x, y, 12, 10).fillAndStroke(s.colour, 'black');
		doc.fillColor('black').text(label, x + 16, y, { lineBreak: false });
		x += w;
	}
	y += 18;
	x = left;
	for (const sev of [1, 2, 3] as const) {
		const s = SEVERITY_STYLE[sev];
		doc.save().moveTo(x, y + 5).lineTo(x + 28, y + 5).lineWidth(s.strokeWidth).strokeColor('black');
		if (s.dash.length) doc.dash(s.dash[0]!, { space: s.dash[1]! });
		doc.stroke().restore();
		doc.fillColor('black').font('body').text(s.label, x + 34, y, { lineBreak: false });
		x += 110;
	}
	doc.x = left;
	doc.y = y + 18;
}
