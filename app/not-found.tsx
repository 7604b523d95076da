import Link from "next/link";

export default function NotFound() {
  return (
    <main className="mx-auto max-w-xl px-6 py-16">
      <h1 className="text-2xl font-bold">This record could not be found</h1>
      <p className="mt-2 text-ink-soft">It may not exist, or it belongs to a site you do not work at.</p>
      <p className="mt-4"><Link href="/" className="font-semibold text-lagoon-700 underline">Go to your start page</Link></p>
    </main>
  );
}
