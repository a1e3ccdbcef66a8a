import type { APIRoute } from 'astro';
import { z } from 'zod';
import { problem } from '../../../../lib/server/http.ts';
import { audit } from '../../../../lib/server/audit.ts';
import { loadReport } from '../../../../lib/server/reports/checkReport.ts';
import { reportFileName, reportPdf } from '../../../../lib/server/reports/pdf.ts';
import { attachmentName } from '../../../../lib/server/photos/files.ts';

/** The condition report of one check as a PDF download, audited like the other downloads. */
export const GET: APIRoute = async ({ params, locals, clientAddress }) => {
	const id = z.uuid().safeParse(params.id);
	const data = id.success ? await loadReport(id.data) : null;
	if (!data) return problem(404, 'No such condition check.');
	const pdf = await reportPdf(data);
	await audit({ action: 'check.report-downloaded', entityType: 'check', entityId: data.check.id, actorId: locals.user!.id, clientAddress });
	return new Response(new Uint8Array(pdf), {
		headers: {
			'Content-Type': 'application/pdf',
			'Content-Length': String(pdf.length),
			'Content-Disposition': attachmentName(reportFileName(data)),
			'Cache-Control': 'private, no-store',
		},
	});
};
