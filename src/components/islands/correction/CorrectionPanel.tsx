/** The Correction screen: saved plans, sizing search, plan builder with live evaluation, cautions beside the choice. */
import { useCallback, useState } from 'react';
import { keepPreviousData, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { QueryRoot } from '../QueryRoot';
import { api, ApiClientError } from '../api';
import type { PlanSpec } from '@/lib/correction-plans/plan-spec';
import { PlanBuilder, usePlanForm, useValidSpec, DEFAULT_SPEC } from './PlanBuilder';
import { SizingTable, type SizingChoice } from './SizingTable';
import { EvaluationPanel } from './EvaluationPanel';
import { SavedPlans } from './SavedPlans';
import { Cautions } from './Cautions';
import { planTypeLabel, type PlanDto, type PlanEvaluation } from './types';

type Props = { siteId: string; currency: string; canEdit: boolean };

function Panel({ siteId, currency, canEdit }: Props) {
  const qc = useQueryClient();
  const form = usePlanForm();
  const spec = useValidSpec(form);
  const [openId, setOpenId] = useState<string | null>(null);
  const [notice, setNotice] = useState<{ ok: boolean; text: string } | null>(null);

  const plansKey = ['plans', siteId];
  const plans = useQuery({ queryKey: plansKey, queryFn: () => api<{ plans: PlanDto[] }>(`/api/sites/${siteId}/plans`) });
  const evaluation = useQuery({
    queryKey: ['evaluate', siteId, JSON.stringify(spec)],
    queryFn: () => api<{ evaluation: PlanEvaluation }>(`/api/sites/${siteId}/plans/evaluate`, { method: 'POST', body: spec }),
    enabled: spec !== null,
    placeholderData: keepPreviousData,
    retry: false,
  });

  const showError = (err: unknown) => {
    if (err instanceof ApiClientError) for (const [path, message] of Object.entries(err.fields)) form.setError(path as never, { message });
    setNotice({ ok: false, text: (err as Error).message });
  };
  const save = useMutation({
    mutationFn: ({ values, asNew }: { values: PlanSpec; asNew: boolean }) =>
      asNew || !openId
        ? api<{ plan: PlanDto }>(`/api/sites/${siteId}/plans`, { method: 'POST', body: values })
        : api<{ plan: PlanDto }>(`/api/sites/${siteId}/plans/${openId}`, { method: 'PUT', body: values }),
    onSuccess: ({ plan }, { asNew }) => {
      setOpenId(plan.id);
      setNotice({ ok: true, text: asNew || !openId ? `Saved the plan “${plan.name}”.` : `Saved the changes to “${plan.name}”.` });
      qc.invalidateQueries({ queryKey: plansKey });
    },
    onError: showError,
  });
  const submit = (asNew: boolean) => form.handleSubmit((values) => save.mutate({ values, asNew }), () => setNotice({ ok: false, text: 'Some fields need attention before the plan can be saved.' }))();

  const open = (p: PlanDto) => {
    form.reset(p.spec);
    setOpenId(p.id);
    setNotice({ ok: true, text: `Opened “${p.name}”.` });
    document.getElementById('builder-h')?.scrollIntoView({ block: 'start' });
  };
  const rename = async (p: PlanDto, name: string) => {
    await api(`/api/sites/${siteId}/plans/${p.id}`, { method: 'PUT', body: { ...p.spec, name } });
    if (p.id === openId) form.setValue('name', name);
    setNotice({ ok: true, text: `Renamed “${p.name}” to “${name}”.` });
    await qc.invalidateQueries({ queryKey: plansKey });
  };
  const remove = async (p: PlanDto) => {
    await api(`/api/sites/${siteId}/plans/${p.id}`, { method: 'DELETE' });
    if (p.id === openId) setOpenId(null);
    setNotice({ ok: true, text: `Deleted the plan “${p.name}”.` });
    await qc.invalidateQueries({ queryKey: plansKey });
  };
  const useSize = useCallback(
    ({ row, assumptions, targetPf }: SizingChoice) => {
      const current = form.getValues();
      const perKvar = row.kind === 'fixed' ? assumptions.fixedPerKvar : assumptions.switchedPerKvar;
      form.reset({
        name: `${planTypeLabel(row.kind, row.steps)} ${row.kvar} kvar`,
        bank: row.kind === 'fixed' ? { kind: 'fixed', kvar: row.kvar } : { kind: 'switched', totalKvar: row.kvar, steps: row.steps ?? 6, targetPf, leadingLimitPf: 1 },
        costs: { perKvar, fixedInstallation: assumptions.fixedInstallation, omPctOfCapex: assumptions.omPctOfCapex, ...(assumptions.detunedPremiumPerKvar ? { detuned: { premiumPerKvar: assumptions.detunedPremiumPerKvar, reactorPct: current.costs?.detuned?.reactorPct ?? 7 } } : {}) },
        finance: { discountRate: assumptions.discountRate, lifeYears: assumptions.lifeYears },
      });
      setOpenId(null);
      setNotice({ ok: true, text: `The builder now holds a ${planTypeLabel(row.kind, row.steps)} of ${row.kvar} kvar from the sizing table: check it, name it and save it.` });
      document.getElementById('builder-h')?.scrollIntoView({ block: 'start' });
    },
    [form],
  );

  const ev = evaluation.data?.evaluation;
  const openPlan = plans.data?.plans.find((p) => p.id === openId);
  return (
    <div className="flex flex-col gap-4">
      {!canEdit && <p className="notice text-sm">Read-only: your role sees plans and their evaluations; a Consultant, Energy manager or Owner builds and changes them.</p>}
      {plans.isError ? <p className="notice notice-error" role="alert">{(plans.error as Error).message}</p> : <SavedPlans plans={plans.data?.plans ?? []} openId={openId} canEdit={canEdit} onOpen={open} onRename={rename} onDelete={remove} />}
      <SizingTable siteId={siteId} currency={currency} onUse={canEdit ? useSize : null} />
      <div className="grid gap-4 lg:grid-cols-[minmax(0,5fr)_minmax(0,7fr)]">
        <div className="flex min-w-0 flex-col gap-3">
          <PlanBuilder form={form} readOnly={!canEdit} currency={ev?.currency ?? currency} />
          <Cautions />
          {notice && <p className={`notice ${notice.ok ? 'notice-ok' : 'notice-error'} text-sm`} role={notice.ok ? 'status' : 'alert'}>{notice.text}</p>}
          {canEdit && (
            <div className="flex flex-wrap gap-2">
              <button type="button" className="btn btn-primary" disabled={save.isPending} onClick={() => submit(false)}>{openPlan ? `Save changes to “${openPlan.name}”` : 'Save plan'}</button>
              {openPlan && <button type="button" className="btn btn-quiet" disabled={save.isPending} onClick={() => submit(true)}>Save as a new plan</button>}
              {openPlan && <button type="button" className="btn btn-quiet" onClick={() => { form.reset(DEFAULT_SPEC); setOpenId(null); setNotice(null); }}>New plan</button>}
            </div>
          )}
        </div>
        <div className="min-w-0">
          {spec === null && !ev && <p className="notice text-sm">Fill in the builder: the evaluation appears here as soon as the plan is complete.</p>}
          {evaluation.isError && <p className="notice notice-error" role="alert">{(evaluation.error as Error).message}</p>}
          {evaluation.isPending && spec !== null && <div className="h-64 animate-pulse rounded border border-rule bg-surface" aria-busy="true" aria-label="Evaluating the plan" />}
          {ev && !evaluation.isError && <EvaluationPanel ev={ev} stale={evaluation.isPlaceholderData || evaluation.isFetching} />}
        </div>
      </div>
    </div>
  );
}

export default function CorrectionPanel(props: Props) {
  return <QueryRoot><Panel {...props} /></QueryRoot>;
}
