import { Op } from 'sequelize';
import { ConditionCheck, PhotoComparison, Specimen, StorageLocation, Treatment } from '../models/index.ts';
import { getTreatment } from '../treatments/service.ts';
import type { TreatmentView } from '../../treatment/view.ts';
import { getCheck } from '../checks/service.ts';
import { comparablePhotos, comparedPhoto, newestFirst, type Comparable } from '../compare/comparable.ts';
import { analysePair, summaryOf, UNALIGNED_NOTE, type ComparisonSummary } from '../../compare/analysis.ts';
import { marksSvg } from '../../marks/svg.ts';
import { compositeSvg } from '../photos/pipeline.ts';
import { resolveStored } from '../photos/storage.ts';
import type { CheckView } from '../../check/view.ts';
import type { PhotoView, PhotoStage } from '../../photos/vocabulary.ts';

/** Everything a condition report prints, gathered from the database and the display copies. */
export interface ReportData {
	check: CheckView;
	specimen: Specimen;
	location: string;
	photos: { view: PhotoView; stage: PhotoStage; fileName: string; jpeg: Buffer; width: number; height: number; marks: number }[];
	changes: { previousDate: string; summary: ComparisonSummary; note: string } | null;
	/** Treatments that link this check as their before- or after-treatment check. */
	treatments: TreatmentView[];
}

const frontFirst = (a: Comparable, b: Comparable) => Number(b.photo.view === 'front') - Number(a.photo.view === 'front') || newestFirst(a, b);

/**
 * Changes since the previous check: the latest saved comparison between this check's front photo
 * (else its first) and any photo of the previous check, else the two compared unaligned here.
 */
async function changesSincePrevious(check: CheckView, mine: Comparable[]): Promise<ReportData['changes']> {
	const previous = await ConditionCheck.findOne({
		where: { specimenId: check.specimen.id, id: { [Op.ne]: check.id }, checkedOn: { [Op.lt]: check.checkedOn } },
		order: [['checkedOn', 'DESC'], ['createdAt', 'DESC']],
		attributes: ['id', 'checkedOn'],
	});
	const after = mine[0];
	if (!previous || !after) return null;
	const theirs = (await comparablePhotos({ checkId: previous.id })).sort(frontFirst);
	if (!theirs.length) return null;
	const saved = await PhotoComparison.findOne({
		where: { afterPhotoId: after.photo.id, beforePhotoId: { [Op.in]: theirs.map((p) => p.photo.id) } },
		order: [['updatedAt', 'DESC']],
	});
	if (saved) return { previousDate: previous.checkedOn, summary: saved.summary, note: saved.summary.aligned ? 'From the saved comparison, aligned by control points.' : `From the saved comparison. ${UNALIGNED_NOTE}` };
	const before = theirs.find((p) => p.photo.view === after.photo.view) ?? theirs[0]!;
	return { previousDate: previous.checkedOn, summary: summaryOf(analysePair(comparedPhoto(before), comparedPhoto(after), 'none', [])), note: `No comparison has been saved for these photographs. ${UNALIGNED_NOTE}` };
}

export async function loadReport(checkId: string): Promise<ReportData | null> {
	const check = await getCheck(checkId);
	if (!check) return null;
	const specimen = await Specimen.findByPk(check.specimen.id, { include: [{ model: StorageLocation, as: 'location' }], paranoid: false });
	if (!specimen) return null;
	const loc = (specimen as Specimen & { location?: StorageLocation | null }).location;
	const mine = (await comparablePhotos({ checkId })).sort(frontFirst);
	const photos = await Promise.all(
		mine.map(async (p) => {
			const size = { photo: { width: p.photo.width, height: p.photo.height }, target: { width: p.display.width, height: p.display.height } };
			const jpeg = await compositeSvg(resolveStored(p.display.path), marksSvg(p.layer, size));
			return { view: p.photo.view, stage: p.photo.stage, fileName: p.photo.fileName, jpeg, width: p.display.width, height: p.display.height, marks: p.layer.marks.length };
		}),
	);
	const linked = await Treatment.findAll({ where: { [Op.or]: [{ beforeCheckId: checkId }, { afterCheckId: checkId }] }, attributes: ['id'], order: [['createdAt', 'ASC']] });
	const treatments = (await Promise.all(linked.map((t) => getTreatment(t.id)))).filter((t): t is TreatmentView => t !== null);
	return { check, specimen, location: loc ? `${loc.code} · ${loc.name}` : '—', photos, changes: await changesSincePrevious(check, mine), treatments };
}
