import { Token } from '@lumino/coreutils';
import type { NotebookLinks } from './links';

/** The per-notebook kernel links (comms, sample-state snapshots) shared by the renderer, panel and commands. */
export const INotebookLinks = new Token<NotebookLinks>('@multiplet/lab:INotebookLinks', 'Multiplet kernel links of the open notebooks');
export type INotebookLinks = NotebookLinks;
