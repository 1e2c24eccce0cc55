/** Value-at-risk and expected shortfall: parametric, historical, filtered historical, scaling, stressed search. */
export * from "./distributions";
export * from "./filtered";
export * from "./historical";
export * from "./parametric";
export * from "./scaling";
export * from "./stressed";
