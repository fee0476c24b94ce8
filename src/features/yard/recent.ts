// The last pieces this tablet opened, newest first (kept on the device).
const KEY = 'cw-recent-pieces';

export function recentPieceIds(): string[] {
  try {
    const v: unknown = JSON.parse(localStorage.getItem(KEY) ?? '[]');
    return Array.isArray(v) ? v.filter((x): x is string => typeof x === 'string') : [];
  } catch {
    return [];
  }
}

export function rememberPiece(id: string): void {
  localStorage.setItem(KEY, JSON.stringify([id, ...recentPieceIds().filter((x) => x !== id)].slice(0, 8)));
}
