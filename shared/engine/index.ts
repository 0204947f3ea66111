// The engine's front door (see ../README.md): everything outside shared/ runs revisions here.
export { runRevision, importForJob, selectSides, type RunRevisionInput, type RevisionRun, type SideSelection } from './run-revision';
