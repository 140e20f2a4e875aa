/** Takeproof's mark: a sampled wave crossing a check line, drawn in the current ink colour. */
export function Wordmark({ className = '' }: { className?: string }) {
  return (
    <span className={`inline-flex items-center gap-2 font-semibold tracking-tight ${className}`}>
      <svg aria-hidden="true" viewBox="0 0 32 32" className="h-7 w-7">
        <rect x="1" y="1" width="30" height="30" rx="7" className="fill-accent" />
        <path d="M5 17 h3 v-6 h3 v12 h3 v-9 h3 v5 h3 v-8 h3 v6 h4" fill="none" strokeWidth="2.2" strokeLinejoin="round" className="stroke-on-accent" />
      </svg>
      <span className="text-lg">Takeproof</span>
    </span>
  );
}
