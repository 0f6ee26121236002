# Independent reference values for the figures of the fixture in this
# folder, computed with R. Run from the repository root:
#   Rscript testdata/figures/fixture_check.R
# It writes testdata/figures/fixture_r.csv, keyed like the figures file.
# ZU01 is outside the ranked population (as the Go test sets it up), so it
# belongs only to the group with over: all.
# Ranks and percentiles are taken on the values as written: every value of
# the fixture has at most its indicator's declared decimals, so these are
# the ranks at the declared precision that the figures use.
dir <- "testdata/figures"
reg <- read.csv(file.path(dir, "register.csv"), stringsAsFactors = FALSE)
vals <- read.csv(file.path(dir, "values.csv"), stringsAsFactors = FALSE)
polarity <- c(fnci = "higher", students_per_academic = "lower", intl_share = "higher", size = "neutral")
ranked <- reg$id != "ZU01"
groups <- list(
  "Everyone" = reg$id[ranked],
  "Home sector" = reg$id[ranked & reg$country == "Kestria"],
  "Competitor systems: Orvanne" = reg$id[ranked & reg$country == "Orvanne"],
  "Outside the north" = reg$id[reg$region != "North"]
)
tracked <- c("KE02", "AL01", "OR03", "OR04")
years <- 2021:2025
out <- data.frame()
put <- function(section, group, ind, inst, year, measure, v) {
  if (is.na(v) || is.nan(v)) return(invisible())
  out <<- rbind(out, data.frame(section = section, group = group, indicator = ind,
                                institution = inst, year = year, measure = measure,
                                value = sprintf("%.17g", v)))
}
value_of <- function(id, ind, y) {
  v <- vals$value[vals$institution == id & vals$indicator == ind & vals$year == y]
  if (length(v) == 0) NA else v
}
for (g in names(groups)) {
  mem <- groups[[g]]
  for (ind in names(polarity)) {
    for (y in years) {
      x <- sapply(mem, value_of, ind = ind, y = y)
      xv <- x[!is.na(x)]
      n <- length(xv)
      put("distribution", g, ind, "", y, "n", n)
      put("distribution", g, ind, "", y, "missing", length(mem) - n)
      if (n == 0) next
      q <- quantile(xv, c(0.25, 0.5, 0.75), type = 7, names = FALSE)
      iqr <- q[3] - q[1]
      put("distribution", g, ind, "", y, "q1", q[1])
      put("distribution", g, ind, "", y, "median", q[2])
      put("distribution", g, ind, "", y, "q3", q[3])
      put("distribution", g, ind, "", y, "min", min(xv))
      put("distribution", g, ind, "", y, "max", max(xv))
      put("distribution", g, ind, "", y, "whisker_low", min(xv[xv >= q[1] - 1.5 * iqr]))
      put("distribution", g, ind, "", y, "whisker_high", max(xv[xv <= q[3] + 1.5 * iqr]))
      put("distribution", g, ind, "", y, "mean", mean(xv))
      if (n > 1) put("distribution", g, ind, "", y, "sd", sd(xv))
      for (id in tracked) {
        v <- value_of(id, ind, y)
        if (is.na(v)) next
        inside <- id %in% mem
        z <- if (inside) xv else c(xv, v)
        self <- if (inside) which(names(xv) == id) else length(z)
        better_first <- if (polarity[[ind]] == "lower") z else -z
        worse_first <- -better_first
        put("position", g, ind, id, y, "rank", rank(better_first, ties.method = "min")[self])
        put("position", g, ind, id, y, "of", length(z))
        put("position", g, ind, id, y, "percentile",
            100 * (rank(worse_first, ties.method = "average")[self] - 0.5) / length(z))
        if (n > 1) put("position", g, ind, id, y, "z", (v - mean(xv)) / sd(xv))
        # Signed differences, positive = better by polarity; neutral: plain
        # value - median and no better quartile. Ties: values equal to v
        # among z (itself included).
        pol <- polarity[[ind]]
        put("position", g, ind, id, y, "vs_median", if (pol == "lower") q[2] - v else v - q[2])
        if (pol == "higher") put("position", g, ind, id, y, "vs_better_quartile", v - q[3])
        if (pol == "lower") put("position", g, ind, id, y, "vs_better_quartile", q[1] - v)
        put("position", g, ind, id, y, "ties", sum(z == v))
      }
    }
  }
}
# Trend of the focus in Everyone: least-squares slope and compound growth.
for (ind in names(polarity)) {
  ys <- sapply(years, function(y) value_of("KE02", ind, y))
  ok <- !is.na(ys)
  put("trend", "Everyone", ind, "KE02", "", "slope", unname(coef(lm(ys[ok] ~ years[ok]))[2]))
  first <- ys[ok][1]; last <- ys[ok][sum(ok)]
  span <- years[ok][sum(ok)] - years[ok][1]
  put("trend", "Everyone", ind, "KE02", "", "change", last - first)
  put("trend", "Everyone", ind, "KE02", "", "cagr", 100 * ((last / first)^(1 / span) - 1))
}
# Rank and percentile change of every tracked institution in Home sector,
# from its first to its last year with a value (rank: ties share the best
# rank; percentile: 100 x (average rank in the worse-first order - 0.5) / n).
place <- function(g, ind, id, y) {
  mem <- groups[[g]]
  x <- sapply(mem, value_of, ind = ind, y = y)
  xv <- x[!is.na(x)]
  v <- value_of(id, ind, y)
  inside <- id %in% mem
  z <- if (inside) xv else c(xv, v)
  self <- if (inside) which(names(xv) == id) else length(z)
  better_first <- if (polarity[[ind]] == "lower") z else -z
  c(rank = unname(rank(better_first, ties.method = "min")[self]),
    pct = unname(100 * (rank(-better_first, ties.method = "average")[self] - 0.5) / length(z)))
}
for (id in tracked) for (ind in names(polarity)) {
  ys <- sapply(years, function(y) value_of(id, ind, y))
  ok <- which(!is.na(ys))
  if (length(ok) < 2) next
  a <- place("Home sector", ind, id, years[min(ok)])
  b <- place("Home sector", ind, id, years[max(ok)])
  put("trend", "Home sector", ind, id, "", "rank_change", a[["rank"]] - b[["rank"]])
  put("trend", "Home sector", ind, id, "", "percentile_change", b[["pct"]] - a[["pct"]])
}
# Correlations over Everyone in 2025, complete pairs.
inds <- names(polarity)
for (a in 1:(length(inds) - 1)) for (b in (a + 1):length(inds)) {
  x <- sapply(groups[["Everyone"]], value_of, ind = inds[a], y = 2025)
  y <- sapply(groups[["Everyone"]], value_of, ind = inds[b], y = 2025)
  ok <- !is.na(x) & !is.na(y)
  pair <- paste0(inds[a], "~", inds[b])
  put("correlation", "Everyone", pair, "", 2025, "n", sum(ok))
  put("correlation", "Everyone", pair, "", 2025, "pearson", cor(x[ok], y[ok]))
  put("correlation", "Everyone", pair, "", 2025, "spearman", cor(x[ok], y[ok], method = "spearman"))
}
writeLines(c(paste("# R version:", R.version.string),
             "# Produced by testdata/figures/fixture_check.R; do not edit by hand."),
           file.path(dir, "fixture_r.csv"))
suppressWarnings(write.table(out, file.path(dir, "fixture_r.csv"), append = TRUE, sep = ",",
                             row.names = FALSE, quote = TRUE))
# Nearest-profile peers of KE02 on fnci and students_per_academic in 2025:
# each indicator standardised by the ranked population's mean and sample SD,
# Euclidean distance, the four nearest (the focus excluded).
ids <- reg$id[ranked]
f <- sapply(ids, value_of, ind = "fnci", y = 2025)
s <- sapply(ids, value_of, ind = "students_per_academic", y = 2025)
zf <- (f - mean(f, na.rm = TRUE)) / sd(f, na.rm = TRUE)
zs <- (s - mean(s, na.rm = TRUE)) / sd(s, na.rm = TRUE)
dist <- sqrt((zf - zf["KE02"])^2 + (zs - zs["KE02"])^2)
dist <- dist[!is.na(dist) & names(dist) != "KE02"]
dist <- sort(dist)[1:4]
extra <- data.frame(section = "group", group = "Profile peers", indicator = "",
                    institution = names(dist), year = "", measure = "distance",
                    value = sprintf("%.17g", dist))
suppressWarnings(write.table(extra, file.path(dir, "fixture_r.csv"), append = TRUE, sep = ",",
                             row.names = FALSE, col.names = FALSE, quote = TRUE))
