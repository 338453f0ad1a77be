/** The product's name as every screen and document title shows it. */
export const PRODUCT_NAME = 'Stringline'
