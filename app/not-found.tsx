import Link from "next/link";

export default function NotFound() {
  return (
    <main className="mx-auto max-w-xl px-4 py-16 text-center">
      <h1 className="text-2xl font-extrabold">Page not found</h1>
      <p className="mt-2 text-slate">The link may be wrong, or the page was moved.</p>
      <Link href="/sites" className="mt-6 inline-block font-semibold underline">
        Go to your sites
      </Link>
    </main>
  );
}
