/** Routes of the tariff editor. */
import { siteParams, type RouteDoc } from '../route-doc';
import { TariffVersionSchema } from '../../schemas/tariff';
import { PreviewQuerySchema, TariffPreviewSchema } from '../../tariff-editor/preview-schema';

export const TARIFF_EDITOR_ROUTES: RouteDoc[] = [
  {
    method: 'post',
    path: '/api/sites/{siteId}/tariffs/preview',
    summary: "Evaluate a draft tariff version on the last 12 months of the site's meter data, beside the saved tariff (writes nothing)",
    tag: 'Tariffs',
    permission: 'site:view',
    params: siteParams,
    query: PreviewQuerySchema,
    body: TariffVersionSchema,
    ok: { status: 200, schema: TariffPreviewSchema, description: 'Monthly PF charges, per-rule amounts and totals' },
    errors: [400, 401, 404, 413, 415],
  },
];
