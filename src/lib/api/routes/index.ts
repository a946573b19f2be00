/**
 * Route lists per product area, each in its own file (so areas can be added without touching
 * the others). Add an import and a spread here when a new area file is created.
 */
import type { RouteDoc } from '../route-doc';
import { PORTFOLIO_ROUTES } from './portfolio';
import { FINDINGS_VIEW_ROUTES } from './findings-views';
import { REPORT_ROUTES } from './reports';
import { CORRECTION_ROUTES } from './correction';
import { TARIFF_EDITOR_ROUTES } from './tariff-editor';
import { PURCHASE_ROUTES } from './purchases';
import { ACTIVITY_ROUTES } from './activity';

export const AREA_ROUTES: RouteDoc[] = [...PORTFOLIO_ROUTES, ...FINDINGS_VIEW_ROUTES, ...REPORT_ROUTES, ...CORRECTION_ROUTES, ...TARIFF_EDITOR_ROUTES, ...PURCHASE_ROUTES, ...ACTIVITY_ROUTES];
