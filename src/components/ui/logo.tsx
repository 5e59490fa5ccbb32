export function Logo() {
  return (
    <span className="flex items-center gap-2.5">
      <svg aria-hidden="true" viewBox="0 0 32 32" className="h-8 w-8">
        <rect width="32" height="32" rx="8" className="fill-fjord-700" />
        <path
          d="M7 20 L13 10 L19 22 L25 12"
          strokeWidth="3"
          fill="none"
          strokeLinecap="round"
          strokeLinejoin="round"
          className="stroke-ember-300"
        />
      </svg>
      <span className="text-lg font-semibold tracking-tight text-ink">Crosswatt</span>
    </span>
  );
}
