import { labToHex } from '../../../../shared/colour';
import { ShadeSearchLink } from '../../search';
import { lab as labText } from '../format';

type LabColour = { L: number; a: number; b: number };

/** A colour drawn from its L*a*b* on the neutral grey ground, with its numbers beneath. */
export function Swatch({
  colour,
  label,
  size = 'md',
  caption,
  shadeLink = false,
}: {
  colour: LabColour | null;
  label: string;
  size?: 'sm' | 'md' | 'lg';
  caption?: string;
  shadeLink?: boolean;
}) {
  const link =
    shadeLink && colour ? (
      <ShadeSearchLink hex={labToHex(colour)} className="text-xs text-action hover:underline">
        {size === 'sm' ? 'pieces with this shade' : 'Pieces with this shade'}
      </ShadeSearchLink>
    ) : null;
  const box = size === 'lg' ? 'h-40 w-full' : size === 'md' ? 'h-20 w-28' : 'h-6 w-10';
  return (
    <figure className={size === 'sm' ? 'inline-flex items-center gap-2' : 'm-0'}>
      <div
        className={`${box} rounded border border-rule-strong ${colour ? '' : 'bg-neutral-light'}`}
        style={colour ? { background: labToHex(colour) } : undefined}
        role="img"
        aria-label={colour ? `${label}: ${labText(colour)}` : `${label}: no colour yet`}
      />
      {size !== 'sm' ? (
        <figcaption className="mt-1 text-xs">
          <span className="font-medium text-ink">{label}</span>
          {colour ? (
            <span className="block font-mono text-ink-soft">{labText(colour)}</span>
          ) : (
            <span className="block text-ink-faint">no colour yet</span>
          )}
          {caption ? <span className="block text-ink-faint">{caption}</span> : null}
          {link ? <span className="block">{link}</span> : null}
        </figcaption>
      ) : (
        link
      )}
    </figure>
  );
}
