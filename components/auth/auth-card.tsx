import Link from "next/link";

export function AuthCard({ title, children, footer }: { title: string; children: React.ReactNode; footer?: React.ReactNode }) {
  return (
    <main id="main" className="mx-auto flex min-h-screen max-w-md flex-col justify-center px-4 py-10">
      <Link href="/" className="mb-6 flex items-center gap-2 self-center text-xl font-extrabold">
        <svg aria-hidden="true" viewBox="0 0 32 32" className="h-8 w-8">
          <rect width="32" height="32" rx="7" fill="#1d2833" />
          <path d="M18 4 9 18h6l-2 10 10-15h-6z" fill="#d99a1e" />
        </svg>
        Joulepath
      </Link>
      <section className="rounded-2xl border border-line bg-paper p-6 shadow-sm">
        <h1 className="mb-4 text-2xl font-extrabold">{title}</h1>
        {children}
      </section>
      {footer ? <div className="mt-4 text-center text-sm text-slate">{footer}</div> : null}
    </main>
  );
}
