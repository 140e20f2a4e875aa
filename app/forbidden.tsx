import Link from 'next/link';

/**
 * Answered with HTTP 403 when a page is for studio managers and the person is not one. It shows
 * inside the app's own frame (navigation and main landmark), so it is a plain block here.
 */
export default function Forbidden() {
  return (
    <div className="max-w-prose py-10">
      <h1 className="text-2xl font-semibold">Only studio managers can see this page</h1>
      <p className="mt-2 text-muted">Your role does not include it. A studio manager can change your role on the Team page if you need it.</p>
      <Link href="/" className="tp-button mt-6">
        Back to the overview
      </Link>
    </div>
  );
}
