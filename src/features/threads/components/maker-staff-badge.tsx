/**
 * Crosswatt's mark for a maker's verified staff: a teal tag with a small
 * chainring-and-tick glyph, the maker's name spelled out so it is never only colour.
 */
export function MakerStaffBadge({ makerName }: { makerName: string }) {
  return (
    <span
      className="inline-flex items-center gap-1.5 rounded-md border border-fjord-700 bg-fjord-900 py-0.5 pl-1 pr-2 text-caption font-semibold text-paper"
      data-testid="maker-staff-badge"
    >
      <svg aria-hidden="true" viewBox="0 0 16 16" className="h-4 w-4">
        <circle cx="8" cy="8" r="6.25" fill="none" stroke="#eb9a6c" strokeWidth="1.5" strokeDasharray="2.2 1.1" />
        <path d="M5 8.2l2 2 4-4.4" fill="none" stroke="#f8f6f1" strokeWidth="1.8" strokeLinecap="round" strokeLinejoin="round" />
      </svg>
      <span>
        {makerName} <span className="font-normal text-fjord-100">· maker staff</span>
      </span>
    </span>
  );
}
