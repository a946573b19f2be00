/** Correction plans (per site) and the workspace's payback table. */
import { z } from 'zod';
import { siteParams, type RouteDoc } from '../route-doc';
import { PlanSpecSchema, SizingQuerySchema } from '../../correction-plans/plan-spec';
import { PlanDtoSchema } from '../../correction-plans/plans-store';
import { PaybackTableSchema } from '../../payback/table';
import { ExportQuerySchema } from '../../payback/export';

const planParams = siteParams.extend({ planId: z.string().meta({ description: 'Plan id (pln_...)' }) });
const evaluation = z.record(z.string(), z.unknown()).meta({
  description: 'plan, currency, months (before/after per rule), totals (annualised), pf, leading (hours, kvarh, worst lead PF, over-corrected months), screening (resonance, steps, detuned, voltage rise, duty), economics (capex, O&M, payback or null = not paid back, NPV, IRR, ±20 % sensitivity, optional lines), notes, cautions',
});
const sizing = z.record(z.string(), z.unknown()).meta({ description: 'rows (kind, kvar, steps, saving, capex, payback, NPV, IRR, leading hours, bestNpv, shortestPayback), textbook Qc estimate, assumptions, notes' });

export const CORRECTION_ROUTES: RouteDoc[] = [
  { method: 'post', path: '/api/sites/{siteId}/plans/evaluate', summary: 'Evaluate an unsaved correction plan on the site’s data and tariff (writes nothing)', tag: 'Correction', permission: 'site:view', params: siteParams, body: PlanSpecSchema, ok: { status: 200, schema: z.object({ evaluation }), description: 'Evaluation' }, errors: [400, 401, 404, 415, 422] },
  { method: 'get', path: '/api/sites/{siteId}/plans/sizing', summary: 'Sizing search: Fixed and Switched banks over a range of sizes, best NPV and shortest payback marked', tag: 'Correction', permission: 'site:view', params: siteParams, query: SizingQuerySchema, ok: { status: 200, schema: z.object({ sizing }), description: 'Sizing table' }, errors: [400, 401, 404, 422] },
  { method: 'get', path: '/api/sites/{siteId}/plans', summary: 'Saved correction plans of the site', tag: 'Correction', permission: 'site:view', params: siteParams, ok: { status: 200, schema: z.object({ plans: z.array(PlanDtoSchema) }), description: 'Plans' }, errors: [401, 404] },
  { method: 'post', path: '/api/sites/{siteId}/plans', summary: 'Save a correction plan with the summary of its evaluation', tag: 'Correction', permission: 'plan:create', params: siteParams, body: PlanSpecSchema, ok: { status: 201, schema: z.object({ plan: PlanDtoSchema }), description: 'Saved' }, errors: [400, 401, 403, 404, 409, 415, 422] },
  { method: 'get', path: '/api/sites/{siteId}/plans/{planId}', summary: 'Read a saved plan', tag: 'Correction', permission: 'site:view', params: planParams, ok: { status: 200, schema: z.object({ plan: PlanDtoSchema }), description: 'Plan' }, errors: [401, 404] },
  { method: 'put', path: '/api/sites/{siteId}/plans/{planId}', summary: 'Replace or rename a saved plan (summary recomputed)', tag: 'Correction', permission: 'plan:create', params: planParams, body: PlanSpecSchema, ok: { status: 200, schema: z.object({ plan: PlanDtoSchema }), description: 'Updated' }, errors: [400, 401, 403, 404, 409, 415, 422] },
  { method: 'delete', path: '/api/sites/{siteId}/plans/{planId}', summary: 'Delete a saved plan', tag: 'Correction', permission: 'plan:create', params: planParams, ok: { status: 204, description: 'Deleted' }, errors: [401, 403, 404] },
  { method: 'get', path: '/api/payback', summary: 'Payback table: every saved plan of the workspace with capex, saving, O&M, payback, NPV, IRR, sensitivity; totals per currency', tag: 'Payback', permission: 'economics:view', ok: { status: 200, schema: PaybackTableSchema, description: 'Payback table' }, errors: [401, 403] },
  { method: 'get', path: '/api/payback/export', summary: 'The payback table as CSV or XLSX (formula-looking text escaped)', tag: 'Payback', permission: 'economics:view', query: ExportQuerySchema, ok: { status: 200, description: 'text/csv or XLSX attachment' }, errors: [400, 401, 403] },
];
