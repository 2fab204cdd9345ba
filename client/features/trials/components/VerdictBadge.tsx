import { VERDICT_WORDS } from '../format';

const tone: Record<string, string> = {
  match: 'bg-ok-tint text-ok',
  close: 'bg-ok-tint text-ok',
  near: 'bg-warn-tint text-warn',
  different: 'bg-danger-tint text-danger',
};

export function VerdictBadge({ verdict }: { verdict: string }) {
  return (
    <span className={`inline-block rounded px-2 py-0.5 text-xs font-semibold ${tone[verdict] ?? 'bg-neutral-light'}`}>
      {VERDICT_WORDS[verdict] ?? verdict}
    </span>
  );
}
