/** Loads the site named in the path within the caller's workspace, or answers 404. */
import { readParams } from './handler';
import { notFound } from './errors';
import { getDb } from '../db/client';
import { getSite } from '../db/sites';
import { SiteIdParams, type SiteDto } from '../schemas/site';

export async function siteInWorkspace(params: Record<string, string | undefined>, organizationId: string): Promise<SiteDto> {
  const { siteId } = readParams(params, SiteIdParams);
  const site = await getSite(getDb(), organizationId, siteId);
  if (!site) throw notFound('Site');
  return site;
}
