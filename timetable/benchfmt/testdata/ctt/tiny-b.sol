alg big 0 0
alg big 0 0
geo small 0 0
his small 1 1
