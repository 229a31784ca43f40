import { Link } from 'react-router-dom';
import { CalendarClock, ClipboardCheck, Cpu, Home, ShieldCheck, Users } from 'lucide-react';
import { paths } from '@/config/paths';
import { buttonClass } from '@/components/ui/button';
import { PlanCards } from '@/features/plans/components/plan-cards';
import { OpeningSymbol } from '@/components/coverage/opening-symbol';

const FOR_FIRM = [
  { icon: Cpu, title: 'Every panel and zone', text: 'Zone numbers, serials, inputs, zone types and switches — with the next free number and clashes caught before you program.' },
  { icon: ClipboardCheck, title: 'Visits that leave a record', text: 'Installs, service calls and battery changes with checklists, walk tests and a completion report the client receives.' },
  { icon: CalendarClock, title: 'Upkeep before it fails', text: 'Battery and smoke/CO end-of-life forecasts, permit expiries and contract renewals, each with its date.' },
  { icon: Users, title: 'The whole crew, one record', text: 'Owner, office and technicians each see what their role needs — on the office screen or a phone in a hallway.' },
];

export default function LandingPage() {
  return (
    <main>
      <section className="mx-auto grid max-w-6xl gap-10 px-4 py-12 sm:px-6 md:grid-cols-[1.2fr_1fr] md:py-20">
        <div>
          <p className="text-sm font-medium text-brass-700">For alarm firms of one to thirty people</p>
          <h1 className="mt-3 text-2xl leading-tight font-semibold sm:text-[2.5rem]">Every zone, every window, every visit — one record your whole firm trusts.</h1>
          <p className="mt-4 max-w-xl text-base text-slate-500">
            Mullion keeps your installed base — sites, panels, zones, premises and coverage, jobs and upkeep — and gives each homeowner a clear view of what protects their home.
          </p>
          <div className="mt-8 flex flex-wrap gap-3">
            <Link to={paths.signUp} className={buttonClass('primary', 'lg')}>
              Start a 14-day trial
            </Link>
            <Link to={paths.pricing} className={buttonClass('secondary', 'lg')}>
              See the plans
            </Link>
          </div>
        </div>
        <figure className="rounded-md border border-line bg-card p-5" aria-label="Example of what a homeowner sees">
          <div className="flex items-center justify-between">
            <p className="text-sm font-semibold">Ground floor · Living room</p>
            <span className="text-xs text-slate-500">Example</span>
          </div>
          <ul className="mt-4 space-y-3">
            <li className="flex items-center gap-3">
              <OpeningSymbol kind="door" state="protected" className="size-10" />
              <span className="text-sm">
                <span className="font-medium text-sage-600">Protected</span> — Front door
              </span>
            </li>
            <li className="flex items-center gap-3">
              <OpeningSymbol kind="window" state="protected" className="size-10" />
              <span className="text-sm">
                <span className="font-medium text-sage-600">Protected</span> — Bay window left
              </span>
            </li>
            <li className="flex items-center gap-3">
              <OpeningSymbol kind="window" state="none" className="size-10" />
              <span className="text-sm">
                <span className="font-medium text-clay-600">No sensor</span> — Bay window right, reachable from the garden
              </span>
            </li>
          </ul>
          <figcaption className="mt-5 border-t border-line pt-3 text-sm text-slate-500">
            <span className="font-medium text-ink">14 of 17 openings protected.</span> Your alarm firm sees the same gaps and can propose a visit.
          </figcaption>
        </figure>
      </section>

      <section className="border-y border-line bg-card">
        <div className="mx-auto max-w-6xl px-4 py-12 sm:px-6">
          <h2 className="text-xl font-semibold">For the firm</h2>
          <p className="mt-1 max-w-2xl text-slate-500">The record your technicians, office and owner share — in the trade’s own words.</p>
          <div className="mt-8 grid gap-6 sm:grid-cols-2 lg:grid-cols-4">
            {FOR_FIRM.map((f) => (
              <div key={f.title}>
                <f.icon className="size-6 text-brass-600" aria-hidden="true" />
                <h3 className="mt-3 font-semibold">{f.title}</h3>
                <p className="mt-1 text-sm text-slate-500">{f.text}</p>
              </div>
            ))}
          </div>
        </div>
      </section>

      <section className="mx-auto grid max-w-6xl gap-8 px-4 py-12 sm:px-6 md:grid-cols-2">
        <div>
          <Home className="size-6 text-brass-600" aria-hidden="true" />
          <h2 className="mt-3 text-xl font-semibold">For your clients</h2>
          <p className="mt-2 text-slate-500">
            Homeowners sign in to a portal in your firm’s colours and see each floor and room, every door and window marked protected or not, batteries and upkeep due, past and upcoming visits, and the documents you share. They can ask for service and keep their emergency contacts up to date.
          </p>
        </div>
        <div>
          <ShieldCheck className="size-6 text-brass-600" aria-hidden="true" />
          <h2 className="mt-3 text-xl font-semibold">Careful with what matters</h2>
          <p className="mt-2 text-slate-500">
            Each firm’s records are its own. Verbal passcodes are encrypted and shown to staff only, every change is logged, and clients never see internal notes or another household.
          </p>
        </div>
      </section>

      <section className="border-t border-line bg-card" aria-labelledby="plans-heading">
        <div className="mx-auto max-w-6xl px-4 py-12 sm:px-6">
          <h2 id="plans-heading" className="text-xl font-semibold">
            Plans
          </h2>
          <p className="mt-1 text-slate-500">One monthly price per firm. Every plan starts with a 14-day trial.</p>
          <div className="mt-8">
            <PlanCards />
          </div>
        </div>
      </section>
    </main>
  );
}
