/**
 * The caution shown, word for word, wherever Mullion reports a finding on smoke/CO coverage or
 * device life (product.md, "Rules the product enforces").
 */
export const LIFE_SAFETY_CAUTION = 'Local codes and the authority having jurisdiction decide what is required. Installing and servicing life-safety devices is work for licensed practitioners where the law requires it.';
