/** The live preview: the form's values, debounced, posted to the preview endpoint when valid. */
import { useEffect, useState } from 'react';
import { keepPreviousData, useQuery } from '@tanstack/react-query';
import { api } from '../api';
import { TariffVersionSchema, type TariffVersion } from '@/lib/schemas/tariff';
import type { TariffPreview } from '@/lib/tariff-editor/preview';

const DEBOUNCE_MS = 400;

export function usePreview(siteId: string, values: unknown, compareTo: string | null) {
  const text = JSON.stringify(values);
  const [draft, setDraft] = useState<{ body: TariffVersion; key: string } | null>(null);
  const [valid, setValid] = useState(true);
  useEffect(() => {
    const t = setTimeout(() => {
      const parsed = TariffVersionSchema.safeParse(JSON.parse(text));
      setValid(parsed.success);
      if (parsed.success) setDraft({ body: parsed.data, key: JSON.stringify(parsed.data) });
    }, DEBOUNCE_MS);
    return () => clearTimeout(t);
  }, [text]);
  const q = useQuery({
    queryKey: ['tariff-preview', siteId, compareTo, draft?.key],
    queryFn: () => api<{ preview: TariffPreview }>(`/api/sites/${siteId}/tariffs/preview${compareTo ? `?compareTo=${encodeURIComponent(compareTo)}` : ''}`, { method: 'POST', body: draft!.body }),
    enabled: draft !== null,
    placeholderData: keepPreviousData,
    staleTime: 60_000,
  });
  return { q, valid, waiting: draft === null };
}
