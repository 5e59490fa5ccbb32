import { Link } from 'react-router-dom';
import type { FigureMethods } from '@shared/schemas/statistics';

function listOf(versions: number[]): string {
  return versions.length <= 1 ? versions.join('') : `${versions.slice(0, -1).join(', ')} and ${versions.at(-1)}`;
}

/** Which comparison method the page's figures come from; says so when some rides were analysed with an older one. */
export function FigureMethodsLine({ methods }: { methods: FigureMethods }) {
  const { current, versions } = methods;
  const older = versions.some((v) => v < current);
  return (
    <p className="mt-3 text-caption text-ink-faint">
      {versions.length === 0
        ? `Comparison method version ${current}.`
        : `Figures from rides analysed with method version${versions.length > 1 ? 's' : ''} ${listOf(versions)}${older ? ` (the current method is ${current}; older rides are re-analysed with it)` : ''}.`}{' '}
      <Link to="/methodology" className="underline underline-offset-2">
        How rides are compared
      </Link>
    </p>
  );
}
