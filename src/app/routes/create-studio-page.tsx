import { useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router-dom';
import { Button } from '../../components/button';
import { Notice } from '../../components/notice';
import { PageHeader } from '../../components/page-header';
import { TextField } from '../../components/text-field';
import { createStudioInputSchema, useCreateStudio } from '../../features/studios/api/create-studio';
import { rememberStudio } from '../../features/studios/current-studio';
import { useFieldErrors } from '../../lib/use-field-errors';

export default function CreateStudioPage() {
  const navigate = useNavigate();
  const create = useCreateStudio();
  const fields = useFieldErrors();
  const [name, setName] = useState('');
  const submit = (event: FormEvent) => {
    event.preventDefault();
    const input = fields.check(createStudioInputSchema, { name });
    if (!input) return;
    create.mutate(input, {
      onSuccess: (studio) => {
        rememberStudio(studio.id);
        navigate(`/studios/${studio.id}`);
      },
      onError: fields.fromServer,
    });
  };
  return (
    <div className="max-w-lg">
      <PageHeader title="Create a studio" subtitle="You become its lead: you invite the team and curate its presets." />
      <form onSubmit={submit} noValidate className="flex flex-col gap-2">
        <TextField label="Studio name" value={name} onChange={(event) => setName(event.target.value)} error={fields.errors.name} autoFocus />
        {create.isError && !fields.errors.name && <Notice tone="error">{create.error.message}</Notice>}
        <Button type="submit" busy={create.isPending} className="self-start">
          Create studio
        </Button>
      </form>
    </div>
  );
}
