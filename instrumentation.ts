// Runs once when the server starts: open the database (applying migrations), then seed the demo if asked.
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { getDb } = await import("./db/client");
  await getDb();
  if (process.env.PLOTPROOF_DEMO === "1") {
    const { seedDemo, demoCredentialsText } = await import("./lib/demo/seed");
    const result = await seedDemo();
    console.log(`[plotproof] demo data ${result === "created" ? "created" : "already present"}.`);
    console.log(demoCredentialsText());
  }
}
