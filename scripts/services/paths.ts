import path from 'node:path';
import { projectRoot } from '../../server/project-root';

export { projectRoot };

/** Where `npm start` keeps its data; git-ignored. */
export const dataRoot = path.join(projectRoot, '.data');

export interface ServiceFolders {
  root: string;
  postgresData: string;
  /** Holds PostgreSQL's socket and its log (owned by the postgres user). */
  postgresRun: string;
  objectStore: string;
  mailStore: string;
}

export function serviceFolders(root: string): ServiceFolders {
  return {
    root,
    postgresData: path.join(root, 'pg'),
    postgresRun: path.join(root, 'pg-run'),
    objectStore: path.join(root, 's3'),
    mailStore: path.join(root, 'mail'),
  };
}
