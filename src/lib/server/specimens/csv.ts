import Papa from 'papaparse';
import type { SpecimenView } from '../../specimen/view.ts';

/**
 * The register as CSV, one specimen a row, columns named as the import expects them. Cells that a
 * spreadsheet would run as a formula (=, +, -, @, tab, CR at the start) get a leading apostrophe
 * (OWASP, "CSV Injection").
 */
export const EXPORT_COLUMNS = [
	'object_number', 'title', 'description', 'department', 'location_code', 'preservative_recorded',
	'preservative_kind', 'container_shape', 'inner_width_mm', 'inner_depth_mm', 'inner_height_mm',
	'container_material', 'closure_type', 'seal_type', 'hazards', 'next_check_due',
] as const;

const defuse = (v: string) => (/^[=+\-@\t\r]/.test(v) ? `'${v}` : v);

export function exportRow(s: SpecimenView): string[] {
	return [
		s.objectNumber, s.title, s.description, s.department, s.storageLocation?.code ?? '', s.preservativeRecorded,
		s.preservativeKind, s.containerShape, String(s.innerWidthMm), s.innerDepthMm === null ? '' : String(s.innerDepthMm),
		String(s.innerHeightMm), s.containerMaterial, s.closureType, s.sealType,
		s.hazards.map((h) => (h.note ? `${h.flag}: ${h.note}` : h.flag)).join(' | '), s.nextCheckDue ?? '',
	].map(defuse);
}

export function toCsv(rows: string[][]): string {
	return Papa.unparse({ fields: [...EXPORT_COLUMNS], data: rows }, { newline: '\r\n' });
}
