import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { DECISION_KINDS, DECISION_LABELS } from '#shared/api/review';
import type { Role } from '#shared/api/roles';
import { ChoiceGroup } from '../../../components/ui/choice-group';
import { Icon } from '../../../components/ui/icon';
import { ApiFailure } from '../../../lib/api';
import { postDecision } from '../api';

type Kind = (typeof DECISION_KINDS)[number];

/** Records a decision on a piece, made on the version the person is looking at. */
export function DecisionForm({ pieceId, version, role, flagged }: { pieceId: string; version: number; role: Role; flagged: boolean }) {
  const qc = useQueryClient();
  const kinds = DECISION_KINDS.filter((k) => k !== 'clear' || role !== 'engineer');
  const [kind, setKind] = useState<Kind | ''>('');
  const [comment, setComment] = useState('');
  const save = useMutation({
    mutationFn: () => postDecision(pieceId, { kind: kind as Kind, comment, version }),
    onSuccess: async () => {
      setKind('');
      setComment('');
      await qc.invalidateQueries({ queryKey: ['pieces'] });
    },
  });
  const err = save.error instanceof ApiFailure ? save.error : null;
  const needsComment = kind === 'hold' || kind === 'engineering' || (kind === 'clear' && flagged);
  return (
    <form
      className="card"
      aria-labelledby="decision-title"
      onSubmit={(e) => {
        e.preventDefault();
        if (kind) save.mutate();
      }}
    >
      <h2 id="decision-title" className="mb-3 text-xl font-semibold">
        Record a decision
      </h2>
      <ChoiceGroup legend="Decision" name="decision" value={kind} options={kinds} labels={DECISION_LABELS} onChange={setKind} />
      <label htmlFor="decision-comment" className="label">
        Comment{needsComment ? ' (required)' : ''}
      </label>
      <textarea id="decision-comment" className="input min-h-[88px] py-2" value={comment} onChange={(e) => setComment(e.target.value)} maxLength={2000} aria-invalid={!!err?.fieldErrors.comment} />
      {err && (
        <p className="mt-2 flex items-center gap-2 font-semibold text-bad" role="alert">
          <Icon name="warning" /> {err.fieldErrors.comment?.[0] ?? err.message}
        </p>
      )}
      <button type="submit" className="btn-primary mt-3" disabled={!kind || save.isPending}>
        Save the decision
      </button>
      {save.isSuccess && (
        <p className="mt-2 flex items-center gap-2 font-semibold text-ok" role="status">
          <Icon name="check" /> Decision recorded.
        </p>
      )}
    </form>
  );
}
