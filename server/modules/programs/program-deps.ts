// What the programs module is given by the rest of the server.
import type { EntityManager } from 'typeorm';
import type { LibraryFile } from '../../../shared/schemas/library-file.schema';
import type { AuditService } from '../audit/audit.service';
import type { Mailer } from '../mail/mailer';
import type { UserService } from '../users/user.service';
import type { CheckPool } from './check-pool';

/** Where programs get the shared package library (the library module provides it). */
export interface LibrarySource {
  getLibraryFile(manager?: EntityManager): Promise<LibraryFile | null>;
  recordUnmatchedFootprints?(manager: EntityManager, programLabel: string, items: { footprint: string; count: number }[]): Promise<void>;
}

export interface ProgramDeps {
  audit: AuditService;
  mailer: Mailer;
  users: UserService;
  library: LibrarySource;
  checks: CheckPool;
  /** The web address people open, without a trailing slash: mails link to it. */
  publicUrl: string;
}
