import { AuditEvent } from './audit-event.entity';
import { MailMessage } from './mail-message.entity';
import { User } from './user.entity';

export { AuditEvent, MailMessage, User };

/** Every entity, listed explicitly (no globs: vitest and tsx load .ts files differently). */
export const entities = [User, AuditEvent, MailMessage];

// Package library (issue 4).
import { LibraryAlias } from './library-alias.entity';
import { LibraryMachine } from './library-machine.entity';
import { LibraryNozzle } from './library-nozzle.entity';
import { LibraryPackage } from './library-package.entity';
import { LibraryProposal } from './library-proposal.entity';
import { LibraryRevision } from './library-revision.entity';
import { LibraryUnmatchedFootprint } from './library-unmatched.entity';
import { LibraryVisionPreset } from './library-vision-preset.entity';
export { LibraryAlias, LibraryMachine, LibraryNozzle, LibraryPackage, LibraryProposal, LibraryRevision, LibraryUnmatchedFootprint, LibraryVisionPreset };
(entities as unknown[]).push(LibraryPackage, LibraryAlias, LibraryNozzle, LibraryVisionPreset, LibraryMachine, LibraryRevision, LibraryProposal, LibraryUnmatchedFootprint);
// Programs, revisions and run files (issue 7).
import { ApiToken, ProblemReport, Program, ProgramRevision, ReleaseFile, RevisionComment, RevisionWaiver } from './program.entity';
export { ApiToken, ProblemReport, Program, ProgramRevision, ReleaseFile, RevisionComment, RevisionWaiver };
(entities as unknown[]).push(Program, ProgramRevision, RevisionWaiver, RevisionComment, ReleaseFile, ApiToken, ProblemReport);
