/** A message about the whole form (not one field), read out when it appears. */
export function FormAlert({ message, tone = 'danger' }: { message: string | null; tone?: 'danger' | 'ok' }) {
  if (!message) return null;
  return (
    <p
      role={tone === 'danger' ? 'alert' : 'status'}
      className={`rounded-md px-3 py-2 text-sm ${tone === 'danger' ? 'bg-danger-tint text-danger' : 'bg-ok-tint text-ok'}`}
    >
      {message}
    </p>
  );
}
