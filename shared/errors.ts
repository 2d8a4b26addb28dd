/** The one error shape every API route answers with. */
export type ApiErrorBody = {
  error: {
    code: string;
    message: string;
    /** Field path (dot-joined) to the message that says what to fix. */
    fields?: Record<string, string>;
  };
};

export function isApiErrorBody(value: unknown): value is ApiErrorBody {
  if (typeof value !== 'object' || value === null || !('error' in value)) return false;
  const error = (value as { error: unknown }).error;
  return typeof error === 'object' && error !== null && 'message' in error && 'code' in error;
}
