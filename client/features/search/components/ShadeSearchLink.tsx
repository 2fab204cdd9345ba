import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../paths';

/** "Pieces with this shade": a link to the search page for a hex colour, for palettes and trial swatches elsewhere. */
export function ShadeSearchLink({
  hex,
  maxDeltaE,
  children,
  className,
}: {
  hex: string;
  maxDeltaE?: number;
  children?: ReactNode;
  className?: string;
}) {
  const h = hex.replace('#', '').toLowerCase();
  return (
    <Link to={paths.shadeSearch(h, maxDeltaE)} className={className ?? 'text-action hover:underline text-sm'}>
      {children ?? 'Pieces with this shade'}
    </Link>
  );
}
