/** Version of the calculation engine, stored with every result so a printed sheet can be traced. */
export const ENGINE_VERSION = '0.1.0'
