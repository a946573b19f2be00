import { z } from 'zod';
import type { RouteDoc } from '../route-doc';
import { ActivityEntrySchema, ActivityQuerySchema } from '../../activity/activity';

export const ACTIVITY_ROUTES: RouteDoc[] = [
  {
    method: 'get',
    path: '/api/activity',
    summary: 'The activity record: who changed tariffs, imported data, entered bills, saved plans, bought audits, issued reports and managed members, newest first',
    tag: 'Workspaces',
    permission: 'audit-log:view',
    query: ActivityQuerySchema,
    ok: { status: 200, schema: z.object({ entries: z.array(ActivityEntrySchema), next: z.string().nullable().meta({ description: 'Cursor for the next (older) page, or null' }) }), description: 'Entries' },
    errors: [400, 401, 403],
  },
];
