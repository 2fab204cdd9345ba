import { Link } from 'react-router-dom';
import { paths } from '../../../paths';
import { useCan } from '../../auth';

/** "Suggest a recipe" beside a colour of a piece, for signed-in people (suggestions rest on the studio's trials). */
export function SuggestRecipeLink({
  pieceId,
  paletteColourId,
  regionId,
  measurementId,
  className = 'text-action hover:underline',
}: {
  pieceId: number | null;
  paletteColourId?: number;
  regionId?: number;
  measurementId?: number;
  className?: string;
}) {
  const can = useCan();
  if (!can('trial:read')) return null;
  return (
    <Link className={className} to={paths.suggest({ pieceId, paletteColourId, regionId, measurementId })}>
      Suggest a recipe
    </Link>
  );
}
