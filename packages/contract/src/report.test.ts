import { describe, expect, it } from 'vitest';
import { verificationReadings } from './report';

const r = (
  id: string,
  phase: 'diagnosis' | 'verification',
  createdAt: string,
  supersededBy: string | null = null,
  struck: { reason: string } | null = null,
) => ({
  id,
  phase,
  createdAt,
  supersededBy,
  struck,
});

describe('verificationReadings', () => {
  const repairAt = '2026-03-02T10:00:00.000Z';
  const all = [
    r('before-repair', 'verification', '2026-03-02T09:00:00.000Z'),
    r('diagnosis', 'diagnosis', '2026-03-02T10:05:00.000Z'),
    r('typo', 'verification', '2026-03-02T10:06:00.000Z', 'fix'),
    r('fix', 'verification', '2026-03-02T10:07:00.000Z'),
    r('struck', 'verification', '2026-03-02T10:08:00.000Z', null, { reason: 'probe slipped off TP2' }),
  ];

  it('keeps verification readings taken after the last repair action that nobody corrected or struck out', () => {
    expect(verificationReadings(all, repairAt).map((x) => x.id)).toEqual(['fix']);
  });

  it('has none before any repair action is recorded', () => {
    expect(verificationReadings(all, null)).toEqual([]);
  });
});
