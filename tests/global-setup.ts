// Filled in by the e2e setup: builds the client once when the browser tests need it.
export default async function setup() {}
