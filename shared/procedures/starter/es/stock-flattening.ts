import type { Translations } from '../../translation'
import { protectiveGear, stayWithMachine, spindleStopped, homingClear, sharpEdges, cutterRating, finalSignoff } from './common-steps'

export const stockFlattening: Translations = {
  es: {
    title: 'Aplanar un tablón o un panel encolado',
    summary: 'Planear por las dos caras un tablón, un panel encolado o una tabla abarquillada con la fresa de planeado. Incluye sujetar la pieza, poner el cero en el punto más alto, planificar y darle la vuelta.',
    steps: {
      'protective-gear': protectiveGear,
      'inspect-stock': {
        title: 'Revisa la pieza',
        body: 'Busca clavos, tornillos, grapas, arenilla y nudos sueltos. Quita el metal o marca la zona que hay que evitar. Encuentra los puntos altos con una regla.',
        guidance: 'La madera recuperada y la de canto vivo esconden metal a menudo. Una fresa que se encuentra un clavo puede perder una plaquita o romperse.',
      },
      'stock-height': {
        title: 'Mide la pieza en su punto más grueso',
        body: 'Mide la pieza en su punto más grueso. Apunta la lectura para que el plan empiece por encima.',
        guidance: 'El punto más alto marca dónde empieza la primera pasada. La máquina necesita recorrido en Z suficiente para pasarlo con la fresa puesta.',
        label: 'Punto más grueso de la pieza',
      },
      'hold-down': {
        title: 'Sujeta la pieza para que no se pueda mover',
        body: 'La fresa agarra una pieza que cojea o resbala. Calza cualquier esquina que cojee y sujeta la pieza firme con sargentos o tornillos.',
        guidance: 'Calza por debajo una pieza abarquillada o revirada para que asiente sin cojear. Si no, los sargentos la aplanan y vuelve a su forma después del planeado.',
        hazard: 'Una pieza que se suelta puede salir lanzada por la fresa con fuerza bastante para herir gravemente a alguien.',
        avoid: 'Calza la pieza para que no cojee. Sujétala con sargentos o tornillos en varios puntos. Deja los sargentos bajos y fuera del camino de la fresa.',
      },
      'clamps-clear': {
        title: 'Deja los sargentos fuera del camino de la fresa',
        body: 'El planeado barre toda la zona más un sobrante. Cada sargento tiene que quedar fuera de esa zona y por debajo de la fresa en su pasada más baja.',
        guidance: 'Imagina el rectángulo entero del plan más el radio de la fresa por cada lado. Mueve los sargentos que queden dentro.',
        hazard: 'Una fresa que golpea un sargento puede reventar y lanzar trozos de metal por el taller, hiriendo gravemente a quien esté en su camino.',
        avoid: 'Pon los sargentos fuera de la zona planificada y de su sobrante. Comprueba su altura frente a la pasada más honda. Vuelve a comprobarlo en la vista previa.',
      },
      'homing-clear': homingClear,
      'home': {
        title: 'Haz el homing de la máquina',
        body: 'Lanza el ciclo de homing. Espera a que todos los ejes indiquen que están en casa.',
        guidance: 'El homing le da a la máquina una posición conocida para poder comprobar el plan contra su recorrido.',
      },
      'spindle-stopped': spindleStopped,
      'sharp-edges': sharpEdges,
      'fit-surfacing-cutter': {
        title: 'Pon la fresa de planeado',
        body: 'Limpia la pinza, la tuerca y el cono del husillo. Pon la fresa de planeado con el vástago bien metido en la pinza. Aprieta con las dos llaves y quítalas del husillo.',
        guidance: 'Una fresa grande carga la pinza más que casi cualquier otra. Una pinza limpia y bien apretada la mantiene centrada.',
      },
      'xy-zero': {
        title: 'Pon el cero de pieza en X e Y',
        body: 'Deja el husillo apagado. Lleva la fresa con el jog sobre la esquina de la pieza que usas como origen. Pon ahí el cero de pieza en X e Y.',
        guidance: 'El plan añade un sobrante alrededor de la pieza. El origen solo tiene que quedar cerca, no exacto.',
      },
      'z-zero': {
        title: 'Pon el cero de Z en el punto más alto',
        body: 'Deja el husillo apagado mientras tengas los dedos cerca de la fresa. Lleva la fresa sobre el punto más alto. Mete un papel debajo. Baja con el jog en pasos de 1 mm, 0,1 mm y 0,01 mm hasta que el papel quede pisado. Pon Z al espesor del papel.',
        guidance: 'Con el cero en el punto más alto, la primera pasada solo lo roza. Un papel de oficina normal de 80 g/m² tiene unos 0,1 mm de espesor.',
      },
      'plan': {
        title: 'Planifica las pasadas de aplanado',
        body: 'Abre el planificador. Mete el tamaño de la pieza con un sobrante, la fresa, el paso lateral, la profundidad por pasada, la profundidad total y el avance. Adjunta el plan y carga su programa.',
        guidance: 'En madera dura da pasadas finas. La profundidad total tiene que llegar al punto más bajo que quieras limpiar.',
      },
      'preview-check': {
        title: 'Revisa la vista previa',
        body: 'Comprueba que la trayectoria cubre la pieza con sobrante por todos los lados. Comprueba que ningún sargento queda dentro de la trayectoria. Comprueba que la pasada más honda queda por encima de la tabla de sacrificio.',
        guidance: 'Una pasada más honda que el fondo de la pieza corta la tabla de sacrificio.',
      },
      'cutter-rating': cutterRating,
      'start-extraction': {
        title: 'Arranca la aspiración, el enfriador y el husillo',
        body: 'Pon la campana de aspiración y arranca el colector de polvo. Arranca el enfriador si el husillo es refrigerado por agua y comprueba que el refrigerante circula. Arranca el husillo.',
        guidance: 'Comprueba la aspiración en la campana antes de la primera pasada.',
      },
      'stay-with-machine': stayWithMachine,
      'run-first-face': {
        title: 'Planea la primera cara',
        body: 'Ejecuta el programa. Vigila de cerca la primera pasada. Para si la pieza se mueve, la fresa se clava o cambia el ruido.',
        guidance: 'Escucha el cambio de tono cuando la fresa llega a los puntos altos. Eso es normal. Un golpe o una vibración no lo son.',
      },
      'flip-stock': {
        title: 'Dale la vuelta a la pieza y planea la segunda cara',
        body: 'Para el husillo. Suelta la pieza, dale la vuelta y sujétala plana sobre la cara planeada. Pon el cero de Z en la nueva cara de arriba y vuelve a ejecutar el programa.',
        guidance: 'Con la cara plana abajo la pieza ya no cojea, así que no necesita calzos. Comprueba que los sargentos siguen fuera de la trayectoria.',
      },
      'final-thickness': {
        title: 'Mide el espesor final',
        body: 'Mide el espesor en varios puntos. Apunta la lectura más pequeña.',
        guidance: 'Lecturas que se diferencian en más de unas décimas de milímetro quieren decir que una cara no está planeada del todo.',
        label: 'Espesor final, lectura más pequeña',
      },
      'photo-stock': {
        title: 'Fotografía la pieza aplanada',
        body: 'Haz una foto de la pieza planeada desde arriba.',
        guidance: 'La foto va con el registro del trabajo.',
        subject: 'La pieza aplanada vista desde arriba.',
      },
      'clean-up': {
        title: 'Limpia',
        body: 'Para el husillo, el enfriador y el colector de polvo. Aspira la mesa. No soples el polvo con aire comprimido.',
        guidance: 'El aire comprimido vuelve a meter el polvo fino en el aire que respiras.',
      },
      'final-signoff': finalSignoff('Las dos caras están planas, la pieza estuvo bien sujeta todo el tiempo y la máquina está limpia.'),
    },
  },
}
