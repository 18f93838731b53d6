import type { Metadata } from 'next';
import { DashboardView } from './dashboard-view';
import { PageHeader } from '@/components/ui/page-header';

export const metadata: Metadata = { title: 'Today · Sowcast' };

export default function DashboardPage() {
  return (
    <>
      <PageHeader title="Today" description="Your steps, what moved and what needs a look." />
      <DashboardView />
    </>
  );
}
