# Reference values for tests/shared/statistics/survival.test.ts.
# Needs Debian's r-base-core, r-cran-survival and r-cran-mass (the tests do not).
# Run: Rscript tests/shared/statistics/reference/survival-gehan.R
suppressMessages({ library(survival); library(MASS) })
options(digits = 12, width = 200)
data(gehan)
cat("6-MP times:   ", paste0(gehan$time[gehan$treat == "6-MP"], ifelse(gehan$cens[gehan$treat == "6-MP"] == 1, "", "+")), "\n")
cat("control times:", paste0(gehan$time[gehan$treat == "control"], ifelse(gehan$cens[gehan$treat == "control"] == 1, "", "+")), "\n")

fit <- survfit(Surv(time, cens) ~ treat, data = gehan, conf.type = "log-log")
print(summary(fit)$table[, c("records", "events", "median", "0.95LCL", "0.95UCL")])
s <- summary(fit)
print(data.frame(strata = s$strata, time = s$time, n.risk = s$n.risk, n.event = s$n.event,
                 surv = s$surv, lower = s$lower, upper = s$upper))

d <- survdiff(Surv(time, cens) ~ treat, data = gehan)
cat("observed:", d$obs, "\nexpected:", d$exp, "\nchisq:", d$chisq, "\np:", 1 - pchisq(d$chisq, 1), "\n")
