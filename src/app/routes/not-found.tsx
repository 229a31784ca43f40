import { Link } from 'react-router-dom';
import { MullionWordmark } from '@/components/ui/logo';

export default function NotFoundPage() {
  return (
    <main className="mx-auto flex min-h-dvh max-w-lg flex-col justify-center gap-4 px-6">
      <MullionWordmark />
      <h1 className="text-xl font-semibold">No such page</h1>
      <p className="text-slate-500">The address may be mistyped, or the page has moved.</p>
      <Link to="/" className="font-medium text-brass-700 underline">
        Go to the start page
      </Link>
    </main>
  );
}
