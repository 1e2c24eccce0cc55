/** A fresh demo database with the demo price history and positions loaded, and optionally the seeded method. */
import { demoDatabase } from "../helpers/demo-world";

export const methodDatabase = demoDatabase;

export const NORTHMOOR = {
  analyst: "priya.castell@northmoor.example",
  head: "helen.marsh@northmoor.example",
  officer: "tomas.reyne@northmoor.example",
  auditor: "oskar.lind@northmoor.example",
  analystOfficer: "nia.dorrance@northmoor.example",
};
export const PELLAM = { analyst: "june.okafor@pellam.example", head: "rafe.pellam@pellam.example" };
