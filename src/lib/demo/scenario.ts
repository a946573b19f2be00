/**
 * The demo: an invented ceramics and packaging group with three plants in three time zones,
 * plus a second client workspace so the consultant has something to switch to.
 * Every name, address and account number here is made up.
 */
import type { Role } from '../auth/permissions';
import type { SiteCreate } from '../schemas/site';

export const DEMO_PASSWORD = 'ledger-demo-2026';

export type DemoPerson = { key: string; name: string; email: string };
export const DEMO_PEOPLE: DemoPerson[] = [
  { key: 'owner', name: 'Ilse Marwood', email: 'owner@northgate.example' },
  { key: 'energy', name: 'Tomasz Quill', email: 'energy@northgate.example' },
  { key: 'consultant', name: 'Renata Oduya', email: 'consultant@fieldline.example' },
  { key: 'finance', name: 'Callum Breck', email: 'finance@northgate.example' },
];

export type DemoWorkspace = { name: string; slug: string; members: [personKey: string, role: Role][]; sites: SiteCreate[] };

export const DEMO_WORKSPACES: DemoWorkspace[] = [
  {
    name: 'Northgate Ceramics',
    slug: 'northgate-ceramics',
    members: [
      ['owner', 'owner'],
      ['energy', 'energy_manager'],
      ['consultant', 'consultant'],
      ['finance', 'finance'],
    ],
    sites: [
      { name: 'Brackwater Kiln Works', address: '1400 Foundry Road, Brackwater, IL', timeZone: 'America/Chicago', utility: 'Prairie Valley Electric', accountNumber: 'PVE-448-0912', serviceVoltageV: 480, transformerKva: 1500, transformerImpedancePct: 5.75, currency: 'USD' },
      { name: 'Tarn Valley Glaze Plant', address: 'Unit 7, Tarnside Industrial Estate, Cumbria', timeZone: 'Europe/London', utility: 'Fellgate Power Supply', accountNumber: 'FPS 2210 7781', serviceVoltageV: 11_000, transformerKva: 1000, transformerImpedancePct: 5.3, currency: 'GBP' },
      { name: 'Kestrel Bay Packaging', address: '22 Wharf Street, Kestrel Bay NSW', timeZone: 'Australia/Sydney', utility: 'Coastline Energy Retail', accountNumber: 'CER-90-3318-04', serviceVoltageV: 415, transformerKva: 2000, transformerImpedancePct: 6, currency: 'AUD' },
    ],
  },
  {
    name: 'Harrow Dairy Cooperative',
    slug: 'harrow-dairy',
    members: [['consultant', 'consultant']],
    sites: [
      { name: 'Harrow Creamery', address: '5 Milkhouse Lane, Harrow, WI', timeZone: 'America/Chicago', utility: 'Prairie Valley Electric', accountNumber: 'PVE-771-2045', serviceVoltageV: 480, transformerKva: 750, transformerImpedancePct: 5.0, currency: 'USD' },
      { name: 'Harrow Butter Works', address: '9 Churn Road, Harrow, WI', timeZone: 'America/Chicago', utility: 'Prairie Valley Electric', accountNumber: 'PVE-771-3310', serviceVoltageV: 480, transformerKva: 1000, transformerImpedancePct: 5.5, currency: 'USD' },
    ],
  },
];
