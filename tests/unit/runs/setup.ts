/** A fresh demo database with the demo price history and positions, and (when asked) the approved demo method. */
import { actorFor } from "../helpers/db";
import { demoDatabase, demoPeriodId, demoWorldAs } from "../helpers/demo-world";
import { seedDemoMethod } from "@/db/seed-method";

export const PEOPLE = {
  analyst: "priya.castell@northmoor.example",
  officer: "tomas.reyne@northmoor.example",
  auditor: "oskar.lind@northmoor.example",
  pellamAnalyst: "june.okafor@pellam.example",
};

export const runsDatabase = demoDatabase;

export { seedDemoMethod };

export { actorFor, demoPeriodId, demoWorldAs };
