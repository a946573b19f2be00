/**
 * The OpenAPI document, generated from the same zod schemas the endpoints validate with.
 * Every file under src/pages/api/ must appear here (a test enforces it).
 */
import { OpenAPIRegistry, OpenApiGeneratorV31 } from '@asteasolutions/zod-to-openapi';
import { z } from 'zod';
import { ErrorBodySchema } from './errors';
import { siteParams, type RouteDoc } from './route-doc';
import { AREA_ROUTES } from './routes';
import { SiteCreateSchema, SiteSchema, SiteUpdateSchema } from '../schemas/site';
import { TariffDtoSchema, TariffVersionSchema } from '../schemas/tariff';
import { FindingsQuerySchema, FindingsSchema } from '../schemas/findings';
import { ImportSchema, MeterSchema } from '../meter-data/dto';
import { PreviewRequestSchema } from '../meter-data/preview';
import { BillSchema, ReconciliationSchema } from '../schemas/bill';
import { BillDeterminantsSchema } from '../import/bills/bill-schema';
import { InvitationSchema, InviteSchema, MemberRoleSchema, MemberSchema, MeSchema, WorkspaceCreateSchema, WorkspaceSchema, WorkspaceSwitchSchema } from '../schemas/workspace';

const meterUpload = z.object({
  file: z.string().meta({ format: 'binary', description: 'The meter export (CSV text), streamed' }),
  mapping: z.string().meta({ description: 'The confirmed MeterMapping as JSON (see the mapping step)' }),
  replace: z.enum(['true', 'false']).optional().meta({ description: 'Overwrite data already imported in the same range (needed after a 409 overlap)' }),
});
const billParams = siteParams.extend({ billId: z.string() });
const fileUpload = (what: string) => z.object({ file: z.string().meta({ format: 'binary', description: what }) });
const tariffParams = siteParams.extend({ tariffId: z.string().meta({ description: 'Tariff version id' }) });
const memberParams = z.object({ memberId: z.string() });
const invitationParams = z.object({ invitationId: z.string() });

const CORE_ROUTES: RouteDoc[] = [
  { method: 'get', path: '/api/health', summary: 'Liveness and database check', tag: 'System', permission: 'public', ok: { status: 200, schema: z.object({ ok: z.boolean() }), description: 'Up' } },
  { method: 'get', path: '/api/openapi.json', summary: 'This document', tag: 'System', permission: 'public', ok: { status: 200, description: 'OpenAPI 3.1 document' } },
  { method: 'get', path: '/api/me', summary: 'The signed-in person, active workspace, permissions and all workspaces', tag: 'Workspaces', permission: 'signed in', ok: { status: 200, schema: MeSchema, description: 'Current person' }, errors: [401] },
  { method: 'get', path: '/api/workspaces', summary: "List the caller's workspaces", tag: 'Workspaces', permission: 'signed in', ok: { status: 200, schema: z.object({ workspaces: z.array(WorkspaceSchema) }), description: 'Workspaces' }, errors: [401] },
  { method: 'post', path: '/api/workspaces', summary: 'Create a workspace (caller becomes Owner)', tag: 'Workspaces', permission: 'signed in', body: WorkspaceCreateSchema, ok: { status: 201, schema: z.object({ workspace: WorkspaceSchema }), description: 'Created' }, errors: [400, 401] },
  { method: 'put', path: '/api/workspaces/active', summary: 'Switch the active workspace', tag: 'Workspaces', permission: 'signed in', body: WorkspaceSwitchSchema, ok: { status: 200, schema: z.object({ workspace: WorkspaceSchema }), description: 'Switched' }, errors: [400, 401, 404] },
  { method: 'get', path: '/api/members', summary: 'Members of the active workspace', tag: 'Members', permission: 'site:view', ok: { status: 200, schema: z.object({ members: z.array(MemberSchema) }), description: 'Members' }, errors: [401] },
  { method: 'patch', path: '/api/members/{memberId}', summary: "Change a member's role", tag: 'Members', permission: 'members:manage', params: memberParams, body: MemberRoleSchema, ok: { status: 200, description: 'Changed' }, errors: [400, 401, 403, 404, 409] },
  { method: 'delete', path: '/api/members/{memberId}', summary: 'Remove a member', tag: 'Members', permission: 'members:manage', params: memberParams, ok: { status: 204, description: 'Removed' }, errors: [401, 403, 404, 409] },
  { method: 'get', path: '/api/invitations', summary: 'Pending invitations of the active workspace', tag: 'Members', permission: 'members:manage', ok: { status: 200, schema: z.object({ invitations: z.array(InvitationSchema) }), description: 'Invitations' }, errors: [401, 403] },
  { method: 'post', path: '/api/invitations', summary: 'Invite someone by e-mail with a role', tag: 'Members', permission: 'members:manage', body: InviteSchema, ok: { status: 201, schema: z.object({ invitation: InvitationSchema }), description: 'Invitation sent' }, errors: [400, 401, 403, 409] },
  { method: 'get', path: '/api/invitations/{invitationId}', summary: 'Read an invitation addressed to the caller', tag: 'Members', permission: 'invitee', params: invitationParams, ok: { status: 200, schema: z.object({ invitation: InvitationSchema }), description: 'Invitation' }, errors: [401, 404] },
  { method: 'delete', path: '/api/invitations/{invitationId}', summary: 'Cancel a pending invitation', tag: 'Members', permission: 'members:manage', params: invitationParams, ok: { status: 204, description: 'Cancelled' }, errors: [401, 403, 404] },
  { method: 'post', path: '/api/invitations/{invitationId}/accept', summary: 'Accept an invitation and switch to its workspace', tag: 'Members', permission: 'invitee', params: invitationParams, ok: { status: 200, schema: z.object({ workspace: z.object({ id: z.string(), name: z.string(), role: z.string().nullable() }) }), description: 'Joined' }, errors: [401, 404, 409, 410] },
  { method: 'get', path: '/api/sites', summary: 'Sites of the active workspace', tag: 'Sites', permission: 'site:view', ok: { status: 200, schema: z.object({ sites: z.array(SiteSchema) }), description: 'Sites' }, errors: [401] },
  { method: 'post', path: '/api/sites', summary: 'Create a site', tag: 'Sites', permission: 'site:create', body: SiteCreateSchema, ok: { status: 201, schema: z.object({ site: SiteSchema }), description: 'Created' }, errors: [400, 401, 403, 409] },
  { method: 'get', path: '/api/sites/{siteId}', summary: 'Read a site', tag: 'Sites', permission: 'site:view', params: siteParams, ok: { status: 200, schema: z.object({ site: SiteSchema }), description: 'Site' }, errors: [401, 404] },
  { method: 'patch', path: '/api/sites/{siteId}', summary: 'Rename a site or change its details', tag: 'Sites', permission: 'site:edit', params: siteParams, body: SiteUpdateSchema, ok: { status: 200, schema: z.object({ site: SiteSchema }), description: 'Updated' }, errors: [400, 401, 403, 404, 409] },
  { method: 'delete', path: '/api/sites/{siteId}', summary: 'Delete a site and everything recorded for it', tag: 'Sites', permission: 'site:delete', params: siteParams, ok: { status: 204, description: 'Deleted' }, errors: [401, 403, 404] },
  { method: 'get', path: '/api/sites/{siteId}/tariffs', summary: "The site's tariff versions, oldest first", tag: 'Tariffs', permission: 'site:view', params: siteParams, ok: { status: 200, schema: z.object({ tariffs: z.array(TariffDtoSchema) }), description: 'Tariff versions' }, errors: [401, 404] },
  { method: 'post', path: '/api/sites/{siteId}/tariffs', summary: 'Add a tariff version (power-factor rules in force from a date)', tag: 'Tariffs', permission: 'tariff:edit', params: siteParams, body: TariffVersionSchema, ok: { status: 201, schema: z.object({ tariff: TariffDtoSchema }), description: 'Created' }, errors: [400, 401, 403, 404, 409] },
  { method: 'get', path: '/api/sites/{siteId}/tariffs/{tariffId}', summary: 'Read a tariff version', tag: 'Tariffs', permission: 'site:view', params: tariffParams, ok: { status: 200, schema: z.object({ tariff: TariffDtoSchema }), description: 'Tariff version' }, errors: [401, 404] },
  { method: 'put', path: '/api/sites/{siteId}/tariffs/{tariffId}', summary: 'Replace a tariff version', tag: 'Tariffs', permission: 'tariff:edit', params: tariffParams, body: TariffVersionSchema, ok: { status: 200, schema: z.object({ tariff: TariffDtoSchema }), description: 'Updated' }, errors: [400, 401, 403, 404, 409] },
  { method: 'delete', path: '/api/sites/{siteId}/tariffs/{tariffId}', summary: 'Delete a tariff version', tag: 'Tariffs', permission: 'tariff:edit', params: tariffParams, ok: { status: 204, description: 'Deleted' }, errors: [401, 403, 404] },
  { method: 'get', path: '/api/sites/{siteId}/findings', summary: 'Metrics and PF charges per month or billing period, with each rule’s explanation', tag: 'Findings', permission: 'site:view', params: siteParams, query: FindingsQuerySchema, ok: { status: 200, schema: FindingsSchema, description: 'Findings' }, errors: [400, 401, 404, 422] },
  { method: 'get', path: '/api/sites/{siteId}/meter-data', summary: 'Meters (with saved import profiles) and the import history', tag: 'Meter data', permission: 'site:view', params: siteParams, ok: { status: 200, schema: z.object({ meters: z.array(MeterSchema), imports: z.array(ImportSchema) }), description: 'Meters and imports' }, errors: [401, 404] },
  { method: 'post', path: '/api/sites/{siteId}/meter-data', summary: 'Upload and import a meter export, all or nothing', tag: 'Meter data', permission: 'meter:upload', params: siteParams, query: z.object({ importId: z.string().optional().meta({ description: 'Client-chosen id (imp_...) to poll progress while the upload runs' }) }), multipart: meterUpload, ok: { status: 201, schema: z.object({ import: ImportSchema }), description: 'Imported, with the data-quality report' }, errors: [400, 401, 403, 404, 409, 413, 415, 422] },
  { method: 'get', path: '/api/sites/{siteId}/meter-data/imports/{importId}', summary: 'One import: progress, data-quality report, problems', tag: 'Meter data', permission: 'site:view', params: siteParams.extend({ importId: z.string() }), ok: { status: 200, schema: z.object({ import: ImportSchema }), description: 'Import' }, errors: [401, 404] },
  { method: 'post', path: '/api/sites/{siteId}/meter-data/preview', summary: 'Mapping step: propose a mapping from the head of a file and show the first rows as parsed (writes nothing)', tag: 'Meter data', permission: 'meter:upload', params: siteParams, body: PreviewRequestSchema, ok: { status: 200, schema: z.object({ proposal: z.record(z.string(), z.unknown()).meta({ description: 'mapping (when complete), draft, choices with confidence, needs (statements the user must make, e.g. date order), columns, problems' }), parsed: z.record(z.string(), z.unknown()).nullable().meta({ description: 'first rows read with the mapping: row, meterId, start, kwh, kvarhLag, kvarhLead; or the problems' }) }), description: 'Proposal and preview' }, errors: [400, 401, 403, 404, 413] },
  { method: 'get', path: '/api/sites/{siteId}/bills', summary: "The site's bills, oldest first", tag: 'Bills', permission: 'site:view', params: siteParams, ok: { status: 200, schema: z.object({ bills: z.array(BillSchema) }), description: 'Bills' }, errors: [401, 404] },
  { method: 'post', path: '/api/sites/{siteId}/bills', summary: "Enter one bill's billed determinants", tag: 'Bills', permission: 'bill:upload', params: siteParams, body: BillDeterminantsSchema, ok: { status: 201, schema: z.object({ bill: BillSchema }), description: 'Added' }, errors: [400, 401, 403, 404, 409] },
  { method: 'post', path: '/api/sites/{siteId}/bills/import', summary: 'Import a bill-history CSV, all rows or none', tag: 'Bills', permission: 'bill:upload', params: siteParams, multipart: fileUpload('Bill history CSV').extend({ mapping: z.string().meta({ description: 'BillMapping as JSON' }) }), ok: { status: 201, schema: z.object({ bills: z.array(BillSchema), warnings: z.array(z.object({ code: z.string(), row: z.number(), message: z.string() })) }), description: 'Imported' }, errors: [400, 401, 403, 404, 409, 413, 415, 422] },
  { method: 'delete', path: '/api/sites/{siteId}/bills/{billId}', summary: 'Delete a bill', tag: 'Bills', permission: 'bill:upload', params: billParams, ok: { status: 204, description: 'Deleted' }, errors: [401, 403, 404] },
  { method: 'get', path: '/api/sites/{siteId}/bills/{billId}/document', summary: 'The bill document (PDF, PNG or JPEG); ?download=1 to save it', tag: 'Bills', permission: 'site:view', params: billParams, ok: { status: 200, description: 'The file' }, errors: [401, 404] },
  { method: 'post', path: '/api/sites/{siteId}/bills/{billId}/document', summary: 'Attach the bill document (PDF, PNG or JPEG by content, 10 MB)', tag: 'Bills', permission: 'bill:upload', params: billParams, multipart: fileUpload('PDF, PNG or JPEG'), ok: { status: 201, schema: z.object({ document: z.object({ fileName: z.string(), contentType: z.string(), bytes: z.number() }) }), description: 'Attached' }, errors: [400, 401, 403, 404, 413, 415] },
  { method: 'get', path: '/api/sites/{siteId}/reconciliation', summary: 'Bills against the interval data and tariff: differences, disputable amount, multiplier check', tag: 'Bills', permission: 'site:view', params: siteParams, ok: { status: 200, schema: ReconciliationSchema, description: 'Reconciliation' }, errors: [401, 404, 422] },
];

/** Every documented route: the core ones above and each area's own list in ./routes/. */
export const ROUTES: RouteDoc[] = [...CORE_ROUTES, ...AREA_ROUTES];

const ERROR_TEXT: Record<number, string> = {
  400: 'Invalid input; `error.fields` names each bad field',
  401: 'Not signed in',
  403: 'Role does not allow this, or the request came from another origin',
  404: 'Not found in the active workspace',
  409: 'Conflict with existing data',
  402: 'A paid Site audit is needed first',
  410: 'Expired',
  413: 'Body too large',
  415: 'Wrong body or file type',
  422: 'The file or data cannot be used; `error.problems` lists rows',
  502: 'The payment provider did not answer; nothing was charged',
};

/** Builds the OpenAPI 3.1 document. */
export function buildOpenApi(baseUrl: string) {
  const registry = new OpenAPIRegistry();
  registry.registerComponent('securitySchemes', 'session', { type: 'apiKey', in: 'cookie', name: 'varledger.session_token', description: 'Session cookie set by POST /api/auth/sign-in/email' });
  for (const r of ROUTES) {
    const responses: Record<string, { description: string; content?: Record<string, { schema: z.ZodType }> }> = {
      [r.ok.status]: { description: r.ok.description, ...(r.ok.schema ? { content: { 'application/json': { schema: r.ok.schema } } } : {}) },
    };
    for (const s of r.errors ?? []) responses[s] = { description: ERROR_TEXT[s] ?? 'Error', content: { 'application/json': { schema: ErrorBodySchema } } };
    registry.registerPath({
      method: r.method,
      path: r.path,
      summary: r.summary,
      description: `Permission: ${r.permission}.`,
      tags: [r.tag],
      ...(r.permission === 'public' ? {} : { security: [{ session: [] }] }),
      request: { ...(r.params ? { params: r.params } : {}), ...(r.query ? { query: r.query } : {}), ...(r.body ? { body: { required: true, content: { 'application/json': { schema: r.body } } } } : {}), ...(r.multipart ? { body: { required: true, content: { 'multipart/form-data': { schema: r.multipart } } } } : {}) },
      responses,
    });
  }
  return new OpenApiGeneratorV31(registry.definitions).generateDocument({
    openapi: '3.1.0',
    info: { title: 'Varledger API', version: '0.1.0', description: 'JSON API of Varledger. Authentication routes live under /api/auth (better-auth). Errors share one shape: { error: { code, message, fields? } }.' },
    servers: [{ url: baseUrl }],
  });
}
