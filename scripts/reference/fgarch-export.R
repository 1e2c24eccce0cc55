# Reference values from R's fGarch (Debian package r-cran-fgarch) for Ballast's GARCH(1,1) tests.
# Writes the simulated series as fixture CSVs and the fGarch estimates as one JSON file.
# Run from the repository root:
#   Rscript scripts/reference/fgarch-export.R > tests/reference/fixtures/fgarch-reference.json
# Tests read the committed output; they never need R.
suppressPackageStartupMessages(library(fGarch))

fixtures <- "tests/reference/fixtures"
data(dem2gbp)
write.csv(dem2gbp, file.path(fixtures, "dem2gbp.csv"), row.names = FALSE, quote = FALSE)

# simulated GARCH(1,1) series in percent units, R's default generator with fixed seeds
simulate <- function(n, omega, alpha, beta, mu, draw, seed, burn = 500) {
  set.seed(seed)
  z <- draw(n + burn)
  x <- numeric(n + burn)
  h <- omega / (1 - alpha - beta)
  for (t in seq_len(n + burn)) {
    e <- sqrt(h) * z[t]
    x[t] <- mu + e
    h <- omega + alpha * e^2 + beta * h
  }
  x[(burn + 1):(n + burn)]
}
sim_normal <- simulate(2000, 0.02, 0.08, 0.90, 0.03, rnorm, 20240101)
# Student-t with 6 degrees of freedom scaled to unit variance, as fGarch's "std"
sim_t <- simulate(2000, 0.02, 0.10, 0.85, 0.0, function(n) rt(n, df = 6) * sqrt(4 / 6), 20240202)
write.csv(data.frame(r = sim_normal), file.path(fixtures, "garch-sim-normal.csv"), row.names = FALSE, quote = FALSE)
write.csv(data.frame(r = sim_t), file.path(fixtures, "garch-sim-t.csv"), row.names = FALSE, quote = FALSE)

num <- function(v) sprintf("%.12g", v)
fit_json <- function(name, file, x, dist, mean) {
  fit <- garchFit(~ garch(1, 1), data = x, include.mean = mean, cond.dist = dist, trace = FALSE)
  co <- coef(fit)
  se <- fit@fit$se.coef
  nm <- c(mu = "mu", omega = "omega", alpha1 = "alpha", beta1 = "beta", shape = "nu")
  pairs <- function(v) paste(sprintf('"%s": %s', nm[names(v)], num(v)), collapse = ", ")
  sprintf('  "%s": { "file": "%s", "distribution": "%s", "mean": "%s", "params": { %s }, "standardErrors": { %s }, "logLikelihood": %s }',
          name, file, ifelse(dist == "norm", "normal", "t"), ifelse(mean, "fit", "zero"),
          pairs(co), pairs(se), num(-fit@fit$llh))
}

entries <- c(
  fit_json("dem2gbp-normal", "dem2gbp.csv", dem2gbp[, 1], "norm", TRUE),
  fit_json("dem2gbp-t", "dem2gbp.csv", dem2gbp[, 1], "std", TRUE),
  fit_json("sim-normal", "garch-sim-normal.csv", sim_normal, "norm", TRUE),
  fit_json("sim-t", "garch-sim-t.csv", sim_t, "std", FALSE)
)
cat("{\n")
cat(sprintf('  "source": "R %s, fGarch %s (Debian r-cran-fgarch), garchFit(~garch(1,1)) with its defaults (init.rec = \\"mci\\", algorithm nlminb)",\n',
            paste(R.version$major, R.version$minor, sep = "."), packageVersion("fGarch")))
cat('  "command": "Rscript scripts/reference/fgarch-export.R > tests/reference/fixtures/fgarch-reference.json",\n')
cat(paste(entries, collapse = ",\n"))
cat("\n}\n")
