// /api/outgoing-mail (admins): the messages the local SMTP sink received, newest first.
import { Router } from 'express';
import { outgoingMailQuerySchema } from '../../shared/rules/api-schemas';
import { validate } from '../http/validate';
import { admins } from './access';
import { mailDirFromEnv, readOutgoingMail } from './outgoing-mail-reader';

/** `dir` overrides $PARALLAX_MAIL_DIR / $PARALLAX_DATA_DIR/mail (read at each request). */
export function outgoingMailRoutes(opts: { dir?: string } = {}): Router {
  const r = Router();
  r.get('/', admins, validate('query', outgoingMailQuerySchema), async (_req, res) => {
    res.json(await readOutgoingMail(opts.dir ?? mailDirFromEnv(), res.locals.query.limit));
  });
  return r;
}
