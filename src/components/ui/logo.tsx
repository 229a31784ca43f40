/** The Mullion mark: a window divided by one vertical and one horizontal bar. */
export function MullionMark({ className = 'size-7' }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={className} aria-hidden="true">
      <rect x="3" y="3" width="26" height="26" rx="3" fill="currentColor" />
      <rect x="6" y="6" width="20" height="20" fill="#f6f4ef" />
      <rect x="14.5" y="6" width="3" height="20" fill="#8f5c17" />
      <rect x="6" y="13" width="20" height="3" fill="#8f5c17" />
    </svg>
  );
}

export function MullionWordmark({ tone = 'dark' }: { tone?: 'dark' | 'light' }) {
  return (
    <span className={`inline-flex items-center gap-2 font-semibold tracking-tight ${tone === 'light' ? 'text-paper' : 'text-ink'}`}>
      <MullionMark className={`size-7 ${tone === 'light' ? 'text-paper/15' : 'text-ink'}`} />
      <span className="text-lg">Mullion</span>
    </span>
  );
}
