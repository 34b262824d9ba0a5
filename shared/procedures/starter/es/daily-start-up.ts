import type { Translations } from '../../translation'
import { protectiveGear, homingClear, finalSignoff } from './common-steps'

export const dailyStartUp: Translations = {
  es: {
    title: 'Arrancar la máquina al empezar el día',
    summary: 'Dar una vuelta a la máquina, revisar las paradas, la aspiración y el refrigerante, hacer el homing de los ejes y calentar el husillo antes del primer trabajo.',
    steps: {
      'walk-round': {
        title: 'Da una vuelta a la máquina',
        body: 'Busca herramientas, recortes y piezas sueltas en la mesa, el pórtico y las guías. Comprueba que los cables y las mangueras no están rozados ni enganchados. Comprueba que el suelo alrededor de la máquina está despejado.',
        guidance: 'Lo que se quedó en el pórtico por la noche cae a la zona de trabajo en cuanto se mueve.',
      },
      'estop-reachable': {
        title: 'Asegúrate de que llegas a la parada de emergencia',
        body: 'Comprueba que llegas a la parada de emergencia desde donde te pones para manejar la máquina. Nada puede taparla.',
        guidance: 'En una emergencia tienes uno o dos segundos. Si tienes que rodear un carro para llegar a la parada, está demasiado lejos.',
        hazard: 'Si no se llega en seguida a la parada de emergencia, la máquina no se puede parar a tiempo para evitar una lesión grave.',
        avoid: 'Quita lo que tape la parada de emergencia. No empieces a trabajar si está dañada o falta. Avisa al dueño.',
      },
      'protective-gear': protectiveGear,
      'extraction-check': {
        title: 'Revisa el colector de polvo',
        body: 'Comprueba que la bolsa o el cubo del colector está lleno menos de dos tercios. Comprueba que la manguera está conectada a la campana de aspiración y no está rajada.',
        guidance: 'Un colector lleno pierde casi toda la aspiración, y entonces el polvo fino se queda en el aire.',
      },
      'coolant-check': {
        title: 'Revisa el refrigerante si el husillo es refrigerado por agua',
        body: 'Comprueba el nivel de refrigerante del enfriador y enciéndelo. Confirma y sigue si el husillo es refrigerado por aire o es una fresadora de mano.',
        guidance: 'Mira que haya circulación en el tubo de retorno o en el indicador de caudal del enfriador.',
        hazard: 'Un husillo refrigerado por agua que trabaja sin refrigerante se recalienta y se puede estropear.',
        avoid: 'Rellena el refrigerante si está bajo. Enciende el enfriador y comprueba que el refrigerante circula antes de arrancar el husillo.',
      },
      'power-on': {
        title: 'Enciende la máquina',
        body: 'Enciende en el seccionador principal y luego el controlador. Mira la máquina mientras arranca. Nada puede moverse hasta que tú lo mandes.',
        guidance: 'Una máquina no debe moverse sola al dar la corriente. Si lo hace, apágala y avisa al dueño.',
      },
      'homing-clear': homingClear,
      'home': {
        title: 'Haz el homing de la máquina',
        body: 'Lanza el ciclo de homing. Espera a que todos los ejes indiquen que están en casa.',
        guidance: 'Escucha si hay ruidos ásperos o de roce mientras se mueven los ejes. Indican una guía o un rodamiento que necesita atención.',
      },
      'warm-up-notice': {
        title: 'Calienta el husillo antes de trabajar fuerte',
        body: 'Haz un calentamiento del husillo a velocidades crecientes antes del primer trabajo. Sigue el tiempo y las velocidades de calentamiento del fabricante del husillo.',
        guidance: 'La grasa fría de los rodamientos está dura. Subir el husillo por escalones deja que se reparta y se caliente por igual.',
        hazard: 'Poner un husillo frío directamente a toda velocidad gasta sus rodamientos antes de tiempo.',
        avoid: 'Haz el ciclo de calentamiento del fabricante, o sube la velocidad por escalones durante varios minutos, antes del primer corte.',
      },
      'warm-up': {
        title: 'Calienta el husillo',
        body: 'Sube Z por encima de la mesa sin pieza. Haz el calentamiento. Apunta cuántos minutos duró.',
        guidance: 'Diez minutos es un calentamiento habitual (práctica habitual, sin fuente publicada). Usa el tiempo del fabricante de tu husillo si es otro.',
        label: 'Tiempo de calentamiento',
      },
      'first-job-ready': {
        title: 'Apunta cualquier cosa rara',
        body: 'Añade una nota por cualquier cosa que se viera, sonara u oliera mal. Avisa al dueño de lo que haya que arreglar antes de empezar.',
        guidance: 'Las notas se guardan con el historial de la máquina, así un problema que crece poco a poco no pasa desapercibido.',
      },
      'final-signoff': finalSignoff('La máquina está revisada, con el homing hecho y caliente, la parada de emergencia está al alcance y lo que había raro está apuntado.'),
    },
  },
}
