/**
 * Route lists per product area, each in its own file (so areas can be added without touching
 * the others). Add an import and a spread here when a new area file is created.
 */
import type { RouteDoc } from '../route-doc';
import { PORTFOLIO_ROUTES } from './portfolio';
import { CORRECTION_ROUTES } from './correction';
import { TARIFF_EDITOR_ROUTES } from './tariff-editor';

export const AREA_ROUTES: RouteDoc[] = [...PORTFOLIO_ROUTES, ...CORRECTION_ROUTES, ...TARIFF_EDITOR_ROUTES];
