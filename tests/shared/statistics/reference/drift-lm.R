# Reference values for tests/shared/analysis/drift.test.ts: the slope of a ride's
# block differences on time, with its 95 % interval, from R's lm and confint.
# Needs Debian's r-base-core only. Run: Rscript tests/shared/statistics/reference/drift-lm.R
options(digits = 12)
hours <- c(0.0417, 0.125, 0.2083, 0.2917, 0.375, 0.4583, 0.5417, 0.625)
percent <- c(0.10, 0.31, 0.22, 0.58, 0.49, 0.80, 0.71, 1.02)
watts <- c(0.2, 0.7, 0.5, 1.3, 1.1, 1.8, 1.6, 2.3)
fit <- lm(percent ~ hours)
cat("slope:", coef(fit)[["hours"]], "\n")
cat("confint:", confint(fit, "hours", level = 0.95), "\n")
cat("watts slope:", coef(lm(watts ~ hours))[["hours"]], "\n")
