import type { DemoAccount } from '@/features/auth/components/sign-in-form';

/** The seeded demo people of the invented Larkspur lab and its client. Referenced only behind import.meta.env.DEV. */
export const DEMO_ACCOUNTS: DemoAccount[] = [
  { label: 'Technician', email: 'tech@larkspur-lab.example', password: 'demo-tech-2026' },
  { label: 'Reviewer', email: 'review@larkspur-lab.example', password: 'demo-review-2026' },
  { label: 'Administrator', email: 'admin@larkspur-lab.example', password: 'demo-admin-2026' },
  { label: 'Client', email: 'buyer@quillmere.example', password: 'demo-client-2026' },
];
