import { describe, expect, it } from 'vitest';
import { NewPasswordSchema } from '#shared/schemas/accounts.ts';
import { checkPasswordPolicy } from './password-policy.ts';
import { addressThrottleKey } from './request-meta.ts';

const codes = (password: string, context = {}) => checkPasswordPolicy(password, context).map((e) => e.code);

describe('new password rules (NIST SP 800-63B-4 §3.1.1.2)', () => {
  it('when a password has fewer than 15 characters, counting code points, then the shared schema refuses it', () => {
    expect(NewPasswordSchema.safeParse('fourteen chars').success).toBe(false); // 14
    expect(NewPasswordSchema.safeParse('fifteen chars!!').success).toBe(true); // 15
    // 8 emoji are 16 UTF-16 units but only 8 characters as NIST counts them.
    expect(NewPasswordSchema.safeParse('🔋⚡🔋⚡🔋⚡🔋⚡').success).toBe(false);
  });

  it('when a password is long, has spaces or non-ASCII letters and no digits or symbols, then it is accepted (no composition rules)', () => {
    expect(NewPasswordSchema.safeParse('x'.repeat(64)).success).toBe(true);
    expect(codes('granite kettle orbit lantern')).toEqual([]);
    expect(codes('überfluss der zaunkönige')).toEqual([]);
  });

  it('when a password is on the shipped breach list, in any letter case, then it is refused as common', () => {
    // All three appear in the list generated from @zxcvbn-ts/language-common 4.1.3 "passwords-common".
    expect(codes('passwordpassword')).toEqual(['password_common']);
    expect(codes('1qaz2wsx3edc4rfv')).toEqual(['password_common']);
    expect(codes('QwertyUiop12345')).toEqual(['password_common']);
  });

  it('when a common password is padded with digits or symbols, then it is still refused', () => {
    expect(codes('dragon!!!!!!!!!2024')).toEqual(['password_common']);
    expect(codes('2024!!sunshine!!')).toEqual(['password_common']);
  });

  it('when a password repeats a short unit or uses few characters, then it is refused', () => {
    expect(codes('abcabcabcabcabc')).toEqual(['password_repetitive']);
    expect(codes('zzzzzzzzzzzzzzzzzz')).toEqual(['password_repetitive']);
    expect(codes('abababababababab1')).toEqual(['password_repetitive']);
  });

  it('when a password is a run of consecutive characters, then it is refused', () => {
    expect(codes('1234567890123456')).not.toEqual([]);
    expect(codes('abcdefghijklmnopq')).toEqual(['password_sequential']);
    expect(codes('9876543210987654')).not.toEqual([]);
  });

  it('when a password is the e-mail address, the name or the service name with decoration, then it is refused', () => {
    expect(codes('ada.quill@volt.example', { email: 'ada.quill@volt.example' })).toEqual(['password_context']);
    expect(codes('ada.quill!!!2025', { email: 'ada.quill@volt.example' })).toEqual(['password_context']);
    expect(codes('Ada Quill 1234567', { name: 'Ada Quill' })).toEqual(['password_context']);
    expect(codes('ohmstead2025!!!!')).toEqual(['password_context']);
  });
});

describe('throttling keys for addresses', () => {
  it('when addresses are IPv4, then each is its own key; when IPv6, then the /56 prefix is the key', () => {
    expect(addressThrottleKey('203.0.113.9')).toBe('203.0.113.9');
    expect(addressThrottleKey('2001:db8:aa:bb01::5')).toBe(addressThrottleKey('2001:db8:aa:bbff:1:2:3:4'));
    expect(addressThrottleKey('2001:db8:aa:bb01::5')).not.toBe(addressThrottleKey('2001:db8:aa:cc01::5'));
    expect(addressThrottleKey('::1')).toBe('0000:0000:0000:0000::/56');
  });
});
