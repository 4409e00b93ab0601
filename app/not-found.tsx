import Link from "next/link";

export default function NotFound() {
  return (
    <main className="grid min-h-[60vh] place-items-center px-4">
      <div className="text-center">
        <p className="text-micro uppercase tracking-widest text-ink-faint">404</p>
        <h1 className="mt-1">Nothing here</h1>
        <p className="mt-2 text-ink-soft">The page or record you asked for does not exist, or it was deleted.</p>
        <Link href="/" className="mt-4 inline-block text-weir-600 underline">
          Back to the overview
        </Link>
      </div>
    </main>
  );
}
