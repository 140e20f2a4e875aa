import Link from 'next/link';

/** Answered with HTTP 403 when a page is for studio managers and the person is not one. */
export default function Forbidden() {
  return (
    <main className="mx-auto max-w-prose px-4 py-16">
      <h1 className="text-2xl font-semibold">Only studio managers can see this page</h1>
      <p className="mt-2 text-muted">Your role does not include it. A studio manager can change your role on the Team page if you need it.</p>
      <Link href="/" className="tp-button mt-6">
        Back to the overview
      </Link>
    </main>
  );
}
