'use client';

import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useId, useState, type FormEvent } from 'react';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { Field, Input, Select, Textarea, fieldDescribedBy } from '@/components/ui/field';
import { ApiClientError, apiFetch, errorMessage } from '@/components/ui/api';
import { TEMPLATES, templateSection, type TemplateId } from '@/lib/section/templates';
import { sectionNameSchema, sectionDescriptionSchema } from '@/lib/validations/section';

interface Created {
  id: string;
}

/** "New section": a name, an optional description and the starting drawing. Editors and owners only. */
export function CreateSectionDialog({
  workspaceId,
  open,
  onClose,
}: {
  workspaceId: string;
  open: boolean;
  onClose: () => void;
}) {
  const id = useId();
  const router = useRouter();
  const qc = useQueryClient();
  const [name, setName] = useState('');
  const [description, setDescription] = useState('');
  const [template, setTemplate] = useState<TemplateId>('microstrip');
  const [errors, setErrors] = useState<{ name?: string; description?: string }>({});

  const create = useMutation({
    mutationFn: (input: { name: string; description: string; template: TemplateId }) =>
      apiFetch<{ section?: Created } & Partial<Created>>(`/api/workspaces/${workspaceId}/sections`, {
        method: 'POST',
        json: {
          name: input.name,
          ...(input.description ? { description: input.description } : {}),
          content: templateSection(input.template),
        },
      }),
    onSuccess: (data) => {
      void qc.invalidateQueries({ queryKey: ['sections', workspaceId] });
      const newId = data.section?.id ?? data.id;
      onClose();
      setName('');
      setDescription('');
      if (newId) router.push(`/w/${workspaceId}/sections/${newId}`);
      else router.refresh();
    },
    onError: (e) => {
      if (e instanceof ApiClientError && e.field === 'name') setErrors({ name: e.message });
    },
  });

  function onSubmit(ev: FormEvent) {
    ev.preventDefault();
    const n = sectionNameSchema.safeParse(name);
    const d = sectionDescriptionSchema.safeParse(description);
    const errs = {
      name: n.success ? undefined : n.error.issues[0]?.message,
      description: d.success ? undefined : d.error.issues[0]?.message,
    };
    setErrors(errs);
    if (!n.success || !d.success) return;
    create.mutate({ name: n.data, description: d.data, template });
  }

  const chosen = TEMPLATES.find((t) => t.id === template);

  return (
    <Dialog
      open={open}
      onClose={() => {
        if (!create.isPending) onClose();
      }}
      title="New section"
      description="A cross-section design. It starts from a drawing that you then change in the editor."
      data-testid="create-section-dialog"
    >
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        <Field id={`${id}-name`} label="Name" error={errors.name}>
          <Input
            id={`${id}-name`}
            value={name}
            onChange={(e) => setName(e.target.value)}
            autoFocus
            maxLength={120}
            placeholder="e.g. Probe feed, 50 Ω on 0.8 mm laminate"
            aria-invalid={errors.name ? true : undefined}
            aria-describedby={fieldDescribedBy(`${id}-name`)}
            data-testid="create-section-name"
          />
        </Field>
        <Field id={`${id}-tpl`} label="Start from" hint={chosen?.description}>
          <Select
            id={`${id}-tpl`}
            value={template}
            onChange={(e) => setTemplate(e.target.value as TemplateId)}
            aria-describedby={fieldDescribedBy(`${id}-tpl`, true)}
            data-testid="create-section-template"
          >
            {TEMPLATES.map((t) => (
              <option key={t.id} value={t.id}>
                {t.name}
              </option>
            ))}
          </Select>
        </Field>
        <Field id={`${id}-desc`} label="Description (optional)" error={errors.description}>
          <Textarea
            id={`${id}-desc`}
            value={description}
            onChange={(e) => setDescription(e.target.value)}
            rows={3}
            aria-invalid={errors.description ? true : undefined}
            aria-describedby={fieldDescribedBy(`${id}-desc`)}
            data-testid="create-section-description"
          />
        </Field>
        <div aria-live="assertive">
          {create.isError && !(create.error instanceof ApiClientError && create.error.field === 'name') ? (
            <Alert tone="danger">{errorMessage(create.error)}</Alert>
          ) : null}
        </div>
        <div className="flex justify-end gap-2 pt-1">
          <Button variant="ghost" onClick={onClose} disabled={create.isPending}>
            Cancel
          </Button>
          <Button type="submit" variant="primary" pending={create.isPending} data-testid="create-section-submit">
            Create section
          </Button>
        </div>
      </form>
    </Dialog>
  );
}
