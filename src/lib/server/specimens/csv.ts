import Papa from 'papaparse';
import type { SpecimenView } from '../../specimen/view.ts';
import { IMPORT_FIELDS } from '../../specimen/csvImport.ts';

/**
 * The register as CSV, one specimen a row, columns named as the import expects them. Cells that a
 * spreadsheet would run as a formula (=, +, -, @, tab, CR at the start) get a leading apostrophe
 * (OWASP, "CSV Injection").
 */
export const EXPORT_COLUMNS = IMPORT_FIELDS;

const defuse = (v: string) => (/^[=+\-@\t\r]/.test(v) ? `'${v}` : v);

export function exportRow(s: SpecimenView): string[] {
	return [
		s.objectNumber, s.title, s.description, s.department, s.storageLocation?.code ?? '', s.preservativeRecorded,
		s.preservativeKind, s.containerShape, String(s.innerWidthMm), s.innerDepthMm === null ? '' : String(s.innerDepthMm),
		String(s.innerHeightMm), s.containerMaterial, s.closureType, s.sealType,
		s.hazards.map((h) => (h.note ? `${h.flag}: ${h.note}` : h.flag)).join(' | '), s.nextCheckDue ?? '',
		s.specimenTopMm === null ? '' : String(s.specimenTopMm),
	].map(defuse);
}

export function toCsv(rows: string[][]): string {
	return Papa.unparse({ fields: [...EXPORT_COLUMNS], data: rows }, { newline: '\r\n' });
}
