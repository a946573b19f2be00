/** Shared start of every site page: access check and the site itself, or where to go instead. */
import type { AstroGlobal } from 'astro';
import { pageAccess } from './auth/guards';
import { getDb } from './db/client';
import { getSite } from './db/sites';
import type { Permission } from './auth/permissions';
import type { SiteDto } from './schemas/site';
import type { InWorkspace } from './auth/guards';

export async function loadSitePage(Astro: AstroGlobal, permission: Permission = 'site:view'): Promise<{ redirect: string } | { notFound: true } | { ok: InWorkspace; site: SiteDto }> {
  const access = pageAccess(Astro, permission);
  if ('redirect' in access) return access;
  const site = await getSite(getDb(), access.ok.workspace.id, Astro.params.siteId ?? '');
  if (!site) return { notFound: true };
  return { ok: access.ok, site };
}
