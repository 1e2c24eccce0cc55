/** Version of Ballast's risk engine, stored with every run so a figure can be traced to the code that made it. */
export const ENGINE_VERSION = "1.0.0";
