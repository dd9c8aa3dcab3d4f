/** history_request: tail, range and glob search over this process's executions (see ../history.ts). */
import type { HistoryQuery } from '../history';
import { invalidRequest, type Handler } from './context';

const integer = (value: unknown): number | undefined => (typeof value === 'number' && Number.isInteger(value) ? value : undefined);

export const history: Handler = async (ctx) => {
  const c = ctx.request.content;
  const accessType = c.hist_access_type;
  if (accessType !== 'tail' && accessType !== 'range' && accessType !== 'search') {
    await ctx.reply('history_reply', { ...invalidRequest('hist_access_type', '"tail", "range" or "search"', accessType), history: [] });
    return;
  }
  const query: HistoryQuery = { accessType, output: c.output === true };
  const n = integer(c.n);
  if (n !== undefined) query.n = n;
  const session = integer(c.session);
  if (session !== undefined) query.session = session;
  const start = integer(c.start);
  if (start !== undefined) query.start = start;
  const stop = integer(c.stop);
  if (stop !== undefined) query.stop = stop;
  if (typeof c.pattern === 'string') query.pattern = c.pattern;
  if (c.unique === true) query.unique = true;
  await ctx.reply('history_reply', { status: 'ok', history: ctx.state.history.query(query) });
};
