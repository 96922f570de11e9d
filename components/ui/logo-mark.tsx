/** The product mark (the same drawing as app/icon.svg), beside the word "Joulepath". */
export function LogoMark({ className = "h-7 w-7" }: { className?: string }) {
  return (
    <svg aria-hidden="true" viewBox="0 0 32 32" className={className}>
      <rect width="32" height="32" rx="7" fill="#1d2833" />
      <path d="M18 4 9 18h6l-2 10 10-15h-6z" fill="#d99a1e" />
    </svg>
  );
}
