/**
 * What became of the last action on a screen: a note (announced politely, role "status") and an
 * error (announced at once, role "alert"); each shown only when there is one.
 */
export function StatusLines({ note, error }: { note?: string | null; error?: string | null }) {
  return (
    <>
      {note && (
        <p className="note" role="status">
          {note}
        </p>
      )}
      {error && (
        <p className="error" role="alert">
          {error}
        </p>
      )}
    </>
  );
}
