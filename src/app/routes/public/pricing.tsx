import { PlanCards } from '@/features/plans/components/plan-cards';

export default function PricingPage() {
  return (
    <main className="mx-auto max-w-6xl px-4 py-12 sm:px-6">
      <h1 className="text-2xl font-semibold">Plans and prices</h1>
      <p className="mt-2 max-w-2xl text-slate-500">
        Priced per firm, by the size of your crew and the number of active sites you look after. Your clients’ portal sign-ins never count as seats.
      </p>
      <div className="mt-8">
        <PlanCards />
      </div>
      <dl className="mt-10 grid gap-6 text-sm sm:grid-cols-2">
        <div>
          <dt className="font-semibold">What is an active site?</dt>
          <dd className="mt-1 text-slate-500">A home or business with at least one panel you keep in Mullion. Sites you have removed do not count.</dd>
        </div>
        <div>
          <dt className="font-semibold">What happens after the trial?</dt>
          <dd className="mt-1 text-slate-500">Choose a plan to keep working. Until then your records stay safe and readable; nothing is deleted.</dd>
        </div>
      </dl>
    </main>
  );
}
