import Link from 'next/link';

export default function NotFound() {
  return (
    <main className="mx-auto max-w-prose px-4 py-16">
      <h1 className="text-2xl font-semibold">Not here</h1>
      <p className="mt-2 text-muted">This page does not exist, or it belongs to another studio.</p>
      <Link href="/" className="tp-button mt-6">
        Back to the overview
      </Link>
    </main>
  );
}
