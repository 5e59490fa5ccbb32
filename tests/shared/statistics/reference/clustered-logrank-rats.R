# Reference values for tests/shared/statistics/battery-life.test.ts.
# Run: Rscript tests/shared/statistics/reference/clustered-logrank-rats.R
# Data: survival::rats (Mantel, Bohidar & Ciminera, Cancer Research 1977;37:3863–3868),
# the female rats: litter = cluster, rx = treated, time = weeks to tumour, status = tumour seen.
library(survival)
f <- subset(rats, sex == "f")
cat("litter <- c(", paste(f$litter, collapse = ","), ")\n")
cat("rx <- c(", paste(f$rx, collapse = ","), ")\n")
cat("time <- c(", paste(f$time, collapse = ","), ")\n")
cat("status <- c(", paste(f$status, collapse = ","), ")\n")
fit <- coxph(Surv(time, status) ~ rx + cluster(litter), data = f, ties = "breslow")
u <- residuals(coxph(Surv(time, status) ~ rx, data = f, ties = "breslow", init = 0, iter.max = 0), type = "score")
cat(sprintf("score %.10f\n", sum(u)))
cat(sprintf("robust variance %.10f\n", sum(tapply(u, f$litter, sum)^2)))
cat(sprintf("robust score chi-square %.10f p %.10g\n", summary(fit)$robscore["test"], summary(fit)$robscore["pvalue"]))
# Holm (R's p.adjust)
cat("holm", p.adjust(c(0.01, 0.04, 0.03, 0.005), "holm"), "\n")
cat("holm", p.adjust(c(0.2, 0.5), "holm"), "\n")
