import { IMAGE_ESTIMATE_CONDITIONS, viewingLabel, type ColourSource } from '../../shared/colour/conditions';

type Conditioned = { illuminant: string; observer: string; source: ColourSource };

/** The one label every colour figure carries: where it comes from and the illuminant/observer it is under. */
export function ViewingConditions({
  colour,
  className = 'text-ink-soft',
}: {
  colour: Conditioned;
  className?: string;
}) {
  return (
    <span className={`whitespace-nowrap text-xs ${className}`} data-testid="viewing-conditions">
      {viewingLabel(colour)}
    </span>
  );
}

/** Palette colours and shade-search matches: all computed from photos, so D65/2°. */
export const IMAGE_ESTIMATE = { ...IMAGE_ESTIMATE_CONDITIONS, source: 'image-estimate' as const };
