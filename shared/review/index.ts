// Review rules shared by the server and the client (waivers); see waivers.ts.
export * from './waivers';
