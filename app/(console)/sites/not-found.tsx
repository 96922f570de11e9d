import Link from "next/link";

export default function SiteNotFound() {
  return (
    <main className="mx-auto max-w-xl px-4 py-16 text-center">
      <h1 className="text-2xl font-extrabold">No such site</h1>
      <p className="mt-2 text-slate">It may have been removed, or the link is wrong.</p>
      <Link href="/sites" className="mt-6 inline-block font-semibold underline">
        Back to sites
      </Link>
    </main>
  );
}
