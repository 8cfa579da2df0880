import { Link } from 'react-router';
import { Mark } from '../components';

/** The mark and the product name, linking home. */
export function Brand({ className }: { className?: string }) {
  return (
    <Link to="/" className={`inline-flex items-center gap-2 rounded text-ink no-underline ${className ?? ''}`}>
      <Mark className="size-8 text-accent" />
      <span className="text-xl font-semibold tracking-tight">Barmkeep</span>
    </Link>
  );
}
