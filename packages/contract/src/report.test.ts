import { describe, expect, it } from 'vitest';
import { verificationReadings } from './report';

const r = (id: string, phase: 'diagnosis' | 'verification', createdAt: string, supersededBy: string | null = null) => ({ id, phase, createdAt, supersededBy });

describe('verificationReadings', () => {
  const repairAt = '2026-03-02T10:00:00.000Z';
  const all = [
    r('before-repair', 'verification', '2026-03-02T09:00:00.000Z'),
    r('diagnosis', 'diagnosis', '2026-03-02T10:05:00.000Z'),
    r('typo', 'verification', '2026-03-02T10:06:00.000Z', 'fix'),
    r('fix', 'verification', '2026-03-02T10:07:00.000Z'),
  ];

  it('keeps uncorrected verification readings taken after the last repair action', () => {
    expect(verificationReadings(all, repairAt).map((x) => x.id)).toEqual(['fix']);
  });

  it('has none before any repair action is recorded', () => {
    expect(verificationReadings(all, null)).toEqual([]);
  });
});
