/** An error line under a filing form, read out when it appears. */
export function Alert({ message, testId }: { message: string | null | undefined; testId?: string }) {
  if (!message) return null;
  return (
    <p role="alert" data-testid={testId} className="rounded-md border border-alert/30 bg-alert-bg px-3 py-2 text-sm text-alert">
      {message}
    </p>
  );
}
