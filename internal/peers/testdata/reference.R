# Reference values for internal/peers, written by R 4.2.2 (Debian
# r-base-core) with the cluster package 2.1.4 (r-cran-cluster).
# Run from this folder: Rscript reference.R
# Data: Fisher's Iris (R datasets::iris; Fisher 1936, Anderson 1935) and
# McNeil's USArrests (R datasets::USArrests; McNeil 1977, 1973 arrest
# statistics by US state), both written out here with full precision.
library(cluster)
write.csv(iris[, 1:4], "iris.csv", row.names = FALSE)
write.csv(data.frame(state = rownames(USArrests), USArrests), "usarrests.csv", row.names = FALSE)

out <- data.frame(check = character(), value = numeric())
add <- function(check, value) out <<- rbind(out, data.frame(check = check, value = value))

# k-means on the four raw Iris measurements, best of 50 starts
set.seed(1)
for (k in 2:4) {
  km <- kmeans(iris[, 1:4], centers = k, nstart = 50, iter.max = 100)
  add(sprintf("iris_kmeans_k%d_withinss", k), km$tot.withinss)
  s <- sort(km$size, decreasing = TRUE)
  for (i in seq_along(s)) add(sprintf("iris_kmeans_k%d_size%d", k, i), s[i])
  add(sprintf("iris_kmeans_k%d_silhouette", k), mean(silhouette(km$cluster, dist(iris[, 1:4]))[, "sil_width"]))
}

# silhouette of a fixed labelling (R's k = 3 solution), written with it
set.seed(1)
km3 <- kmeans(iris[, 1:4], centers = 3, nstart = 50)
write.csv(data.frame(label = km3$cluster), "iris_k3_labels.csv", row.names = FALSE)
sil <- silhouette(km3$cluster, dist(iris[, 1:4]))
add("iris_k3_silhouette_mean", mean(sil[, "sil_width"]))
for (c in 1:3) add(sprintf("iris_k3_silhouette_cluster%d", c), mean(sil[sil[, "cluster"] == c, "sil_width"]))
for (i in c(1, 51, 78, 101, 150)) add(sprintf("iris_k3_silhouette_row%d", i), sil[i, "sil_width"])

# principal components of USArrests, standardised (prcomp(scale. = TRUE))
pc <- prcomp(USArrests, scale. = TRUE)
for (c in 1:4) add(sprintf("usarrests_pc%d_sdev", c), pc$sdev[c])
ev <- pc$sdev^2 / sum(pc$sdev^2)
for (c in 1:4) add(sprintf("usarrests_pc%d_explained", c), ev[c])
for (c in 1:2) for (j in 1:4) add(sprintf("usarrests_pc%d_loading%d_abs", c, j), abs(pc$rotation[j, c]))

# Ward's method on the standardised USArrests, every merge height
hc <- hclust(dist(scale(USArrests)), method = "ward.D2")
for (i in seq_along(hc$height)) add(sprintf("usarrests_ward_height%02d", i), hc$height[i])
for (k in c(2, 4)) {
  s <- sort(table(cutree(hc, k)), decreasing = TRUE)
  for (i in seq_along(s)) add(sprintf("usarrests_ward_k%d_size%d", k, i), s[[i]])
}

write.csv(out, "reference_r.csv", row.names = FALSE)
