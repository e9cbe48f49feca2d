// Electronic signatures: the signer re-enters their password, which is
// checked against their better-auth credential account; the signature row
// records who signed, what it means, what was signed and when (UTC). The
// approval routes of records and reports call verifySignature inside their
// own transaction, so a failed check changes nothing.
import { QueryTypes, type Transaction } from 'sequelize';
import { verifyPassword } from 'better-auth/crypto';
import { getSequelize } from './db/sequelize';
import { HttpError } from './http';

export interface SignatureInput {
  userId: string;
  password: string;
  /** What the signature means, e.g. "approved for release". */
  meaning: string;
  /** e.g. "spectrum_version" or "report" (at most 24 characters). */
  subjectType: string;
  subjectId: number;
  /** SHA-256 (hex) of the signed content, when the caller has one. */
  contentDigest?: string | null;
}

export interface SignatureRow {
  id: number;
  signerId: string;
  signerName: string;
  meaning: string;
  subjectType: string;
  subjectId: number;
  contentDigest: string | null;
  signedAt: Date;
}

/** Re-verify the password and store the signature; wrong password → HttpError 403 `signature_failed`. */
export async function verifySignature(input: SignatureInput, transaction?: Transaction): Promise<SignatureRow> {
  const sequelize = getSequelize();
  if (!input.password) throw new HttpError(403, 'signature_failed', 'Re-enter your password to sign');
  if (!input.meaning?.trim()) throw new HttpError(400, 'invalid_input', 'meaning: a signature needs a stated meaning');
  const [acct] = await sequelize.query<{ password: string | null; name: string; active: number }>(
    "SELECT a.password, u.name, u.active FROM account a JOIN `user` u ON u.id = a.userId WHERE a.userId = ? AND a.providerId = 'credential' LIMIT 1",
    { replacements: [input.userId], type: QueryTypes.SELECT, transaction },
  );
  const ok = !!acct?.password && !!Number(acct.active) && (await verifyPassword({ hash: acct.password, password: input.password }));
  if (!ok) throw new HttpError(403, 'signature_failed', 'The password is not right; the signature was not recorded');
  // Millisecond precision, UTC: the connection's time zone is +00:00.
  const signedAt = new Date();
  const row = {
    signerId: input.userId,
    signerName: acct!.name,
    meaning: input.meaning.trim().slice(0, 255),
    subjectType: input.subjectType.slice(0, 24),
    subjectId: input.subjectId,
    contentDigest: input.contentDigest ?? null,
    signedAt,
  };
  const [id] = await sequelize.query(
    'INSERT INTO signature (signerId, signerName, meaning, subjectType, subjectId, contentDigest, signedAt) VALUES (?,?,?,?,?,?,?)',
    { replacements: [row.signerId, row.signerName, row.meaning, row.subjectType, row.subjectId, row.contentDigest, row.signedAt], type: QueryTypes.INSERT, transaction },
  );
  return { id: Number(id), ...row };
}
