// Placeholder until the review loop lands: keeps the build page's layout stable.
export function ReviewThread(_props: { buildId: number; projectId: number; permissions: { review: boolean; comment: boolean }; status: string }) {
  return null;
}
