'use client';

export default function SegmentError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <div role="alert" className="tp-card max-w-prose p-6">
      <h1 className="text-xl font-semibold">✕ This page could not be shown</h1>
      <p className="mt-2 text-muted">
        {error.message.startsWith('Your role') ? error.message : 'Something went wrong while loading it. Nothing you entered was lost.'}
      </p>
      <button type="button" className="tp-button mt-4" onClick={reset}>
        Try again
      </button>
    </div>
  );
}
