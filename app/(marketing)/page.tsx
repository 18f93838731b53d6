import {
  Axe, Bell, BookOpen, CalendarDays, Eye, Hourglass, Package, Scissors, SprayCan, Sprout, UserRound, Wheat,
  type LucideIcon,
} from 'lucide-react';
import { SamplePlan } from '@/components/marketing/sample-plan';
import { ButtonLink } from '@/components/ui/button';
import { cn } from '@/components/ui/cn';
import { Notice } from '@/components/ui/notice';

const SEASON: { icon: LucideIcon; tone: string; title: string; text: string }[] = [
  { icon: Axe, tone: 'bg-loam/10 text-loam', title: 'Clear brush', text: 'Woody growth comes out first, so spray and seed reach the ground.' },
  { icon: SprayCan, tone: 'bg-ember-light text-ember', title: 'Burndown spray', text: 'Placed in a calm, rain-free window, so the herbicide stays on the leaves and on your plot.' },
  { icon: Hourglass, tone: 'bg-straw-light text-[#8a6a1f]', title: 'Kill wait', text: 'About two weeks for the old growth to die back — longer when the label asks for it.' },
  { icon: Sprout, tone: 'bg-clover-light text-clover-dark', title: 'Seed ahead of rain', text: 'Timed just before a soaking rain, while the soil is still warm enough for the blend to come up.' },
  { icon: Wheat, tone: 'bg-straw-light text-[#8a6a1f]', title: 'Fertilize', text: 'Rates from your soil test and the plot’s acres, at seeding or once the stand is up.' },
  { icon: Eye, tone: 'bg-frost-light text-[#4f6b80]', title: 'Check germination', text: 'A reminder to walk the plot, note how the stand came up, and reseed thin spots.' },
  { icon: Scissors, tone: 'bg-clover-light text-clover-dark', title: 'Upkeep', text: 'Mowing and grass control through the season, so the stand is thick when it counts.' },
];

const FEATURES: { icon: LucideIcon; title: string; text: string }[] = [
  { icon: Package, title: 'What to carry', text: 'Seed, fertilizer and spray amounts worked out for each plot’s acres, so the truck is loaded once.' },
  { icon: Bell, title: 'Reminders by e-mail and phone', text: 'The person doing the work is reminded ahead of each step, at a sensible hour in their own time zone.' },
  { icon: CalendarDays, title: 'Season calendar', text: 'Every plot’s steps on one calendar. When the forecast shifts, the plan moves and says why.' },
  { icon: BookOpen, title: 'Records', text: 'What was applied where, when and by whom — kept for next season and for anyone who asks.' },
  { icon: UserRound, title: 'Landowner view', text: 'Give the landowner read-only access: they see the plan and the work done, and change nothing.' },
];

export default function Landing() {
  return (
    <>
      <section className="mx-auto grid max-w-6xl items-center gap-10 px-5 pb-14 pt-8 sm:px-8 lg:grid-cols-[1.1fr_1fr] lg:pt-14">
        <div>
          <p className="text-sm font-semibold uppercase tracking-wide text-clover">For people who plant food plots</p>
          <h1 className="mt-3 text-3xl font-bold tracking-tight text-loam sm:text-[2.9rem] sm:leading-[3.3rem]">
            Plant each plot when the ground and the weather are ready.
          </h1>
          <p className="mt-4 max-w-xl text-lg text-loam-soft">
            Sowcast plans the season for every food plot you keep. It puts each piece of work on a day the forecast
            allows, works out what to bring, and reminds whoever is doing it — for your own ground, a lease, or a
            club.
          </p>
          <div className="mt-7 flex flex-col gap-3 sm:flex-row">
            <ButtonLink href="/sign-up" className="min-h-12 px-6 text-lg">
              Create an account
            </ButtonLink>
            <ButtonLink href="/sign-in" variant="secondary" className="min-h-12 px-6 text-lg">
              Sign in
            </ButtonLink>
          </div>
        </div>
        <SamplePlan />
      </section>

      <section aria-labelledby="season-heading" className="border-y border-ground-line bg-ground-raised">
        <div className="mx-auto max-w-6xl px-5 py-14 sm:px-8">
          <h2 id="season-heading" className="text-2xl font-bold tracking-tight">
            One plan per plot, from brush to stand
          </h2>
          <p className="mt-2 max-w-2xl text-loam-soft">
            Tell Sowcast where the property is, what covers each plot and what you mean to plant. It lays out the
            season in order and keeps it up to date as the forecast changes and the work gets done.
          </p>
          <ol className="mt-8 grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
            {SEASON.map((step, index) => (
              <li key={step.title} className="rounded-card border border-ground-line bg-ground p-4">
                <div className="flex items-center gap-3">
                  <span className={cn('grid size-10 place-items-center rounded-lg', step.tone)}>
                    <step.icon className="size-5" aria-hidden="true" />
                  </span>
                  <span className="tabular text-sm font-semibold text-loam-soft">Step {index + 1}</span>
                </div>
                <h3 className="mt-3 font-semibold">{step.title}</h3>
                <p className="mt-1 text-sm text-loam-soft">{step.text}</p>
              </li>
            ))}
          </ol>
        </div>
      </section>

      <section aria-labelledby="features-heading" className="mx-auto max-w-6xl px-5 py-14 sm:px-8">
        <h2 id="features-heading" className="text-2xl font-bold tracking-tight">
          Around the plan
        </h2>
        <ul className="mt-8 grid gap-6 sm:grid-cols-2 lg:grid-cols-3">
          {FEATURES.map((feature) => (
            <li key={feature.title} className="flex gap-4">
              <feature.icon className="mt-0.5 size-6 shrink-0 text-clover" aria-hidden="true" />
              <div>
                <h3 className="font-semibold">{feature.title}</h3>
                <p className="mt-1 text-sm text-loam-soft">{feature.text}</p>
              </div>
            </li>
          ))}
        </ul>

        <Notice tone="caution" title="Sowcast picks the day; the label still rules" className="mt-12 max-w-3xl">
          Herbicide and fire can hurt people, neighbours and water. The product label is the law: follow its rates,
          intervals and protective equipment, watch for drift, get a burn permit where one is needed, and follow
          local rules and licensed advice over any plan.
        </Notice>

        <div className="mt-12 flex flex-col items-start gap-3 rounded-card bg-clover px-6 py-8 text-white sm:flex-row sm:items-center sm:justify-between">
          <p className="text-xl font-semibold">Start with one property and its plots.</p>
          <ButtonLink href="/sign-up" variant="secondary" className="min-h-12 px-6">
            Create an account
          </ButtonLink>
        </div>
      </section>
    </>
  );
}
