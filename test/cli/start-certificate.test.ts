// `npm start` warns when the development certificate has expired or is about to (scripts/start.js).
// Certificates are made by office-addin-dev-certs' own generator, as `npm start` makes them.
import * as fs from "fs";
import * as os from "os";
import * as path from "path";

// eslint-disable-next-line @typescript-eslint/no-require-imports
const { certificateWarning, WARN_DAYS } = require("../../scripts/start.js");
// eslint-disable-next-line @typescript-eslint/no-require-imports
const { generateCertificates } = require("office-addin-dev-certs/lib/generate");

let dir: string;
let pem: Buffer;
beforeAll(async () => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), "fw-certs-"));
  await generateCertificates(path.join(dir, "ca.crt"), path.join(dir, "localhost.crt"), path.join(dir, "localhost.key"), 30);
  pem = fs.readFileSync(path.join(dir, "localhost.crt"));
});
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

const inDays = (d: number): Date => new Date(Date.now() + d * 86400000);

test("a fresh 30-day certificate gives no warning", () => {
  expect(certificateWarning(pem, new Date())).toBeNull();
});

test(`one that expires within ${WARN_DAYS} days gives a warning with the date and how to renew`, () => {
  const w = certificateWarning(pem, inDays(30 - 3));
  expect(w).toMatch(/expires on \d{4}-\d\d-\d\d \(in [34] days\)\. Delete \.certs\/ and run npm start again/);
});

test("an expired one says Excel will refuse to load the add-in, and how to renew", () => {
  expect(certificateWarning(pem, inDays(31))).toMatch(/expired on \d{4}-\d\d-\d\d: Excel and the browser will refuse to load the add-in\. Delete \.certs\//);
});

test("an unreadable certificate says so instead of crashing", () => {
  expect(certificateWarning(Buffer.from("not a certificate"))).toMatch(/cannot be read.*Delete \.certs\//);
});
