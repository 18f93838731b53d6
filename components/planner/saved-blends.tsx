'use client';

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { BookmarkPlus, ListRestart, Trash2 } from 'lucide-react';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Input, Select } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { SPECIES } from '@/lib/agronomy/species';
import { apiFetch, errorMessage } from '@/lib/client/api';
import type { SavedBlendDto } from '@/lib/data/blends';
import { plannerKeys } from './keys';

type Part = { speciesId: string; share: number };

const speciesName = new Map(SPECIES.map((s) => [s.id, s.name]));
const describe = (parts: Part[]) => parts.map((p) => `${speciesName.get(p.speciesId) ?? p.speciesId} ${p.share}`).join(', ');

/**
 * The property's own blends: start the form from one, or keep the blend typed above under a name for next
 * season. The planting stores its own copy, so deleting a saved blend changes no plan.
 */
export function SavedBlends({
  propertyId,
  currentParts,
  onApply,
}: {
  propertyId: string;
  currentParts: () => Part[];
  onApply: (parts: Part[]) => void;
}) {
  const queryClient = useQueryClient();
  const [chosen, setChosen] = useState('');
  const [name, setName] = useState('');
  const [message, setMessage] = useState<{ tone: 'success' | 'error'; text: string } | null>(null);
  const blends = useQuery({
    queryKey: plannerKeys.blends(propertyId),
    queryFn: () => apiFetch<{ blends: SavedBlendDto[] }>(`/api/properties/${propertyId}/blends`),
  });
  const refresh = () => queryClient.invalidateQueries({ queryKey: plannerKeys.blends(propertyId) });
  const save = useMutation({
    mutationFn: () =>
      apiFetch<{ blend: SavedBlendDto }>(`/api/properties/${propertyId}/blends`, {
        method: 'POST',
        // Rows still blank in the form are not part of the blend.
        body: { name, parts: currentParts().filter((p) => p.speciesId) },
      }),
    onSuccess: async ({ blend }) => {
      setMessage({ tone: 'success', text: `Saved the blend “${blend.name}”.` });
      setName('');
      await refresh();
    },
    onError: (error) => setMessage({ tone: 'error', text: errorMessage(error) }),
  });
  const remove = useMutation({
    mutationFn: (blendId: string) => apiFetch<void>(`/api/properties/${propertyId}/blends/${blendId}`, { method: 'DELETE' }),
    onSuccess: async () => {
      setMessage({ tone: 'success', text: 'Deleted the saved blend. Plantings made from it keep their species.' });
      setChosen('');
      await refresh();
    },
    onError: (error) => setMessage({ tone: 'error', text: errorMessage(error) }),
  });
  const list = blends.data?.blends ?? [];
  const selected = list.find((b) => b.id === chosen) ?? null;

  return (
    <div className="space-y-3 rounded-lg border border-ground-line bg-white/50 p-3">
      <div className="flex flex-wrap items-end gap-2">
        <div className="flex min-w-56 flex-1 flex-col gap-1">
          <label htmlFor="saved-blend" className="text-sm font-semibold">
            Saved blends of this property
          </label>
          <Select id="saved-blend" value={chosen} onChange={(e) => setChosen(e.target.value)} disabled={blends.isPending || list.length === 0}>
            <option value="">{blends.isPending ? 'Loading…' : list.length ? 'Pick a saved blend' : 'None saved yet'}</option>
            {list.map((b) => (
              <option key={b.id} value={b.id}>
                {b.name}
              </option>
            ))}
          </Select>
        </div>
        <Button
          variant="secondary"
          size="sm"
          disabled={!selected}
          onClick={() => {
            if (!selected) return;
            onApply(selected.parts);
            setMessage({ tone: 'success', text: `The blend rows now hold “${selected.name}”.` });
          }}
        >
          <ListRestart className="size-4" aria-hidden="true" />
          Use this blend
        </Button>
        <Button variant="danger-quiet" size="sm" disabled={!selected} pending={remove.isPending} onClick={() => selected && remove.mutate(selected.id)}>
          <Trash2 className="size-4" aria-hidden="true" />
          Delete
        </Button>
      </div>
      {selected ? <p className="text-sm text-loam-soft">{describe(selected.parts)}</p> : null}
      {blends.isError ? <Notice tone="error">The saved blends did not load: {errorMessage(blends.error)}</Notice> : null}
      <div className="flex flex-wrap items-end gap-2">
        <div className="flex min-w-56 flex-1 flex-col gap-1">
          <label htmlFor="save-blend-name" className="text-sm font-semibold">
            Keep the blend above as
          </label>
          <Input id="save-blend-name" value={name} maxLength={80} placeholder="e.g. Fall clover and brassica" onChange={(e) => setName(e.target.value)} />
        </div>
        <Button variant="secondary" size="sm" disabled={!name.trim()} pending={save.isPending} onClick={() => save.mutate()}>
          <BookmarkPlus className="size-4" aria-hidden="true" />
          Save blend
        </Button>
      </div>
      {message ? (
<Notice tone={message.tone}>{message.text}</Notice>
      ) : null}
    </div>
  );
}
