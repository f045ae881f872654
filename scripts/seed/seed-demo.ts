import { pathToFileURL } from 'node:url';
import { createDatabase, type Database } from '../../server/db/client';
import { parseEnv } from '../../server/env';
import { createLogger } from '../../server/services/logger';
import { createObjectStorage } from '../../server/services/object-storage';
import { todayIsoDate } from '../../server/services/equipment';
import { createPasswordHasher, type PasswordHasher } from '../../server/services/passwords';
import { seedDemoOrganisations, type DemoOrganisationKey } from './demo-organisations';
import { demoPeople, seedDemoPeople } from './demo-people';
import { seedDemoEquipment } from './demo-equipment';
import { seedDemoWorkOrders } from './demo-work-orders';
import { seedDemoMeasurements, type DemoMeasurementDeps } from './demo-measurements';
import { seedContactsAndRequests } from './seed-contacts-and-requests';

const DEMO_CLIENT_REQUESTER_EMAIL = 'buyer@quillmere.example';

export interface SeedContext {
  db: Database;
  passwords: PasswordHasher;
  /** Filled in by earlier steps for later ones. */
  organisationIds: Partial<Record<DemoOrganisationKey, string>>;
  personIdsByEmail: Record<string, string>;
  /** The seeding day, YYYY-MM-DD; demo due dates count from it. */
  today: string;
  equipmentIdsByIdentifier: Record<string, string>;
  workOrderIdsByKey: Record<string, string>;
  /** Keys as in `demoLensesByKey` (scripts/seed/demo-work-orders.ts). */
  lensIdsByKey: Record<string, string>;
  /** Object storage, the pool and a logger, for steps that store frames and queue analyses; absent, those steps are skipped. */
  services?: Omit<DemoMeasurementDeps, 'db'>;
  /** For links in the mail that seeding queues. */
  publicBaseUrl: string;
  report(message: string): void;
}

/** One idempotent piece of demo data; running it twice changes nothing. */
export interface SeedStep {
  name: string;
  run(context: SeedContext): Promise<void>;
}

/** The demo person recorded as creating the demo work orders and lenses. */
const DEMO_TECHNICIAN_EMAIL = 'tech@larkspur-lab.example';

/** In order; later demo data (equipment, work orders, measurements) appends steps here. */
export const demoSeedSteps: SeedStep[] = [
  {
    name: 'organisations',
    async run(context) {
      context.organisationIds = await seedDemoOrganisations(context.db);
    },
  },
  {
    name: 'people',
    async run(context) {
      const { idByEmail, created } = await seedDemoPeople(context.db, {
        organisationIds: context.organisationIds as Record<DemoOrganisationKey, string>,
        passwords: context.passwords,
      });
      context.personIdsByEmail = idByEmail;
      if (created.length > 0) context.report(`created ${created.length} demo account(s)`);
    },
  },
  {
    name: 'equipment',
    async run(context) {
      const { idByIdentifier, created } = await seedDemoEquipment(context.db, { today: context.today });
      context.equipmentIdsByIdentifier = idByIdentifier;
      if (created > 0) context.report(`registered ${created} demo equipment item(s)`);
    },
  },
  {
    name: 'work orders and lenses',
    async run(context) {
      const technicianId = context.personIdsByEmail[DEMO_TECHNICIAN_EMAIL];
      if (!technicianId) throw new Error(`The demo technician ${DEMO_TECHNICIAN_EMAIL} must be seeded before the work orders.`);
      const { workOrderIdsByKey, lensIdsByKey, created } = await seedDemoWorkOrders(context.db, {
        organisationIds: context.organisationIds as Record<DemoOrganisationKey, string>,
        technicianId,
        today: context.today,
      });
      context.workOrderIdsByKey = workOrderIdsByKey;
      context.lensIdsByKey = lensIdsByKey;
      if (created > 0) context.report(`created ${created} demo work order(s)`);
    },
  },
  {
    name: 'client contacts and a work request',
    async run(context) {
      const requestedById = context.personIdsByEmail[DEMO_CLIENT_REQUESTER_EMAIL];
      if (!requestedById) throw new Error(`The demo client ${DEMO_CLIENT_REQUESTER_EMAIL} must be seeded before the work request.`);
      const { contactsAdded, requestNumber } = await seedContactsAndRequests(context.db, {
        organisationIds: context.organisationIds as Record<DemoOrganisationKey, string>,
        requestedById,
        today: context.today,
        baseUrl: context.publicBaseUrl,
      });
      if (contactsAdded > 0) context.report(`added ${contactsAdded} client contact(s)`);
      if (requestNumber) context.report(`a client requested new work: ${requestNumber}`);
    },
  },
  {
    name: 'measurements',
    async run(context) {
      if (!context.services) {
        context.report('demo measurements skipped (no object storage given)');
        return;
      }
      const technicianId = context.personIdsByEmail[DEMO_TECHNICIAN_EMAIL];
      if (!technicianId) throw new Error(`The demo technician ${DEMO_TECHNICIAN_EMAIL} must be seeded before the measurements.`);
      const { created, framesStored, analysesQueued } = await seedDemoMeasurements(
        { db: context.db, ...context.services },
        {
          lensIdsByKey: context.lensIdsByKey,
          equipmentIdsByIdentifier: context.equipmentIdsByIdentifier,
          technicianId,
          today: context.today,
          report: context.report,
        },
      );
      if (created + framesStored + analysesQueued > 0) {
        context.report(`created ${created} demo measurement(s), stored ${framesStored} frame(s), queued ${analysesQueued} analysis run(s)`);
      }
    },
  },
];

export interface SeedDemoResult {
  organisationIds: Partial<Record<DemoOrganisationKey, string>>;
  personIdsByEmail: Record<string, string>;
  equipmentIdsByIdentifier: Record<string, string>;
  workOrderIdsByKey: Record<string, string>;
  lensIdsByKey: Record<string, string>;
}

export async function seedDemo(options: {
  db: Database;
  passwords: PasswordHasher;
  report?: (message: string) => void;
  /** YYYY-MM-DD; defaults to today. */
  today?: string;
  /** Needed for the demo measurements (frames in object storage, analyses queued). */
  services?: Omit<DemoMeasurementDeps, 'db'>;
  /** Links in queued mail; defaults to the local web address. */
  publicBaseUrl?: string;
}): Promise<SeedDemoResult> {
  const context: SeedContext = {
    db: options.db,
    passwords: options.passwords,
    organisationIds: {},
    personIdsByEmail: {},
    today: options.today ?? todayIsoDate(),
    equipmentIdsByIdentifier: {},
    workOrderIdsByKey: {},
    lensIdsByKey: {},
    services: options.services,
    publicBaseUrl: options.publicBaseUrl ?? 'http://localhost:8080',
    report: options.report ?? (() => undefined),
  };
  for (const step of demoSeedSteps) await step.run(context);
  return {
    organisationIds: context.organisationIds,
    personIdsByEmail: context.personIdsByEmail,
    equipmentIdsByIdentifier: context.equipmentIdsByIdentifier,
    workOrderIdsByKey: context.workOrderIdsByKey,
    lensIdsByKey: context.lensIdsByKey,
  };
}

/** The lines `npm start` prints so people can try every role. */
export function demoSignInLines(): string[] {
  return [
    'Demo sign-ins (demo only: invented people, not for real use):',
    ...demoPeople.map((p) => `  ${p.roles.join('+').padEnd(11)} ${p.email.padEnd(30)} ${p.password}`),
  ];
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const env = parseEnv();
  const { pool, db } = createDatabase({ databaseUrl: env.DATABASE_URL, maxConnections: 5 });
  const storage = createObjectStorage(env);
  seedDemo({
    db,
    passwords: createPasswordHasher({ rounds: env.PASSWORD_HASH_ROUNDS }),
    report: (m) => console.error(m),
    services: { pool, storage, log: createLogger({ level: 'warn', name: 'seed' }) },
  })
    .then(() => console.error(demoSignInLines().join('\n')))
    .finally(() => {
      storage.close();
      return pool.end();
    })
    .catch((error: Error) => {
      console.error(`Seeding failed: ${error.message}`);
      process.exitCode = 1;
    });
}
