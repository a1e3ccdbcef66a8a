import { defuse } from '../csvExport.ts';
import type { SpecimenView } from '../../specimen/view.ts';
import { IMPORT_FIELDS } from '../../specimen/csvImport.ts';

/**
 * The register as CSV, one specimen a row, columns named as the import expects them, formula-like
 * cells defused (csvExport.ts).
 */
export const EXPORT_COLUMNS = IMPORT_FIELDS;

export function exportRow(s: SpecimenView): string[] {
	return [
		s.objectNumber, s.title, s.description, s.department, s.storageLocation?.code ?? '', s.preservativeRecorded,
		s.preservativeKind, s.containerShape, String(s.innerWidthMm), s.innerDepthMm === null ? '' : String(s.innerDepthMm),
		String(s.innerHeightMm), s.containerMaterial, s.closureType, s.sealType,
		s.hazards.map((h) => (h.note ? `${h.flag}: ${h.note}` : h.flag)).join(' | '), s.nextCheckDue ?? '',
		s.specimenTopMm === null ? '' : String(s.specimenTopMm),
	].map(defuse);
}
