// autocannon ships no types; the bench uses only its promise form.
declare module 'autocannon' {
  const autocannon: (options: { url: string; connections?: number; duration?: number; headers?: Record<string, string> }) => Promise<unknown>;
  export default autocannon;
}
