import { AuditEvent } from './audit-event.entity';
import { LibraryAlias } from './library-alias.entity';
import { LibraryMachine } from './library-machine.entity';
import { LibraryNozzle } from './library-nozzle.entity';
import { LibraryPackage } from './library-package.entity';
import { LibraryProposal } from './library-proposal.entity';
import { LibraryRevision } from './library-revision.entity';
import { LibraryUnmatchedFootprint } from './library-unmatched.entity';
import { LibraryVisionPreset } from './library-vision-preset.entity';
import { MailMessage } from './mail-message.entity';
import { ApiToken, ProblemReport, Program, ProgramRevision, ReleaseFile, RevisionComment, RevisionWaiver } from './program.entity';
import { RevisionContributor } from './revision-contributor.entity';
import { User } from './user.entity';

export {
  ApiToken,
  AuditEvent,
  LibraryAlias,
  LibraryMachine,
  LibraryNozzle,
  LibraryPackage,
  LibraryProposal,
  LibraryRevision,
  LibraryUnmatchedFootprint,
  LibraryVisionPreset,
  MailMessage,
  ProblemReport,
  Program,
  ProgramRevision,
  ReleaseFile,
  RevisionComment,
  RevisionContributor,
  RevisionWaiver,
  User,
};

/** Every entity, listed explicitly (no globs: vitest and tsx load .ts files differently). */
export const entities = [
  // platform
  User,
  AuditEvent,
  MailMessage,
  // package library
  LibraryPackage,
  LibraryAlias,
  LibraryNozzle,
  LibraryVisionPreset,
  LibraryMachine,
  LibraryRevision,
  LibraryProposal,
  LibraryUnmatchedFootprint,
  // programs, revisions and run files
  Program,
  ProgramRevision,
  RevisionWaiver,
  RevisionComment,
  RevisionContributor,
  ReleaseFile,
  ApiToken,
  ProblemReport,
];
