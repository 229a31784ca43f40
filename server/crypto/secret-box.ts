/**
 * Encryption at rest for small secrets (verbal passcodes): AES-256-GCM with a key derived
 * from DATA_ENCRYPTION_KEY. Stored as `v1.<iv>.<tag>.<ciphertext>` (base64url), so the key
 * or algorithm can change later without breaking stored values.
 */
import crypto from 'node:crypto';

export interface SecretBox {
  seal(plaintext: string): string;
  open(sealed: string): string;
}

export function createSecretBox(keyMaterial: string): SecretBox {
  const key = crypto.scryptSync(keyMaterial, 'mullion-secret-box-v1', 32);
  return {
    seal(plaintext) {
      const iv = crypto.randomBytes(12);
      const cipher = crypto.createCipheriv('aes-256-gcm', key, iv);
      const body = Buffer.concat([cipher.update(plaintext, 'utf8'), cipher.final()]);
      return ['v1', iv.toString('base64url'), cipher.getAuthTag().toString('base64url'), body.toString('base64url')].join('.');
    },
    open(sealed) {
      const [version, iv, tag, body] = sealed.split('.');
      if (version !== 'v1' || !iv || !tag || body === undefined) throw new Error('Unknown sealed format.');
      const decipher = crypto.createDecipheriv('aes-256-gcm', key, Buffer.from(iv, 'base64url'));
      decipher.setAuthTag(Buffer.from(tag, 'base64url'));
      return Buffer.concat([decipher.update(Buffer.from(body, 'base64url')), decipher.final()]).toString('utf8');
    },
  };
}
