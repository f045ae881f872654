import { describe, expect, it } from 'vitest';
import type { Person } from '@/types/api';
import { filterPeople } from '@/features/people/components/people-table';

const lab = { id: 'o1', name: 'Larkspur Optical Test Laboratory', kind: 'lab' as const };
const client = { id: 'o2', name: 'Quillmere Instruments', kind: 'client' as const };
const PEOPLE: Person[] = [
  { id: 'p1', name: 'Ada Brightwater', email: 'tech@larkspur-lab.example', roles: ['technician'], organisation: lab, active: true },
  { id: 'p2', name: 'Rowan Ellery', email: 'review@larkspur-lab.example', roles: ['reviewer', 'technician'], organisation: lab, active: true },
  { id: 'p3', name: 'Mira Quell', email: 'buyer@quillmere.example', roles: ['client'], organisation: client, active: false },
];

describe('filterPeople', () => {
  it('filterPeople matches name, e-mail, organisation and role label, ignoring case', () => {
    expect(filterPeople(PEOPLE, 'ROWAN').map((p) => p.id)).toEqual(['p2']);
    expect(filterPeople(PEOPLE, 'quillmere').map((p) => p.id)).toEqual(['p3']);
    expect(filterPeople(PEOPLE, 'technician').map((p) => p.id)).toEqual(['p1', 'p2']);
    expect(filterPeople(PEOPLE, '  ').map((p) => p.id)).toEqual(['p1', 'p2', 'p3']);
  });
});
