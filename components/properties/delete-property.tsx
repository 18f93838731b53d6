'use client';

import { useMutation, useQueryClient } from '@tanstack/react-query';
import { Trash2 } from 'lucide-react';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Field, Input, controlAria } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { apiFetch, errorMessage, queryKeys } from '@/lib/client/api';

export function DeleteProperty({ propertyId, propertyName }: { propertyId: string; propertyName: string }) {
  const router = useRouter();
  const queryClient = useQueryClient();
  const [open, setOpen] = useState(false);
  const [typed, setTyped] = useState('');
  const matches = typed.trim() === propertyName.trim();
  const remove = useMutation({
    mutationFn: () => apiFetch<void>(`/api/properties/${propertyId}`, { method: 'DELETE' }),
    onSuccess: async () => {
      // Dropped, not just marked stale: the list must not flash a property that is gone.
      queryClient.removeQueries({ queryKey: ['properties', propertyId] });
      queryClient.removeQueries({ queryKey: queryKeys.properties, exact: true });
      router.push('/properties');
      router.refresh();
    },
  });

  return (
    <section aria-labelledby="delete-heading" className="rounded-card border border-ember/40 bg-ground-raised p-5 sm:p-6">
      <h2 id="delete-heading" className="text-lg font-semibold">
        Delete this property
      </h2>
      <p className="mt-1 text-sm text-loam-soft">
        Deleting removes the property, all its plots and everyone’s access to it. It cannot be undone.
      </p>
      {!open ? (
        <Button variant="danger-outline" className="mt-4" onClick={() => setOpen(true)}>
          <Trash2 className="size-4" aria-hidden="true" />
          Delete property
        </Button>
      ) : (
        <form
          className="mt-4 space-y-4"
          onSubmit={(event) => {
            event.preventDefault();
            if (matches) remove.mutate();
          }}
        >
          {remove.isError ? <Notice tone="error">{errorMessage(remove.error)}</Notice> : null}
          <Field label={<>Type <strong>{propertyName}</strong> to confirm</>} htmlFor="delete-confirm-name">
            <Input
              {...controlAria('delete-confirm-name')}
              autoComplete="off"
              spellCheck={false}
              value={typed}
              onChange={(event) => setTyped(event.target.value)}
            />
          </Field>
          <div className="flex flex-col-reverse gap-3 sm:flex-row">
            <Button
              variant="secondary"
              onClick={() => {
                setOpen(false);
                setTyped('');
              }}
            >
              Keep the property
            </Button>
            <Button type="submit" variant="danger" disabled={!matches} pending={remove.isPending || remove.isSuccess}>
              Delete property for good
            </Button>
          </div>
        </form>
      )}
    </section>
  );
}
