// The Cellwright mark and name, for the rail and the sign-in pages.
export function Logo() {
  return (
    <span className="flex items-center gap-2">
      <svg aria-hidden width="26" height="26" viewBox="0 0 32 32"><rect width="32" height="32" rx="6" fill="#2c3c63" /><path d="M7 9 C 12 9, 14 12, 16 16 S 21 23, 25 23" stroke="#c06a35" strokeWidth="3" fill="none" strokeLinecap="round" /><circle cx="16" cy="16" r="2.5" fill="#f6f4ef" /></svg>
      <span className="text-[15px] font-semibold tracking-tight text-white">Cellwright</span>
    </span>
  );
}
