import { z } from 'zod';
import { siteParams, type RouteDoc } from '../route-doc';
import { IssueReportSchema } from '../../reports/service';

const Report = z
  .object({ id: z.string(), siteId: z.string(), planId: z.string().nullable(), title: z.string(), issuedAt: z.string(), issuedBy: z.string().nullable(), planName: z.string().nullable(), annualSaving: z.number().nullable().meta({ description: 'currency per year' }), paybackYears: z.number().nullable().meta({ description: 'years; null when not paid back' }), currency: z.string(), snapshot: z.record(z.string(), z.unknown()).optional().meta({ description: 'Frozen report content (findings, reconciliation, plan evaluation, payback, cautions, method notes)' }) })
  .meta({ id: 'SavingsReport' });
const reportParams = siteParams.extend({ reportId: z.string() });

export const REPORT_ROUTES: RouteDoc[] = [
  { method: 'get', path: '/api/sites/{siteId}/reports', summary: 'Savings reports issued for the site', tag: 'Reports', permission: 'site:view', params: siteParams, ok: { status: 200, schema: z.object({ reports: z.array(Report) }), description: 'Reports' }, errors: [401, 404] },
  { method: 'post', path: '/api/sites/{siteId}/reports', summary: 'Issue a Savings report for a saved plan (402 until the Site audit is paid); sets the site Reported and e-mails Finance', tag: 'Reports', permission: 'report:issue', params: siteParams, body: IssueReportSchema, ok: { status: 201, schema: z.object({ report: Report, notified: z.array(z.string()) }), description: 'Issued' }, errors: [400, 401, 402, 403, 404, 422] },
  { method: 'get', path: '/api/sites/{siteId}/reports/{reportId}', summary: 'One report with its snapshot', tag: 'Reports', permission: 'site:view', params: reportParams, ok: { status: 200, schema: z.object({ report: Report }), description: 'Report' }, errors: [401, 404] },
  { method: 'get', path: '/api/sites/{siteId}/reports/{reportId}/pdf', summary: 'The report as a PDF (?download=1 to save)', tag: 'Reports', permission: 'site:view', params: reportParams, ok: { status: 200, description: 'application/pdf' }, errors: [401, 404] },
];
