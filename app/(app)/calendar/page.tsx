import type { Metadata } from 'next';
import { SeasonCalendar } from '@/components/calendar/season-calendar';
import { PageHeader } from '@/components/ui/page-header';

export const metadata: Metadata = { title: 'Season calendar · Sowcast' };

export default function CalendarPage() {
  return (
    <>
      <PageHeader
        title="Season calendar"
        description="Every step of every plot you can see, on one calendar. Drag a step you may move to another day; Sowcast checks the day first."
      />
      <SeasonCalendar />
    </>
  );
}
