import Link from "next/link";
import { LogoMark } from "@/components/ui/logo-mark";

export function AuthCard({ title, children, footer }: { title: string; children: React.ReactNode; footer?: React.ReactNode }) {
  return (
    <main id="main" className="mx-auto flex min-h-screen max-w-md flex-col justify-center px-4 py-10">
      <Link href="/" className="mb-6 flex items-center gap-2 self-center text-xl font-extrabold">
        <LogoMark className="h-8 w-8" />
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
