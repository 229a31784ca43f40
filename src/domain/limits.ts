/** Field limits shared by forms, API schemas and the database. */
export const LIMITS = {
  nameMax: 120,
  firmNameMax: 120,
  emailMax: 254,
  passwordMin: 10,
  passwordMax: 200,
  shortNameMin: 3,
  shortNameMax: 40,
  licenceMax: 60,
  phoneMax: 40,
  reasonMax: 500,
  pageSizeMax: 100,
  pageSizeDefault: 25,
  logoMaxBytes: 1024 * 1024,
  floorPlanMaxBytes: 5 * 1024 * 1024,
  logoTypes: ['image/png', 'image/jpeg', 'image/webp'] as readonly string[],
  /**
   * The most pixels (width × height, from the image's header) any uploaded image may have:
   * 40 megapixels, room for every phone and camera photo and any scanned plan we expect, while
   * a few-KB file claiming 16000 × 16000 pixels (a decompression bomb) is refused before it is
   * decoded. Our own choice, common practice; no published standard sets it.
   */
  imageMaxPixels: 40_000_000,
  invitationDays: 7,
  passwordResetMinutes: 60,
  /** how long the link that confirms a sign-up works */
  signUpConfirmationHours: 24,
} as const;
