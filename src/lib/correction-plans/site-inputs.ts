/**
 * What a plan is evaluated against: the site's first meter's series, calendar months in the
 * site zone, the tariff version in force at the end of the data, and the transformer and
 * voltage figures used by the screening. Answers 422 with a sentence when something is missing.
 */
import { DateTime } from 'luxon';
import type { Db } from '../db/client';
import { listMeters, readSeries } from '../db/intervals';
import { listTariffs } from '../db/tariffs';
import type { SiteDto } from '../schemas/site';
import { ApiError } from '../api/errors';
import { monthlyPeriods, spanOf } from '../domain/periods/monthly-periods';
import type { Period } from '../domain/periods/period';
import type { IntervalSeries } from '../domain/series/interval-series';
import { tariffSchema, type Tariff } from '../domain/tariff/tariff-schema';
import { tariffDataProblems } from '../domain/tariff/evaluate-tariff';

export type SiteInputs = {
  site: { id: string; name: string; serviceVoltageV: number | null; transformerKva: number | null; transformerImpedancePct: number | null };
  series: IntervalSeries;
  periods: Period[];
  tariff: Tariff;
  tariffName: string;
  notes: string[];
};

/** Pure part: picks the tariff version and builds the months. Throws 422 ApiErrors. */
export function buildSiteInputs(site: SiteDto, series: IntervalSeries, tariffs: { name: string; effectiveFrom: string; definition: unknown }[]): SiteInputs {
  if (series.length === 0) throw new ApiError(422, 'no_meter_data', `${site.name} has no meter data yet: import a meter export on the Meter data page before planning a correction.`);
  const parsed = tariffs
    .map((t) => ({ t, p: tariffSchema.safeParse(t.definition) }))
    .filter((x) => x.p.success)
    .sort((a, b) => a.t.effectiveFrom.localeCompare(b.t.effectiveFrom));
  // A version whose demand window is not made of whole meter intervals cannot be evaluated (the engine throws).
  const misfits = parsed.map((x) => ({ x, problem: tariffDataProblems(x.p.data!, series)[0]?.message })).filter((m) => m.problem);
  if (misfits.length && misfits.length === parsed.length) throw new ApiError(422, 'tariff_does_not_fit', `The tariff “${misfits.at(-1)!.x.t.name}” cannot be evaluated on this meter data: ${misfits.at(-1)!.problem}`);
  for (const m of misfits) parsed.splice(parsed.indexOf(m.x), 1);
  if (parsed.length === 0) throw new ApiError(422, 'no_tariff', `${site.name} has no tariff entered: add the tariff’s PF rules on the Tariff page, so that savings can be computed.`);
  const span = spanOf(series);
  const lastDay = DateTime.fromMillis(span.toMs - 1, { zone: site.timeZone }).toISODate()!;
  const chosen = [...parsed].reverse().find((x) => x.t.effectiveFrom <= lastDay) ?? parsed[0]!;
  const months = monthlyPeriods(span, site.timeZone);
  if (!months.ok) throw new ApiError(422, 'cannot_compute', months.errors.map((e) => e.message).join(' '));
  const notes: string[] = [];
  if (parsed.length > 1) notes.push(`Evaluated with the tariff version in force at the end of the data (“${chosen.t.name}”, from ${chosen.t.effectiveFrom}) for every month.`);
  if (tariffs.length > parsed.length + misfits.length) notes.push('A tariff version could not be read and was left out: fix it in the tariff editor.');
  for (const m of misfits) notes.push(`The tariff version “${m.x.t.name}” (from ${m.x.t.effectiveFrom}) was left out: ${m.problem}`);
  return {
    site: { id: site.id, name: site.name, serviceVoltageV: site.serviceVoltageV ?? null, transformerKva: site.transformerKva ?? null, transformerImpedancePct: site.transformerImpedancePct ?? null },
    series,
    periods: months.value,
    tariff: chosen.p.data!,
    tariffName: chosen.t.name,
    notes,
  };
}

/** Loads a site's inputs (first meter, all its data) from the database. */
export async function loadSiteInputs(db: Db, organizationId: string, site: SiteDto): Promise<SiteInputs> {
  const meters = await listMeters(db, organizationId, site.id);
  const m = meters[0];
  if (!m) throw new ApiError(422, 'no_meter_data', `${site.name} has no meter data yet: import a meter export on the Meter data page before planning a correction.`);
  const [series, tariffs] = await Promise.all([readSeries(db, organizationId, m), listTariffs(db, organizationId, site.id)]);
  return buildSiteInputs(site, series, tariffs);
}
