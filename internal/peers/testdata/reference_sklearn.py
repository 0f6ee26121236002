# Reference values for internal/peers from scikit-learn 1.2.1 (Debian
# python3-sklearn). Run from this folder: /usr/bin/python3 reference_sklearn.py
import csv
import numpy as np
from sklearn.cluster import KMeans
from sklearn.metrics import silhouette_samples, silhouette_score
from sklearn.decomposition import PCA

x = np.loadtxt("iris.csv", delimiter=",", skiprows=1)
labels = np.loadtxt("iris_k3_labels.csv", skiprows=1).astype(int)
rows = []
for k in (2, 3, 4):
    km = KMeans(n_clusters=k, n_init=25, random_state=11).fit(x)
    rows.append((f"iris_kmeans_k{k}_inertia", km.inertia_))
s = silhouette_samples(x, labels)
rows.append(("iris_k3_silhouette_mean", silhouette_score(x, labels)))
for i in (1, 51, 78, 101, 150):
    rows.append((f"iris_k3_silhouette_row{i}", s[i - 1]))
u = np.genfromtxt("usarrests.csv", delimiter=",", skip_header=1, usecols=(1, 2, 3, 4))
z = (u - u.mean(axis=0)) / u.std(axis=0, ddof=1)
p = PCA().fit(z)
for c in range(4):
    rows.append((f"usarrests_pc{c+1}_explained", p.explained_variance_ratio_[c]))
    rows.append((f"usarrests_pc{c+1}_sdev", np.sqrt(p.explained_variance_[c])))
with open("reference_sklearn.csv", "w", newline="") as f:
    w = csv.writer(f)
    w.writerow(["check", "value"])
    for r in rows:
        w.writerow([r[0], repr(float(r[1]))])
