// A new password twice, with the length rule shown up front.
export const MIN_PASSWORD = 12;

export function passwordProblem(password: string, confirm: string): string | null {
  if (password.length < MIN_PASSWORD) return `Use at least ${MIN_PASSWORD} characters.`;
  if (password !== confirm) return 'The two passwords differ.';
  return null;
}

export default function PasswordFields(props: { password: string; confirm: string; onPassword: (v: string) => void; onConfirm: (v: string) => void }) {
  return (
    <>
      <div>
        <label className="label" htmlFor="new-password">New password</label>
        <input id="new-password" name="new-password" type="password" autoComplete="new-password" required className="field" value={props.password} onChange={(e) => props.onPassword(e.target.value)} />
        <p className="mt-1 text-xs text-muted">At least {MIN_PASSWORD} characters. A short sentence is easier to remember than symbols.</p>
      </div>
      <div>
        <label className="label" htmlFor="confirm-password">Repeat the password</label>
        <input id="confirm-password" name="confirm-password" type="password" autoComplete="new-password" required className="field" value={props.confirm} onChange={(e) => props.onConfirm(e.target.value)} />
      </div>
    </>
  );
}
