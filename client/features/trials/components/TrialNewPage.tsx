import { useState } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { Button } from '../../../components/Button';
import { FormAlert } from '../../../components/form/FormAlert';
import { Page } from '../../../components/Page';
import { trialCreateSchema } from '../../../../shared/schemas/trial';
import { formMessage, useFormErrors } from '../../../lib/form';
import { paths } from '../../../paths';
import { useQuery } from '@tanstack/react-query';
import { pieceQuery } from '../../pieces';
import { useCreateTrial } from '../api';
import { TrialFields, toTrialInput, type TrialFormValues } from './TrialFields';

/** /trials/new?pieceId=…[&target=region:4][&aim=as-made]: attach a new trial to a piece (aimed at a target), or start one on its own. */
export function TrialNewPage() {
  const [params] = useSearchParams();
  const pieceId = params.get('pieceId') ? Number(params.get('pieceId')) : null;
  const piece = useQuery({ ...pieceQuery(pieceId ?? 0), enabled: pieceId != null });
  const navigate = useNavigate();
  const create = useCreateTrial();
  const [kind, setKind] = useState<'modern' | 'historical'>('modern');
  const [values, setValues] = useState<TrialFormValues>({
    status: 'planned',
    fibre: 'cotton',
    weave: '',
    gsm: '',
    dryMassG: '',
    dryMassBasis: 'air-dry',
    startedOn: '',
    notes: '',
    // From a link such as a fading pair's "aim a trial at it"; anything else in the address is ignored.
    target: /^(region|measurement|palette):\d+$/.test(params.get('target') ?? '') ? params.get('target')! : '',
    aim: /^as-(made|seen)$/.test(params.get('aim') ?? '') ? params.get('aim')! : '',
  });
  const { formRef, errors, check, fromServer } = useFormErrors();

  return (
    <Page
      title={pieceId ? 'Attach a trial' : 'New trial'}
      lead={
        pieceId && piece.data ? (
          <>
            Reproducing{' '}
            <Link className="underline" to={paths.piece(pieceId)}>
              <span className="font-mono">{piece.data.piece.accessionNumber}</span> {piece.data.piece.title}
            </Link>
            . The server gives the trial its code; the curator who catalogued the piece is told by e-mail.
          </>
        ) : (
          'The server gives the trial its code. Attach it to a piece from the piece page to aim at one of its colours.'
        )
      }
    >
      <form
        ref={formRef}
        noValidate
        className="max-w-3xl space-y-5 rounded-lg border border-rule bg-sheet p-5"
        onSubmit={(e) => {
          e.preventDefault();
          const data = check(trialCreateSchema, { ...toTrialInput(values), kind, pieceId });
          if (data)
            create.mutate(data, { onSuccess: ({ trial }) => navigate(paths.trial(trial.id)), onError: fromServer });
        }}
      >
        <fieldset>
          <legend className="text-sm font-medium">Kind of trial</legend>
          <div className="mt-1 flex flex-wrap gap-4 text-sm">
            <label className="flex items-center gap-2">
              <input type="radio" name="kind" checked={kind === 'modern'} onChange={() => setKind('modern')} /> Modern
              reproduction (to be dyed)
            </label>
            <label className="flex items-center gap-2">
              <input type="radio" name="kind" checked={kind === 'historical'} onChange={() => setKind('historical')} />{' '}
              Historical recipe, recorded for scholarship only
            </label>
          </div>
        </fieldset>
        <TrialFields values={values} onChange={setValues} errors={errors} pieceId={pieceId} />
        <FormAlert message={formMessage(create.error) ?? errors._?.join(' ') ?? null} />
        <div className="flex gap-3">
          <Button type="submit" disabled={create.isPending}>
            {create.isPending ? 'Saving…' : 'Create trial'}
          </Button>
          <Link className="px-4 py-2 text-sm underline" to={pieceId ? paths.piece(pieceId) : paths.trials()}>
            Cancel
          </Link>
        </div>
      </form>
    </Page>
  );
}
